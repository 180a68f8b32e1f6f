namespace DesignRules.Build.Tests;

/// <summary>
/// A hardware repository outside the source tree that consumes the packed package, with its own NuGet cache and a
/// nuget.config that adds the local feed to the machine's usual sources.
/// </summary>
internal sealed class ConsumerRepository : IDisposable
{
    private static readonly TimeSpan Limit = TimeSpan.FromMinutes(3);
    private readonly string folder;

    /// <summary>The two project forms the README offers.</summary>
    public enum Form
    {
        /// <summary><c>&lt;Project Sdk="DesignRules.Build/VERSION"&gt;</c>.</summary>
        ProjectSdk,

        /// <summary>A NoTargets project with a package reference.</summary>
        PackageReference,
    }

    public ConsumerRepository(PackedFeed feed, bool asProjectSdk)
        : this(feed, asProjectSdk ? Form.ProjectSdk : Form.PackageReference, "hardware.csproj")
    {
    }

    public ConsumerRepository(PackedFeed feed, Form form, string projectFileName, string subfolder = "")
    {
        folder = TestPaths.NewTempFolder("consumer");
        RepositoryTop = Path.Combine(folder, "repo");
        Root = Path.Combine(RepositoryTop, subfolder);
        Directory.CreateDirectory(Root);
        Packages = Path.Combine(folder, "packages");
        File.WriteAllText(Path.Combine(RepositoryTop, "nuget.config"), $"""
            <?xml version="1.0" encoding="utf-8"?>
            <configuration>
              <packageSources>
                <add key="designrules-under-test" value="{feed.Folder}" />
              </packageSources>
            </configuration>
            """);
        // Stop any Directory.Build.* above the temp folder from leaking in.
        File.WriteAllText(Path.Combine(RepositoryTop, "Directory.Build.props"), "<Project />\n");
        File.WriteAllText(Path.Combine(RepositoryTop, "Directory.Build.targets"), "<Project />\n");
        // The README's package-reference form: a project on the NoTargets SDK, which compiles nothing.
        var project = form == Form.ProjectSdk
            ? $"""
              <Project Sdk="DesignRules.Build/{feed.Version}">
                <PropertyGroup>
                  <DesignRulesSarifFile>$(MSBuildProjectDirectory)/out/designrules.sarif</DesignRulesSarifFile>
                </PropertyGroup>
              </Project>
              """
            : $"""
              <Project Sdk="Microsoft.Build.NoTargets/3.7.0">
                <PropertyGroup>
                  <TargetFramework>net10.0</TargetFramework>
                  <DesignRulesSarifFile>$(MSBuildProjectDirectory)/out/designrules.sarif</DesignRulesSarifFile>
                </PropertyGroup>
                <ItemGroup>
                  <PackageReference Include="DesignRules.Build" Version="{feed.Version}" />
                </ItemGroup>
              </Project>
              """;
        File.WriteAllText(Path.Combine(Root, projectFileName), project);
    }

    /// <summary>The top of the repository (where a .git folder would be); <see cref="Root"/> may be a folder inside it.</summary>
    public string RepositoryTop { get; }

    public string Root { get; }

    public string Packages { get; }

    public string SarifFile => Path.Combine(Root, "out", "designrules.sarif");

    /// <summary>
    /// The evaluation servers' socket folder of this repository's builds (short: a socket path stays under about 100
    /// bytes). Deleting it, as <see cref="Dispose"/> does, stops every server the builds started.
    /// </summary>
    public string ServerFolder { get; } = Path.Combine(Path.GetTempPath(), "drs-" + Guid.NewGuid().ToString("N")[..10]);

    public ProcessRun Build(params string[] extra) => BuildWithServerFolder(ServerFolder, extra);

    /// <summary>
    /// A build whose servers' sockets are in <paramref name="serverFolder"/>. A name of its own, not an overload of
    /// <see cref="Build"/>: <c>Build("-p:X=1", "-v:d")</c> would bind to <c>(string, params string[])</c> and take the first
    /// switch for the folder.
    /// </summary>
    public ProcessRun BuildWithServerFolder(string serverFolder, params string[] extra) =>
        ProcessRun.Dotnet(Root, new Dictionary<string, string?> { ["NUGET_PACKAGES"] = Packages, ["DESIGNRULES_SERVER_FOLDER"] = serverFolder }, Limit,
            ["build", "-nodeReuse:false", "-tl:off", "-v:m", .. extra]);

    public void Dispose()
    {
        try
        {
            // First the servers' sockets (each server leaves within a second of losing its socket), then the repository
            // and its package cache, which holds the servers' assemblies.
            if (Directory.Exists(ServerFolder))
            {
                Directory.Delete(ServerFolder, recursive: true);
            }

            Directory.Delete(folder, recursive: true);
        }
        catch (IOException)
        {
            // A leftover temp folder is harmless.
        }
    }
}
