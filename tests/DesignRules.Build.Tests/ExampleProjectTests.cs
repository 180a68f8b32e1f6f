using System.Text.Json;

namespace DesignRules.Build.Tests;

/// <summary>
/// README's main command, `dotnet build example-design`, must build on a fresh clone. The example's project compiles
/// nothing and references no DesignRules assembly, so a global using of one of the tool's namespaces (the repository's
/// Directory.Build.props gives its own projects several) would make its generated global-usings file fail to compile.
/// </summary>
public sealed class ExampleProjectTests
{
    [Fact]
    public void The_example_hardware_repository_gets_no_global_using_of_the_tools_own_namespaces()
    {
        var project = Path.Combine(TestPaths.RepositoryRoot, "example-design", "DesignRules.Example.csproj");
        var run = ProcessRun.Dotnet(TestPaths.RepositoryRoot, new Dictionary<string, string?>(), TimeSpan.FromMinutes(3),
            "msbuild", project, "-getItem:Using", "-nologo");
        Assert.True(run.ExitCode == 0, run.ToString());

        using var items = JsonDocument.Parse(run.StandardOutput);
        var usings = items.RootElement.GetProperty("Items").GetProperty("Using").EnumerateArray()
            .Select(u => u.GetProperty("Identity").GetString()!).ToList();
        Assert.Contains("System", usings);
        Assert.DoesNotContain(usings, u => u.StartsWith("DesignRules", StringComparison.Ordinal));
    }
}
