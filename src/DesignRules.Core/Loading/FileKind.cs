using System.Runtime.InteropServices;

namespace DesignRules.Loading;

/// <summary>
/// What kind of file system entry a path names, asked without opening it (opening a named pipe blocks until someone
/// writes to it). On Linux this is the <c>statx</c> call, whose record has the same layout on every architecture;
/// where it is not available the answer is "unknown" and the caller keeps its size-based guard.
/// </summary>
internal static class FileKind
{
    private const int AtCurrentFolder = -100;
    private const uint StatxType = 0x0001;
    private const int ModeOffset = 28;
    private const int TypeMask = 0xF000;
    private static bool unavailable;

    /// <summary>
    /// In words, what <paramref name="path"/> (followed through links) is when it is not a regular file: "a named pipe
    /// (FIFO)", "a character device", "a block device", "a socket"; null for a regular file, a folder, or when the system
    /// cannot tell.
    /// </summary>
    public static string? NotRegular(string path)
    {
        if (!OperatingSystem.IsLinux() || unavailable)
        {
            return null;
        }

        var record = new byte[256];
        int result;
        try
        {
            // The path as the C string the call expects: UTF-8, ended by a zero byte.
            var name = new byte[System.Text.Encoding.UTF8.GetByteCount(path) + 1];
            System.Text.Encoding.UTF8.GetBytes(path, name);
            result = Statx(AtCurrentFolder, name, 0, StatxType, record);
        }
        catch (Exception ex) when (ex is EntryPointNotFoundException or DllNotFoundException)
        {
            unavailable = true;
            return null;
        }

        if (result != 0)
        {
            return null;
        }

        return (BitConverter.ToUInt16(record, ModeOffset) & TypeMask) switch
        {
            0x1000 => "a named pipe (FIFO)",
            0x2000 => "a character device",
            0x6000 => "a block device",
            0xC000 => "a socket",
            _ => null,
        };
    }

    // Byte arrays only (blittable, pinned for the call): no marshalling code, no unsafe code.
    [DllImport("libc", EntryPoint = "statx", ExactSpelling = true)]
    [DefaultDllImportSearchPaths(DllImportSearchPath.SafeDirectories)]
    private static extern int Statx(int folder, byte[] path, int flags, uint mask, [In, Out] byte[] record);
}
