using System.Text.Json;

namespace DesignRules.Build.Tests;

/// <summary>The command line run as a process, the way CI and people run it.</summary>
public sealed class CliProcessTests : IDisposable
{
    private static readonly TimeSpan Limit = TimeSpan.FromMinutes(2);
    private readonly string root = TestPaths.NewTempFolder("cli");

    public void Dispose() => Directory.Delete(root, recursive: true);

    private ProcessRun Cli(params string[] args) =>
        ProcessRun.Dotnet(root, new Dictionary<string, string?>(), Limit, [TestPaths.CliAssembly, .. args]);

    [Fact]
    public void Clean_repository_exits_0_with_a_summary()
    {
        SampleRepository.Write(root, SampleRepository.Design());
        var run = Cli("check", root);
        Assert.True(run.ExitCode == 0, run.ToString());
        Assert.Contains("1 design(s) checked in 1 file(s): 0 error(s)", run.Output, StringComparison.Ordinal);
    }

    [Fact]
    public void Error_finding_exits_1_with_the_compiler_style_line_and_no_colour_when_redirected()
    {
        var text = SampleRepository.Design(SampleRepository.UnknownAmplifier);
        SampleRepository.Write(root, text);
        var (line, column) = SampleRepository.AmplifierValuePosition(text);
        var run = Cli("check", ".");
        Assert.True(run.ExitCode == 1, run.ToString());
        Assert.Contains($"line-driver.yaml({line},{column}): error DR906: ", run.Output, StringComparison.Ordinal);
        Assert.DoesNotContain("\u001b[", run.Output, StringComparison.Ordinal);
    }

    [Fact]
    public void Pages_are_written_on_request_and_a_broken_template_is_a_located_error()
    {
        SampleRepository.Write(root, SampleRepository.Design());
        var written = Cli("check", root, "--pages", "pages");
        Assert.True(written.ExitCode == 0, written.ToString());
        Assert.True(File.Exists(Path.Combine(root, "pages", "index.md")), written.ToString());
        Assert.NotEmpty(Directory.GetFiles(Path.Combine(root, "pages", "plots"), "*.svg", SearchOption.AllDirectories));

        Directory.CreateDirectory(Path.Combine(root, "templates"));
        File.WriteAllText(Path.Combine(root, "templates", "index.md.sbn"), "# Boards\n{{ for d in index.designs }}\n");
        var broken = Cli("check", root, "--pages", "pages", "--templates", "templates");
        Assert.True(broken.ExitCode == 1, broken.ToString());
        Assert.Matches(@"index\.md\.sbn\(\d+,\d+\): error DR930: ", broken.Output);
    }

    [Theory]
    [InlineData("check", "no-such-folder")]
    [InlineData("check", ".", "--rules", "no-such-rules.yaml")]
    [InlineData("check", ".", "--levels", "DR906=loud")]
    [InlineData("check", ".", "--today", "30/06/2027")]
    [InlineData("check", ".", "--sarif")]
    [InlineData("explain", "DR999")]
    [InlineData("explain", "906")]
    [InlineData("schema", "netlist")]
    [InlineData("no-such-command")]
    public void Unusable_input_or_options_exit_2(params string[] args)
    {
        SampleRepository.Write(root, SampleRepository.Design());
        var run = Cli(args);
        Assert.True(run.ExitCode == 2, run.ToString());
        Assert.DoesNotContain("   at ", run.Output, StringComparison.Ordinal);
    }

    [Fact]
    public void Sarif_and_json_parse_and_carry_the_same_findings_as_the_console()
    {
        var text = SampleRepository.Design(SampleRepository.UnknownAmplifier);
        SampleRepository.Write(root, text);
        var run = Cli("check", root, "--sarif", "out/r.sarif", "--json", "out/r.json");
        Assert.True(run.ExitCode == 1, run.ToString());
        var sarif = FindingKeys.FromSarif(Path.Combine(root, "out", "r.sarif"));
        var json = FindingKeys.FromJson(Path.Combine(root, "out", "r.json"));
        var (line, column) = SampleRepository.AmplifierValuePosition(text);
        Assert.Contains($"DR906 {SampleRepository.DesignPath}({line},{column}) error", sarif);
        Assert.Equal(sarif, json);
        Assert.Equal(sarif.Count(k => k.EndsWith(" error", StringComparison.Ordinal)), run.Output.Split('\n').Count(l => l.Contains(": error DR", StringComparison.Ordinal)));
    }

    [Fact]
    public void Levels_option_lowers_an_error_to_a_warning_and_the_exit_code_follows()
    {
        SampleRepository.Write(root, SampleRepository.Design(SampleRepository.UnknownAmplifier));
        var run = Cli("check", root, "--levels", "DR906=warning");
        Assert.True(run.ExitCode == 0, run.ToString());
        Assert.Contains("warning DR906", run.Output, StringComparison.Ordinal);
    }

    [Fact]
    public void Explain_prints_the_rule_page()
    {
        var run = Cli("explain", "dr906");
        Assert.True(run.ExitCode == 0, run.ToString());
        Assert.StartsWith("# DR906: Unknown part", run.Output, StringComparison.Ordinal);
        Assert.Contains("## How to fix it", run.Output, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("design")]
    [InlineData("parts")]
    public void Schema_prints_a_json_schema(string kind)
    {
        var run = Cli("schema", kind);
        Assert.True(run.ExitCode == 0, run.ToString());
        using var doc = JsonDocument.Parse(run.Output);
        Assert.Equal("https://json-schema.org/draft/2020-12/schema", doc.RootElement.GetProperty("$schema").GetString());
    }
}
