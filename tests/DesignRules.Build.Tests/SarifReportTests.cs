using System.Text.Json;
using DesignRules.Reports;

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
        Assert.Equal(["DR104", "DR906", "DR990"], rules.Select(r => r.GetProperty("id").GetString()));
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
    public void Waived_finding_is_an_external_suppression_with_its_justification()
    {
        var waived = Run().GetProperty("results")[1];
        var suppression = waived.GetProperty("suppressions")[0];
        Assert.Equal("external", suppression.GetProperty("kind").GetString());
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
    public void Same_report_gives_the_same_bytes_with_line_feeds_only()
    {
        var first = SarifReport.ToBytes(ReportFixtures.Report(), ReportFixtures.Settings);
        Assert.Equal(first, SarifReport.ToBytes(ReportFixtures.Report(), ReportFixtures.Settings));
        var text = System.Text.Encoding.UTF8.GetString(first);
        Assert.DoesNotContain("\r", text, StringComparison.Ordinal);
        Assert.Contains("µs", text, StringComparison.Ordinal);
    }
}
