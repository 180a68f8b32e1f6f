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
        Assert.Contains("1 design(s) in 1 file(s) checked: 0 error(s)", run.Output, StringComparison.Ordinal);
    }

    [Fact]
    public void A_folder_with_no_design_exits_1_naming_what_was_searched_and_yml_designs_are_found()
    {
        // Designs kept in the wrong folder: nothing is checked, which must not pass.
        var elsewhere = Path.Combine(root, "schematics", "line-driver.yaml");
        Directory.CreateDirectory(Path.GetDirectoryName(elsewhere)!);
        File.WriteAllText(elsewhere, SampleRepository.Design());
        Directory.CreateDirectory(Path.Combine(root, "designs"));
        var empty = Cli("check", root);
        Assert.True(empty.ExitCode == 1, empty.ToString());
        Assert.Contains("error DR940: ", empty.Output, StringComparison.Ordinal);
        Assert.Contains("designs/**/*.yaml, designs/**/*.yml", empty.Output, StringComparison.Ordinal);
        Assert.Contains(root, empty.Output, StringComparison.Ordinal);

        // The same design spelt .yml in designs/ is found and checked.
        File.Move(elsewhere, Path.Combine(root, "designs", "line-driver.yml"));
        var found = Cli("check", root);
        Assert.True(found.ExitCode == 0, found.ToString());
        Assert.Contains("1 design(s) in 1 file(s) checked: 0 error(s)", found.Output, StringComparison.Ordinal);
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
    [InlineData("check", ".", "--rule-set", "no-such-rules.yaml")]
    [InlineData("check", ".", "--rules", "no-such-rules.yaml")]
    [InlineData("check", ".", "--levels", "DR906=loud")]
    [InlineData("check", ".", "--today", "30/06/2027")]
    [InlineData("check", ".", "--sarif")]
    [InlineData("check", "--bogus")]
    [InlineData("check", ".", "--levels", "DR999=off")]
    [InlineData("check", ".", "--sarif", "-", "--json", "-")]
    [InlineData("rule", "DR999")]
    [InlineData("rule", "906")]
    [InlineData("explain", "DR999")]
    [InlineData("schema", "netlist")]
    [InlineData("no-such-command")]
    [InlineData("compare", "no-such-base.json", "no-such-head.json")]
    [InlineData("compare", "designs/line-driver.yaml", "designs/line-driver.yaml")]
    [InlineData("check", ".", "--new-only")]
    [InlineData("check", ".", "--baseline", "designs/line-driver.yaml")]
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
    public void No_arguments_print_the_commands_not_an_error()
    {
        var run = Cli();
        Assert.True(run.ExitCode == 0, run.ToString());
        Assert.Contains("Usage:", run.Output, StringComparison.Ordinal);
        Assert.Contains("check", run.Output, StringComparison.Ordinal);
        Assert.DoesNotContain("Required command", run.Output, StringComparison.Ordinal);
    }

    [Fact]
    public void A_dash_sends_the_sarif_report_to_standard_output_and_the_findings_to_standard_error()
    {
        SampleRepository.Write(root, SampleRepository.Design(SampleRepository.UnknownAmplifier));
        var run = Cli("check", root, "--sarif", "-");
        Assert.True(run.ExitCode == 1, run.ToString());
        using var sarif = JsonDocument.Parse(run.StandardOutput);
        Assert.Equal("DR906", sarif.RootElement.GetProperty("runs")[0].GetProperty("results")[0].GetProperty("ruleId").GetString());
        Assert.Contains("error DR906", run.Output, StringComparison.Ordinal);
    }

    [Fact]
    public void Warnings_as_errors_makes_a_warning_an_error_and_the_exit_code_1()
    {
        SampleRepository.Write(root, SampleRepository.Design(SampleRepository.UnknownAmplifier));
        var run = Cli("check", root, "--levels", "DR906=warning", "--warnings-as-errors");
        Assert.True(run.ExitCode == 1, run.ToString());
        Assert.Contains("error DR906", run.Output, StringComparison.Ordinal);
        Assert.DoesNotContain("warning DR906", run.Output, StringComparison.Ordinal);
    }

    [Fact]
    public void A_waived_finding_is_printed_as_waived_never_as_a_warning_and_progress_names_each_design()
    {
        var text = SampleRepository.Design(feedback: "49.9k").Replace("supplies:", "e-series: E24\nsupplies:", StringComparison.Ordinal)
            + "waivers:\n  - rule: DR701\n    stage: gain\n    reason: Kept from the last board revision.\n";
        SampleRepository.Write(root, text);
        var run = Cli("check", root);
        Assert.True(run.ExitCode == 0, run.ToString());
        Assert.Matches(@"line-driver\.yaml\(\d+,\d+\): waived DR701: .*\(reason: Kept from the last board revision\.\)", run.Output);
        Assert.DoesNotContain("warning", run.StandardOutput.Split('\n').Single(l => l.Contains("DR701", StringComparison.Ordinal)), StringComparison.Ordinal);
        Assert.Matches(@"checked designs/line-driver\.yaml \(line-driver\): 0 error\(s\), 0 warning\(s\), \d+\.\d\d s", run.Output);
    }

    [Fact]
    public void Parts_lists_the_builtin_and_the_repository_parts_with_key_figures()
    {
        Directory.CreateDirectory(Path.Combine(root, "parts"));
        File.WriteAllText(Path.Combine(root, "parts", "bench.yaml"),
            "library:\n  id: bench\nresistors:\n  - id: bench-film\n    tolerance: 0.5%\n    tempco: 25 ppm/°C\n    power: 250 mW\n");
        var run = Cli("parts", root);
        Assert.True(run.ExitCode == 0, run.ToString());
        Assert.Matches(@"jfet-input-15v\s+GBW [0-9.]+ [kM]Hz, slew [0-9.]+ V/µs", run.Output);
        Assert.Contains("bench-film", run.Output, StringComparison.Ordinal);
        Assert.Contains("±0.5 %", run.Output, StringComparison.Ordinal);
    }

    [Fact]
    public void Rule_prints_the_rule_page()
    {
        var run = Cli("rule", "dr906");
        Assert.True(run.ExitCode == 0, run.ToString());
        Assert.StartsWith("# DR906: Unknown part", run.Output, StringComparison.Ordinal);
        Assert.Contains("## How to fix it", run.Output, StringComparison.Ordinal);
    }

    [Fact]
    public void Explain_still_prints_the_rule_page_for_one_release_with_a_note_that_it_is_renamed_rule()
    {
        var run = Cli("explain", "DR906");
        Assert.True(run.ExitCode == 0, run.ToString());
        Assert.Contains("# DR906: Unknown part", run.Output, StringComparison.Ordinal);
        Assert.Contains("'designrules explain' is renamed 'designrules rule'", run.Output, StringComparison.Ordinal);
    }

    [Fact]
    public void The_rule_set_file_is_given_with_rule_set_and_the_earlier_rules_still_works_with_a_note()
    {
        // A rule set that may not change a design-file problem: its finding shows that the file was read.
        SampleRepository.Write(root, SampleRepository.Design());
        var ruleSet = Path.Combine(root, "not-for-design-files.yaml");
        File.WriteAllText(ruleSet, "rule-set: {}\nrules:\n  DR906: off\n");
        var current = Cli("check", root, "--rule-set", ruleSet);
        Assert.Contains("not-for-design-files.yaml(", current.Output, StringComparison.Ordinal);
        Assert.DoesNotContain("is renamed", current.Output, StringComparison.Ordinal);

        var earlier = Cli("check", root, "--rules", ruleSet);
        Assert.Equal(current.ExitCode, earlier.ExitCode);
        Assert.Contains("not-for-design-files.yaml(", earlier.Output, StringComparison.Ordinal);
        Assert.Contains("'--rules' is renamed '--rule-set'", earlier.Output, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("design")]
    [InlineData("parts")]
    [InlineData("rule-set")]
    public void Schema_prints_a_json_schema(string kind)
    {
        var run = Cli("schema", kind);
        Assert.True(run.ExitCode == 0, run.ToString());
        using var doc = JsonDocument.Parse(run.Output);
        Assert.Equal("https://json-schema.org/draft/2020-12/schema", doc.RootElement.GetProperty("$schema").GetString());
    }
}
