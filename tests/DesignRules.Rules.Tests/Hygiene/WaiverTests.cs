namespace DesignRules.Rules.Tests.Hygiene;

/// <summary>Waivers keep a finding but mark it waived; an expired waiver stops waiving; an unmatched one is reported.</summary>
public sealed class WaiverTests
{
    [Fact]
    public void A_matching_waiver_keeps_the_finding_and_marks_it_waived_with_its_reason()
    {
        var report = RuleFixture.Verify("hygiene/waived-value.yaml");
        var finding = Assert.Single(report.Findings, f => f.RuleId == "DR701");
        Assert.True(finding.IsWaived);
        Assert.Equal("The 20.5k part is already stocked for another board.", finding.Waiver);
        Assert.DoesNotContain(report.Findings, f => f.RuleId == "DR701" && !f.IsWaived);
    }

    [Fact]
    public void An_expired_waiver_stops_waiving_and_is_itself_reported()
    {
        var report = RuleFixture.Verify("hygiene/expired-waiver.yaml");
        Assert.False(Assert.Single(report.Findings, f => f.RuleId == "DR701").IsWaived);
    }

    [Fact]
    public void A_waiver_that_matches_nothing_is_a_finding() => RuleFixture.Verify("hygiene/unmatched-waiver.yaml");
}
