namespace DesignRules.Loading;

/// <summary>Finds the design and parts files of a hardware repository.</summary>
public static class RepositoryFiles
{
    /// <summary>The endings of design and parts files: both spellings of the YAML extension.</summary>
    public static IReadOnlyList<string> Extensions { get; } = [".yaml", ".yml"];

    /// <summary>
    /// In words, what <see cref="Find"/> searches below <paramref name="path"/>, for a "no design found" message.
    /// </summary>
    /// <param name="path">A file or folder given.</param>
    public static string Searched(string path)
    {
        ArgumentNullException.ThrowIfNull(path);
        if (File.Exists(path))
        {
            return $"the file {path}";
        }

        var designs = Path.Combine(path, "designs");
        var parts = Path.Combine(path, "parts");
        return Directory.Exists(designs) || Directory.Exists(parts)
            ? $"designs/**/*.yaml, designs/**/*.yml, parts/**/*.yaml and parts/**/*.yml below {path}"
            : $"**/*.yaml and **/*.yml below {path}";
    }

    /// <summary>
    /// Expands each path: a file stands for itself; a folder stands for <c>designs/**/*.yaml</c> and
    /// <c>parts/**/*.yaml</c> below it when it has those folders, else every <c>*.yaml</c> below it (<c>.yml</c> counts
    /// as <c>.yaml</c> everywhere).
    /// The result is sorted (ordinal) so runs are deterministic.
    /// </summary>
    /// <param name="paths">Files or folders.</param>
    /// <param name="missing">Paths that named nothing.</param>
    public static IReadOnlyList<string> Find(IEnumerable<string> paths, out IReadOnlyList<string> missing)
    {
        ArgumentNullException.ThrowIfNull(paths);
        var files = new List<string>();
        var absent = new List<string>();
        foreach (var path in paths)
        {
            if (File.Exists(path))
            {
                files.Add(path);
            }
            else if (Directory.Exists(path))
            {
                var designs = Path.Combine(path, "designs");
                var parts = Path.Combine(path, "parts");
                var roots = Directory.Exists(designs) || Directory.Exists(parts) ? new[] { designs, parts } : [path];
                files.AddRange(roots.Where(Directory.Exists).SelectMany(r =>
                    Extensions.SelectMany(e => Directory.EnumerateFiles(r, "*" + e, SearchOption.AllDirectories))
                        .Where(f => Extensions.Any(e => f.EndsWith(e, StringComparison.OrdinalIgnoreCase)))
                        .Order(StringComparer.Ordinal)));
            }
            else
            {
                absent.Add(path);
            }
        }

        missing = absent;
        return files;
    }
}
