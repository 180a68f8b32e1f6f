using DesignRules.Diagnostics;
using DesignRules.Reports;

namespace DesignRules.Build.Tests;

public sealed class LevelOverridesTests
{
    [Fact]
    public void Levels_change_and_off_removes()
    {
        var levels = LevelOverrides.Parse("DR906=warning; dr103 = off", out var problem);
        Assert.Null(problem);
        var report = levels!.Apply(ReportFixtures.Report());
        Assert.Equal(Severity.Warning, report.Findings.Single(f => f.RuleId == "DR906").Severity);
        Assert.DoesNotContain(report.Findings, f => f.RuleId == "DR103");
        Assert.Equal(0, report.ErrorCount);
    }

    [Theory]
    [InlineData("DR906")]
    [InlineData("DR90=warning")]
    [InlineData("DR906=loud")]
    [InlineData("DR999=off")]
    public void Malformed_entries_are_refused_with_a_reason(string text)
    {
        Assert.Null(LevelOverrides.Parse(text, out var problem));
        Assert.False(string.IsNullOrEmpty(problem));
    }
}
