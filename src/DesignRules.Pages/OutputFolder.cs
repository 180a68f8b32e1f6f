using System.Text;
using DesignRules.Diagnostics;

namespace DesignRules.Pages;

/// <summary>
/// The output folder's discipline: safe names, nothing written outside it, files written whole (write then rename),
/// and a manifest of what the tool wrote so that only its own stale files are ever removed.
/// </summary>
internal sealed class OutputFolder
{
    /// <summary>The manifest's file name inside the output folder.</summary>
    public const string ManifestName = ".designrules-pages";

    private readonly string root;
    private readonly SortedSet<string> written = new(StringComparer.Ordinal);

    public OutputFolder(string folder)
    {
        root = Path.GetFullPath(folder);
    }

    public IReadOnlyCollection<string> Written => written;

    /// <summary>Turns an id into a file-name part: lower-case letters, digits and hyphens only.</summary>
    public static string SafeName(string id)
    {
        var text = new StringBuilder(id.Length);
        foreach (var c in id.ToLowerInvariant())
        {
            text.Append(c is (>= 'a' and <= 'z') or (>= '0' and <= '9') or '-' ? c : '-');
        }

        var name = text.ToString().Trim('-');
        return name.Length == 0 ? "unnamed" : name;
    }

    /// <summary>Writes a text file whole, with \n line ends, and records it in the manifest.</summary>
    public void Write(string relative, string content)
    {
        var full = Path.GetFullPath(Path.Combine(root, relative));
        if (!full.StartsWith(root + Path.DirectorySeparatorChar, StringComparison.Ordinal))
        {
            // Names are made by SafeName; reaching this is a programming error.
            throw new InvalidOperationException($"Refusing to write outside the output folder: {relative}");
        }

        Directory.CreateDirectory(Path.GetDirectoryName(full)!);
        var temporary = full + ".partial";
        File.WriteAllText(temporary, content.ReplaceLineEndings("\n"), new UTF8Encoding(encoderShouldEmitUTF8Identifier: false));
        File.Move(temporary, full, overwrite: true);
        written.Add(relative.Replace('\\', '/'));
    }

    /// <summary>Removes files the previous run wrote and this one did not, then writes the new manifest.</summary>
    public IReadOnlyList<string> Finish(List<Diagnostic> diagnostics)
    {
        var manifest = Path.Combine(root, ManifestName);
        var removed = new List<string>();
        if (File.Exists(manifest))
        {
            foreach (var line in File.ReadAllLines(manifest).Where(l => l.Length > 0 && !l.StartsWith('#')))
            {
                var full = Path.GetFullPath(Path.Combine(root, line));
                if (written.Contains(line) || !full.StartsWith(root + Path.DirectorySeparatorChar, StringComparison.Ordinal) || !File.Exists(full))
                {
                    continue;
                }

                try
                {
                    File.Delete(full);
                    removed.Add(line);
                }
                catch (IOException ex)
                {
                    diagnostics.Add(RuleCatalogue.Default["DR930"].At(SourceSpan.WholeFile(full), ManifestName, $"the stale page {line} cannot be removed ({ex.Message})"));
                }
            }
        }

        Write(ManifestName, "# Files written by DesignRules; only these are ever removed by it.\n" + string.Join('\n', written.Where(w => w != ManifestName)) + "\n");
        return removed;
    }
}
