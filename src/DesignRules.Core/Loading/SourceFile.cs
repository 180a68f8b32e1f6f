using System.Buffers;
using System.Globalization;
using System.Text;
using System.Text.Unicode;
using DesignRules.Diagnostics;

namespace DesignRules.Loading;

/// <summary>
/// Reads a design, parts or rule-set file as text, and nothing else: only regular files with content, at most
/// <see cref="LoaderLimits.MaxFileBytes"/> bytes (counted while reading, so a device that never ends is cut off),
/// strictly UTF-8 (or UTF-16 with a byte-order mark). Anything else becomes a located diagnostic.
/// </summary>
internal static class SourceFile
{
    /// <summary>Reads <paramref name="path"/>; null when it does not exist. Throws <see cref="RefusedFileException"/> for a file it will not read.</summary>
    public static string? Read(string path, LoaderLimits limits)
    {
        var info = new FileInfo(path);
        if (!info.Exists)
        {
            return null;
        }

        // A link is judged by what it finally points at: a link to a device is a device.
        var target = info.LinkTarget is null ? info : info.ResolveLinkTarget(returnFinalTarget: true) as FileInfo ?? info;
        if (!target.Exists)
        {
            return null;
        }

        var shown = target.FullName == info.FullName ? $"'{path}'" : $"'{path}' (a link to '{target.FullName}')";
        if (IsDeviceFolder(target.FullName))
        {
            throw new RefusedFileException(DesignFileDiagnostics.NotADesignFile, null,
                $"{shown} is a device or system file, not a regular file; only regular files are read");
        }

        // Devices, pipes and sockets report no size; a file that reports none is never opened, so a pipe cannot block the
        // run. Where the system can tell, such a file is refused by its kind rather than read as empty.
        if (target.Length == 0)
        {
            if (FileKind.NotRegular(target.FullName) is { } kind)
            {
                throw new RefusedFileException(DesignFileDiagnostics.NotADesignFile, null,
                    $"{shown} is {kind}, not a regular file; only regular files are read");
            }

            return string.Empty;
        }

        if (target.Length > limits.MaxFileBytes)
        {
            throw new RefusedFileException(DesignFileDiagnostics.SizeLimit, null,
                string.Create(CultureInfo.InvariantCulture, $"The file {shown} ({target.Length} bytes)"),
                string.Create(CultureInfo.InvariantCulture, $"{limits.MaxFileBytes} bytes"));
        }

        var (bytes, length) = ReadAtMost(target.FullName, limits.MaxFileBytes, (int)target.Length, shown);
        return Decode(path, bytes.AsSpan(0, length));
    }

    private static bool IsDeviceFolder(string full) =>
        OperatingSystem.IsLinux() && (full.StartsWith("/dev/", StringComparison.Ordinal)
            || full.StartsWith("/proc/", StringComparison.Ordinal) || full.StartsWith("/sys/", StringComparison.Ordinal));

    /// <summary>The file's bytes: the first <c>Length</c> of <c>Bytes</c>.</summary>
    private static (byte[] Bytes, int Length) ReadAtMost(string full, int maxBytes, int statedBytes, string shown)
    {
        using var stream = new FileStream(full, FileMode.Open, FileAccess.Read, FileShare.Read, bufferSize: 1, FileOptions.SequentialScan);
        // Read straight into an array of the stated size and one byte more (a warm server reads every design of a large
        // repository on every run; a 64 KB buffer and a growing copy per file were most of what reading allocated). The
        // spare byte tells a file that grew since its size was read; it is then read on in steps, counted against the bound.
        var buffer = new byte[Math.Min(maxBytes, statedBytes) + 1];
        var length = 0;
        int read;
        while ((read = stream.Read(buffer, length, buffer.Length - length)) > 0)
        {
            length += read;
            if (length > maxBytes)
            {
                // The size on disk said otherwise: the file grew, or is not what it claims. Stop at the bound either way.
                throw new RefusedFileException(DesignFileDiagnostics.SizeLimit, null,
                    $"The file {shown} (more than its stated size)",
                    string.Create(CultureInfo.InvariantCulture, $"{maxBytes} bytes"));
            }

            if (length == buffer.Length)
            {
                Array.Resize(ref buffer, (int)Math.Min((long)maxBytes + 1, buffer.Length + Math.Max(buffer.Length, 64L * 1024)));
            }
        }

        return (buffer, length);
    }

    /// <summary>Decodes file bytes strictly: UTF-8 (an optional byte-order mark skipped) or UTF-16 with its mark.</summary>
    public static string Decode(string path, byte[] bytes) => Decode(path, bytes.AsSpan());

    /// <summary>Decodes file bytes strictly: UTF-8 (an optional byte-order mark skipped) or UTF-16 with its mark.</summary>
    public static string Decode(string path, ReadOnlySpan<byte> bytes)
    {
        if (bytes.Length >= 2 && ((bytes[0] == 0xFF && bytes[1] == 0xFE) || (bytes[0] == 0xFE && bytes[1] == 0xFF)))
        {
            var encoding = bytes[0] == 0xFF ? new UnicodeEncoding(false, true, true) : new UnicodeEncoding(true, true, true);
            try
            {
                return encoding.GetString(bytes[2..]);
            }
            catch (DecoderFallbackException ex)
            {
                throw new RefusedFileException(DesignFileDiagnostics.YamlSyntax, SourceSpan.WholeFile(path),
                    string.Create(CultureInfo.InvariantCulture, $"the UTF-16 text breaks off near byte offset {ex.Index + 2}; save the file as UTF-8"));
            }
        }

        var start = bytes.Length >= 3 && bytes[0] == 0xEF && bytes[1] == 0xBB && bytes[2] == 0xBF ? 3 : 0;
        var span = bytes[start..];
        var chars = new char[span.Length];
        var status = Utf8.ToUtf16(span, chars, out var bytesRead, out var written, replaceInvalidSequences: false);
        if (status == OperationStatus.Done)
        {
            return new string(chars, 0, written);
        }

        // Locate the first byte that is not UTF-8: its offset in the file, and the line and column it stands at.
        var offset = start + bytesRead;
        var before = chars.AsSpan(0, written);
        var line = before.Count('\n') + 1;
        var column = written - (before.LastIndexOf('\n') + 1) + 1;
        var at = new SourceSpan(path, line, column, line, column + 1);
        throw new RefusedFileException(DesignFileDiagnostics.YamlSyntax, at, string.Create(CultureInfo.InvariantCulture,
            $"the byte 0x{bytes[offset]:X2} at byte offset {offset} (line {line}, column {column}) is not UTF-8 text; design files are UTF-8, so save the file as UTF-8 or correct that character"));
    }
}

/// <summary>A file the loader will not read: a device, a pipe, a file over the byte bound, or text that is not UTF-8.</summary>
internal sealed class RefusedFileException(DiagnosticDescriptor descriptor, SourceSpan? span, params string[] arguments)
    : IOException(string.Join("; ", arguments))
{
    /// <summary>The diagnostic this refusal becomes, at <paramref name="fallback"/> when the refusal has no position of its own.</summary>
    public Diagnostic ToDiagnostic(SourceSpan fallback) => descriptor.At(span ?? fallback, arguments);
}
