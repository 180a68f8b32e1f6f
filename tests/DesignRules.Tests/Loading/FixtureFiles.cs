namespace DesignRules.Tests.Loading;

/// <summary>Finds fixture files copied beside the test assembly, and the repository root.</summary>
internal static class FixtureFiles
{
    public static string Directory(string relative) => Path.Combine(AppContext.BaseDirectory, "Fixtures", relative);

    public static IEnumerable<string> Yaml(string relative) =>
        System.IO.Directory.EnumerateFiles(Directory(relative), "*.yaml").Order(StringComparer.Ordinal);

    public static string RepositoryRoot()
    {
        var dir = new DirectoryInfo(AppContext.BaseDirectory);
        while (dir is not null && !File.Exists(Path.Combine(dir.FullName, "DesignRules.sln")))
        {
            dir = dir.Parent;
        }

        return dir?.FullName ?? throw new InvalidOperationException("DesignRules.sln not found above the test assembly");
    }
}
