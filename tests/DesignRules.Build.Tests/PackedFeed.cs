namespace DesignRules.Build.Tests;

/// <summary>
/// Packs DesignRules.Build and the DesignRules.Cli tool from this build's outputs into a temporary local feed, both with
/// one version no other run uses, so that a consumer with its own NuGet cache can never pick up a stale copy.
/// </summary>
public sealed class PackedFeed : IDisposable
{
    public PackedFeed()
    {
        Folder = TestPaths.NewTempFolder("feed");
        Version = $"0.1.0-e2e.{DateTime.UtcNow:yyyyMMddHHmmss}.{Guid.NewGuid().ToString("N")[..8]}";
        // The build package's pack also compiles the task folder to ReadyToRun images (a publish with crossgen, which builds the
        // runtime-specific outputs again): longer, and under a shared machine's load well past ten minutes.
        var pack = ProcessRun.Dotnet(TestPaths.RepositoryRoot, new Dictionary<string, string?> { ["DR_ARTIFACTS"] = TestPaths.ArtifactsPath },
            TimeSpan.FromMinutes(20), "pack", TestPaths.BuildProject, "--no-build", "--no-restore", "-c", TestPaths.Configuration,
            "-o", Folder, $"-p:PackageVersion={Version}", "-nodeReuse:false", "-tl:off");
        var packTool = ProcessRun.Dotnet(TestPaths.RepositoryRoot, new Dictionary<string, string?> { ["DR_ARTIFACTS"] = TestPaths.ArtifactsPath },
            TimeSpan.FromMinutes(4), "pack", TestPaths.CliProject, "--no-build", "--no-restore", "-c", TestPaths.Configuration,
            "-o", Folder, $"-p:PackageVersion={Version}", "-nodeReuse:false", "-tl:off");
        PackOutput = pack with { ExitCode = pack.ExitCode != 0 ? pack.ExitCode : packTool.ExitCode, Output = pack.Output + packTool.Output };
        Package = Path.Combine(Folder, $"DesignRules.Build.{Version}.nupkg");
        ToolPackage = Path.Combine(Folder, $"DesignRules.Cli.{Version}.nupkg");
    }

    public string Folder { get; }

    public string Version { get; }

    public string Package { get; }

    /// <summary>The command-line tool's package, same version, same feed.</summary>
    public string ToolPackage { get; }

    public ProcessRun PackOutput { get; }

    public void Dispose()
    {
        try
        {
            Directory.Delete(Folder, recursive: true);
        }
        catch (IOException)
        {
            // A leftover temp folder is harmless.
        }
    }
}
