using System.Text.Json;
using DesignRules.Reports;

namespace DesignRules.Build.Tests;

public sealed class JsonReportTests
{
    private static JsonElement Document() =>
        JsonDocument.Parse(JsonReport.ToBytes(ReportFixtures.Report(), ReportFixtures.Settings)).RootElement;

    [Fact]
    public void Summary_counts_unwaived_errors_and_warnings_and_the_waived()
    {
        var summary = Document().GetProperty("summary");
        Assert.Equal(1, summary.GetProperty("errors").GetInt32());
        Assert.Equal(1, summary.GetProperty("warnings").GetInt32());
        Assert.Equal(1, summary.GetProperty("waived").GetInt32());
        Assert.Equal(JsonReport.FormatName, Document().GetProperty("format").GetString());
    }

    [Fact]
    public void Every_finding_has_location_help_waiver_and_figures()
    {
        var findings = Document().GetProperty("findings").EnumerateArray().ToList();
        Assert.Equal(4, findings.Count);
        var waived = findings[1];
        Assert.Equal("DR103", waived.GetProperty("ruleId").GetString());
        Assert.Equal("designs/front end.yaml", waived.GetProperty("file").GetString());
        Assert.Equal(20, waived.GetProperty("line").GetInt32());
        Assert.Equal(5, waived.GetProperty("column").GetInt32());
        Assert.True(waived.GetProperty("waived").GetBoolean());
        Assert.Equal("https://example.invalid/rules/DR103.md", waived.GetProperty("helpUri").GetString());
        var figures = waived.GetProperty("figures").EnumerateArray().ToList();
        Assert.Equal(["glitch.width", "glitch.allowed", "glitch.error-band"], figures.Select(f => f.GetProperty("key").GetString()));
        Assert.Equal(["zero-crossing glitch", "allowed glitch", "error band"], figures.Select(f => f.GetProperty("name").GetString()));
        Assert.Equal(2e-6, figures[0].GetProperty("limit").GetDouble());
        Assert.Equal(-0.5e-6, figures[0].GetProperty("margin").GetDouble(), 12);
        Assert.Equal(2e-6, figures[1].GetProperty("value").GetDouble());
        Assert.Equal("-Infinity", figures[2].GetProperty("value").GetString());
        Assert.Equal("rect", waived.GetProperty("stage").GetString());
        Assert.Equal(JsonValueKind.Null, findings[2].GetProperty("design").ValueKind);
    }

    [Fact]
    public void Same_report_gives_the_same_bytes()
    {
        Assert.Equal(JsonReport.ToBytes(ReportFixtures.Report(), ReportFixtures.Settings), JsonReport.ToBytes(ReportFixtures.Report(), ReportFixtures.Settings));
    }
}
