using System.Reflection;

namespace DesignRules.Build.Tests;

/// <summary>Where the repository and this build's outputs are.</summary>
internal static class TestPaths
{
    private static string Metadata(string key) =>
        typeof(TestPaths).Assembly.GetCustomAttributes<AssemblyMetadataAttribute>().Single(a => a.Key == key).Value!;

    public static string RepositoryRoot => Metadata("RepositoryRoot");

    public static string ArtifactsPath => Metadata("ArtifactsPath");

    public static string Configuration => Metadata("BuildConfiguration");

    public static string CliAssembly =>
        Path.Combine(ArtifactsPath, "bin", "DesignRules.Cli", Configuration.ToLowerInvariant(), "designrules.dll");

    public static string CliProject => Path.Combine(RepositoryRoot, "src", "DesignRules.Cli", "DesignRules.Cli.csproj");

    public static string BuildProject => Path.Combine(RepositoryRoot, "src", "DesignRules.Build", "DesignRules.Build.csproj");

    /// <summary>A fresh folder outside the source tree, removed by the caller.</summary>
    public static string NewTempFolder(string purpose)
    {
        var folder = Path.Combine(Path.GetTempPath(), $"designrules-{purpose}-{Guid.NewGuid():N}");
        Directory.CreateDirectory(folder);
        return folder;
    }
}
