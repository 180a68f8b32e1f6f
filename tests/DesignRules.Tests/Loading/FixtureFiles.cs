using System.Reflection;

namespace DesignRules.Tests.Loading;

/// <summary>Finds fixture files copied beside the test assembly, and the repository root.</summary>
internal static class FixtureFiles
{
    public static string Directory(string relative) => Path.Combine(AppContext.BaseDirectory, "Fixtures", relative);

    public static IEnumerable<string> Yaml(string relative) =>
        System.IO.Directory.EnumerateFiles(Directory(relative), "*.yaml").Order(StringComparer.Ordinal);

    /// <summary>The repository root, recorded at build time (outputs may live outside the source tree).</summary>
    public static string RepositoryRoot() =>
        typeof(FixtureFiles).Assembly.GetCustomAttributes<AssemblyMetadataAttribute>()
            .Single(a => a.Key == "RepositoryRoot").Value!;
}
