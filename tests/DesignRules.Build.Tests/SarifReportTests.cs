using System.Text.Json;
using DesignRules.Diagnostics;
using DesignRules.Reports;
using DesignRules.Rules;

namespace DesignRules.Build.Tests;

public sealed class SarifReportTests
{
    private static JsonElement Run() =>
        JsonDocument.Parse(SarifReport.ToBytes(ReportFixtures.Report(), ReportFixtures.Settings)).RootElement.GetProperty("runs")[0];

    [Fact]
    public void Document_is_sarif_2_1_0_with_the_schema_and_one_run()
    {
        var doc = JsonDocument.Parse(SarifReport.ToBytes(ReportFixtures.Report(), ReportFixtures.Settings)).RootElement;
        Assert.Equal("2.1.0", doc.GetProperty("version").GetString());
        Assert.Equal(SarifReport.SchemaUri, doc.GetProperty("$schema").GetString());
        Assert.Equal(1, doc.GetProperty("runs").GetArrayLength());
    }

    [Fact]
    public void Driver_lists_every_rule_with_id_name_description_help_and_default_level()
    {
        var driver = Run().GetProperty("tool").GetProperty("driver");
        Assert.Equal("DesignRules", driver.GetProperty("name").GetString());
        var rules = driver.GetProperty("rules").EnumerateArray().ToList();
        Assert.Equal(["DR103", "DR906", "DR990"], rules.Select(r => r.GetProperty("id").GetString()));
        var dr906 = rules[1];
        Assert.Equal("UnknownPart", dr906.GetProperty("name").GetString());
        Assert.Equal("Unknown part", dr906.GetProperty("shortDescription").GetProperty("text").GetString());
        Assert.Equal("https://example.invalid/rules/DR906.md", dr906.GetProperty("helpUri").GetString());
        Assert.Equal("error", dr906.GetProperty("defaultConfiguration").GetProperty("level").GetString());
        Assert.Equal("warning", rules[0].GetProperty("defaultConfiguration").GetProperty("level").GetString());
    }

    [Fact]
    public void Results_carry_rule_level_message_and_repository_relative_region()
    {
        var results = Run().GetProperty("results").EnumerateArray().ToList();
        Assert.Equal(4, results.Count);
        var error = results[0];
        Assert.Equal("DR906", error.GetProperty("ruleId").GetString());
        Assert.Equal(1, error.GetProperty("ruleIndex").GetInt32());
        Assert.Equal("error", error.GetProperty("level").GetString());
        Assert.Equal("No amplifier named 'x{0}' {braces} kept.", error.GetProperty("message").GetProperty("text").GetString());
        var location = error.GetProperty("locations")[0].GetProperty("physicalLocation");
        Assert.Equal("designs/front%20end.yaml", location.GetProperty("artifactLocation").GetProperty("uri").GetString());
        Assert.Equal(ReportSettings.RootBaseId, location.GetProperty("artifactLocation").GetProperty("uriBaseId").GetString());
        var region = location.GetProperty("region");
        Assert.Equal((14, 16, 14, 33), (region.GetProperty("startLine").GetInt32(), region.GetProperty("startColumn").GetInt32(),
            region.GetProperty("endLine").GetInt32(), region.GetProperty("endColumn").GetInt32()));
        Assert.False(error.TryGetProperty("suppressions", out _));
    }

    [Fact]
    public void Waived_finding_is_an_in_source_suppression_with_its_justification()
    {
        // SARIF 2.1.0 §3.35.2: a suppression written in the analysed file itself (the design's waivers:) is inSource.
        var waived = Run().GetProperty("results")[1];
        var suppression = waived.GetProperty("suppressions")[0];
        Assert.Equal("inSource", suppression.GetProperty("kind").GetString());
        Assert.Equal("accepted", suppression.GetProperty("status").GetString());
        Assert.Equal("Accepted: the meter averages over 100 ms.", suppression.GetProperty("justification").GetString());
        Assert.Equal(2.5e-6, waived.GetProperty("properties").GetProperty("figures")[0].GetProperty("value").GetDouble());
    }

    [Fact]
    public void Empty_region_has_no_end_and_a_non_file_location_keeps_its_own_uri()
    {
        var results = Run().GetProperty("results");
        Assert.False(results[2].GetProperty("locations")[0].GetProperty("physicalLocation").GetProperty("region").TryGetProperty("endLine", out _));
        var builtin = results[3].GetProperty("locations")[0].GetProperty("physicalLocation").GetProperty("artifactLocation");
        Assert.Equal("builtin:parts", builtin.GetProperty("uri").GetString());
        Assert.False(builtin.TryGetProperty("uriBaseId", out _));
    }

