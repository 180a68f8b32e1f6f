namespace DesignRules.Build.Tests;

/// <summary>
/// A hardware repository outside the source tree that consumes the packed package, with its own NuGet cache and a
/// nuget.config that adds the local feed to the machine's usual sources.
/// </summary>
internal sealed class ConsumerRepository : IDisposable
{
    private static readonly TimeSpan Limit = TimeSpan.FromMinutes(3);
    private readonly string folder;

    public ConsumerRepository(PackedFeed feed, bool asProjectSdk)
    {
        folder = TestPaths.NewTempFolder("consumer");
        Root = Path.Combine(folder, "repo");
        Directory.CreateDirectory(Root);
        Packages = Path.Combine(folder, "packages");
        File.WriteAllText(Path.Combine(Root, "nuget.config"), $"""
            <?xml version="1.0" encoding="utf-8"?>
            <configuration>
              <packageSources>
                <add key="designrules-under-test" value="{feed.Folder}" />
              </packageSources>
            </configuration>
            """);
        // Stop any Directory.Build.* above the temp folder from leaking in.
        File.WriteAllText(Path.Combine(Root, "Directory.Build.props"), "<Project />\n");
        File.WriteAllText(Path.Combine(Root, "Directory.Build.targets"), "<Project />\n");
        var project = asProjectSdk
            ? $"""
              <Project Sdk="DesignRules.Build/{feed.Version}">
                <PropertyGroup>
                  <DesignRulesSarifFile>$(MSBuildProjectDirectory)/out/designrules.sarif</DesignRulesSarifFile>
                </PropertyGroup>
              </Project>
              """
            : $"""
              <Project Sdk="Microsoft.NET.Sdk">
                <PropertyGroup>
                  <TargetFramework>net10.0</TargetFramework>
                  <DesignRulesSarifFile>$(MSBuildProjectDirectory)/out/designrules.sarif</DesignRulesSarifFile>
                </PropertyGroup>
                <ItemGroup>
                  <PackageReference Include="DesignRules.Build" Version="{feed.Version}" />
                </ItemGroup>
              </Project>
              """;
        File.WriteAllText(Path.Combine(Root, "hardware.csproj"), project);
    }

    public string Root { get; }

    public string Packages { get; }

    public string SarifFile => Path.Combine(Root, "out", "designrules.sarif");

    public ProcessRun Build(params string[] extra) =>
        ProcessRun.Dotnet(Root, new Dictionary<string, string?> { ["NUGET_PACKAGES"] = Packages }, Limit,
            ["build", "-nodeReuse:false", "-tl:off", "-v:m", .. extra]);

    public void Dispose()
    {
        try
        {
            Directory.Delete(folder, recursive: true);
        }
        catch (IOException)
        {
            // A leftover temp folder is harmless.
        }
    }
}
