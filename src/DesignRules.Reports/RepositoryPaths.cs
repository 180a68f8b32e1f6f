namespace DesignRules.Reports;

/// <summary>Turns the file paths of findings into repository-relative paths with forward slashes.</summary>
public static class RepositoryPaths
{
    /// <summary>
    /// The path of <paramref name="file"/> relative to <paramref name="root"/> with forward slashes, or null when the
    /// file lies outside the root or is not a file path (e.g. the built-in library).
    /// </summary>
    public static string? Relative(string root, string file)
    {
        ArgumentNullException.ThrowIfNull(root);
        ArgumentNullException.ThrowIfNull(file);
        if (file.Contains(':', StringComparison.Ordinal) && !Path.IsPathRooted(file))
        {
            return null;
        }

        var relative = Path.GetRelativePath(Path.GetFullPath(root), Path.GetFullPath(file));
        if (relative == ".." || relative.StartsWith(".." + Path.DirectorySeparatorChar, StringComparison.Ordinal) || Path.IsPathRooted(relative))
        {
            return null;
        }

        return relative.Replace(Path.DirectorySeparatorChar, '/');
    }

    /// <summary>
    /// The root of the version-controlled repository that holds <paramref name="folder"/>: the nearest folder at or above
    /// it with a <c>.git</c> folder or file (a worktree or submodule has a file), else <paramref name="folder"/> itself.
    /// Code scanning reads SARIF paths relative to that root, wherever the project file sits in it.
    /// </summary>
    public static string FindRepositoryRoot(string folder)
    {
        ArgumentNullException.ThrowIfNull(folder);
        var start = Path.GetFullPath(folder);
        for (var dir = new DirectoryInfo(start); dir is not null; dir = dir.Parent)
        {
            var git = Path.Combine(dir.FullName, ".git");
            if (Directory.Exists(git) || File.Exists(git))
            {
                return dir.FullName;
            }
        }

        return start;
    }

    /// <summary>The path as reports show it: relative to the root where possible, else as given (forward slashes).</summary>
    public static string Display(string root, string file) =>
        Relative(root, file) ?? file.Replace('\\', '/');
}