    [Fact]
    public void The_document_is_valid_against_the_oasis_schema_and_has_every_field_code_scanning_shows()
    {
        var text = System.Text.Encoding.UTF8.GetString(SarifReport.ToBytes(ReportFixtures.Report(), ReportFixtures.Settings));
        Assert.Empty(SarifSchema.Problems(text));
        Assert.Empty(SarifSchema.MissingCodeScanningFields(text));
        var driver = Run().GetProperty("tool").GetProperty("driver");
        Assert.Equal("1.2.3", driver.GetProperty("version").GetString());
        var dr906 = driver.GetProperty("rules")[1];
        Assert.StartsWith("# DR906: Unknown part", dr906.GetProperty("help").GetProperty("markdown").GetString(), StringComparison.Ordinal);
        Assert.DoesNotContain("#", dr906.GetProperty("help").GetProperty("text").GetString(), StringComparison.Ordinal);
        Assert.StartsWith("A part reference must name", dr906.GetProperty("fullDescription").GetProperty("text").GetString(), StringComparison.Ordinal);
        Assert.Contains("design-file", dr906.GetProperty("properties").GetProperty("tags").EnumerateArray().Select(t => t.GetString()));
    }

    [Fact]
    public void A_fingerprint_survives_lines_added_above_the_finding_and_differs_for_another_node()
    {
        var root = TestPaths.NewTempFolder("fingerprint");
        try
        {
            var file = Path.Combine(root, "designs", "d.yaml");
            Directory.CreateDirectory(Path.GetDirectoryName(file)!);
            var text = "design:\n  id: d\nstages:\n  - id: gain\n    values:\n      rin: 10k\n      rf: 20k\n";
            File.WriteAllText(file, text);
            string Fingerprint(int line, int column) => FingerprintOf(new Finding("DR701", "Preferred value", Severity.Warning, "m",
                new SourceSpan(file, line, column, line, column + 3), "rules/DR701.md", "d", "gain", null, []), root);

            var before = Fingerprint(6, 12);
            var otherNode = Fingerprint(7, 11);
            File.WriteAllText(file, "# a comment\n# and another\n" + text);
            var after = Fingerprint(8, 12);
            Assert.Equal(before, after);
            Assert.NotEqual(before, otherNode);
        }
        finally
        {
            Directory.Delete(root, recursive: true);
        }
    }

    [Fact]
    public void Levels_follow_the_build_warnings_switched_off_are_left_out_and_promoted_ones_are_errors()
    {
        var report = ReportFixtures.Report();
        var quiet = new WarningLevels(false, CodeList.Empty, CodeList.Empty, new CodeList("DR103")).Apply(report);
        // The waived DR103 stays (a suppression, not a warning); the open one is not annotated.
        Assert.Equal(["DR906", "DR103", "DR990"], quiet.Findings.Select(f => f.RuleId));
        var promoted = new WarningLevels(false, new CodeList("DR103"), CodeList.Empty, CodeList.Empty).Apply(report);
        Assert.Equal(Severity.Error, promoted.Findings[2].Severity);
        var all = new WarningLevels(true, CodeList.Empty, new CodeList("DR103"), CodeList.Empty).Apply(report);
        Assert.Equal(Severity.Warning, all.Findings[2].Severity);
        var host = (WarningLevels.None with { }) with { HostTreatsAsError = code => code == "DR103" };
        Assert.Equal(Severity.Error, host.Apply(report).Findings[2].Severity);
    }

    private static string FingerprintOf(Finding finding, string root)
    {
        var report = new CheckReport([finding], [], 1, 1);
        using var doc = JsonDocument.Parse(SarifReport.ToBytes(report, new ReportSettings(root, null, "1.0.0")));
        return doc.RootElement.GetProperty("runs")[0].GetProperty("results")[0].GetProperty("partialFingerprints")
            .GetProperty(SarifReport.FingerprintName).GetString()!;
    }

    [Fact]
    public void Same_report_gives_the_same_bytes_with_line_feeds_only()
    {
        var first = SarifReport.ToBytes(ReportFixtures.Report(), ReportFixtures.Settings);
        Assert.Equal(first, SarifReport.ToBytes(ReportFixtures.Report(), ReportFixtures.Settings));
        var text = System.Text.Encoding.UTF8.GetString(first);
        Assert.DoesNotContain("\r", text, StringComparison.Ordinal);
        Assert.Contains("µs", text, StringComparison.Ordinal);
    }
}
