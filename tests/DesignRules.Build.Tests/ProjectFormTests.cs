using System.Text.Json;
using System.Text.RegularExpressions;

namespace DesignRules.Build.Tests;

/// <summary>
/// A new user's first contact, from the packed feed: every project form and file name the README offers builds a clean
/// repository with -warnaserror, compiles no C#, fails on an error, and writes SARIF that the OASIS schema accepts with
/// every field code scanning shows; the command line installs as a dotnet tool from the same feed.
/// </summary>
[Collection(PackedFeedGroup.Name)]
public sealed class ProjectFormTests(PackedFeed feed)
{
    [Theory]
    [InlineData(true, "hardware.proj")]
    [InlineData(true, "hardware.csproj")]
    [InlineData(false, "hardware.proj")]
    public void Each_form_and_file_name_of_the_readme_passes_warnaserror_clean_compiles_nothing_and_fails_on_an_error(
        bool asProjectSdk, string projectFile)
    {
        var form = asProjectSdk ? ConsumerRepository.Form.ProjectSdk : ConsumerRepository.Form.PackageReference;
        Assert.True(feed.PackOutput.ExitCode == 0, feed.PackOutput.ToString());
        // The project sits one folder below the top of a git repository, as hardware often does beside firmware.
        using var repo = new ConsumerRepository(feed, form, projectFile, subfolder: "hardware");
        Directory.CreateDirectory(Path.Combine(repo.RepositoryTop, ".git"));

        SampleRepository.Write(repo.Root, SampleRepository.Design());
        var clean = repo.Build("-warnaserror");
        Assert.True(clean.ExitCode == 0, clean.ToString());
        Assert.DoesNotContain("CS2008", clean.Output, StringComparison.Ordinal);
        Assert.DoesNotContain(": warning ", clean.Output, StringComparison.Ordinal);
        Assert.Empty(Directory.GetFiles(repo.Root, "*.dll", SearchOption.AllDirectories));

        var text = SampleRepository.Design(SampleRepository.UnknownAmplifier);
        SampleRepository.Write(repo.Root, text);
        var failed = repo.Build("-warnaserror");
        Assert.True(failed.ExitCode != 0, failed.ToString());
        Assert.Contains("error DR906", failed.Output, StringComparison.Ordinal);

        // The diagnostic's help link points at a copy of the help page beside the pages, never into the NuGet cache.
        Assert.True(File.Exists(Path.Combine(repo.Root, "design-pages", "rules", "DR906.md")), failed.ToString());

        var sarif = File.ReadAllText(repo.SarifFile);
        Assert.Empty(SarifSchema.Problems(sarif));
        Assert.Empty(SarifSchema.MissingCodeScanningFields(sarif));
        using var document = JsonDocument.Parse(sarif);
        var result = document.RootElement.GetProperty("runs")[0].GetProperty("results")[0];
        // Paths are relative to the top of the git repository, not to the project's folder.
        Assert.Equal("hardware/" + SampleRepository.DesignPath,
            result.GetProperty("locations")[0].GetProperty("physicalLocation").GetProperty("artifactLocation").GetProperty("uri").GetString());

        if (form == ConsumerRepository.Form.PackageReference)
        {
            // The three-number location form, for problem matchers that read file(line,col) only.
            var (line, column) = SampleRepository.AmplifierValuePosition(text);
            var short3 = repo.Build("-p:DesignRulesEndPositions=false");
            Assert.Matches($@"designs[/\\]line-driver\.yaml\({line},{column}\): error DR906: ", short3.Output);
        }
    }

    [Fact]
    public void The_command_line_installs_as_a_local_dotnet_tool_from_the_same_feed_and_checks_the_repository()
    {
        Assert.True(feed.PackOutput.ExitCode == 0, feed.PackOutput.ToString());
        Assert.True(File.Exists(feed.ToolPackage), feed.PackOutput.ToString());
        using var repo = new ConsumerRepository(feed, ConsumerRepository.Form.ProjectSdk, "hardware.proj");
        SampleRepository.Write(repo.Root, SampleRepository.Design(SampleRepository.UnknownAmplifier));
        var environment = new Dictionary<string, string?> { ["NUGET_PACKAGES"] = repo.Packages };
        var limit = TimeSpan.FromMinutes(3);

        var manifest = ProcessRun.Dotnet(repo.Root, environment, limit, "new", "tool-manifest");
        Assert.True(manifest.ExitCode == 0, manifest.ToString());
        var install = ProcessRun.Dotnet(repo.Root, environment, limit, "tool", "install", "DesignRules.Cli", "--version", feed.Version,
            "--add-source", feed.Folder);
        Assert.True(install.ExitCode == 0, install.ToString());

        var check = ProcessRun.Dotnet(repo.Root, environment, limit, "tool", "run", "designrules", "check", ".", "--sarif", "out/tool.sarif");
        Assert.True(check.ExitCode == 1, check.ToString());
        Assert.Matches(@"line-driver\.yaml\(\d+,\d+\): error DR906: ", check.Output);
        Assert.Empty(SarifSchema.Problems(File.ReadAllText(Path.Combine(repo.Root, "out", "tool.sarif"))));
    }
}
