namespace DesignRules.Rules.Tests.Slew;

/// <summary>DR103: a rectifying stage's output error after each zero crossing against the glitch allowance.</summary>
public sealed class ZeroCrossingGlitchTests
{
    [Fact]
    public void The_follower_rectifiers_glitch_exceeds_one_percent_of_the_period_at_twenty_kilohertz()
    {
        var report = RuleFixture.Verify("slew/follower-rectifier-20khz.yaml");
        var finding = Assert.Single(report.Findings, f => f.RuleId == "DR103");
        Assert.Contains("allowed 500 ns", finding.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void The_follower_rectifiers_glitch_is_a_small_part_of_the_period_at_one_kilohertz()
    {
        var report = RuleFixture.Verify("slew/follower-rectifier-1khz.yaml");
        var glitch = report.Designs.Single().StageFigures.Single(s => s.Key == "rect").Value.Single(f => f.Name == "zero-crossing glitch").Value;
        Assert.InRange(glitch, 0.1e-6, 5e-6);
    }

    [Fact]
    public void The_two_diode_form_only_crosses_its_dead_zone_and_stays_inside_the_allowance()
    {
        var report = RuleFixture.Verify("slew/inverting-rectifier-20khz.yaml");
        var glitch = report.Designs.Single().StageFigures.Single(s => s.Key == "rect").Value.Single(f => f.Name == "zero-crossing glitch").Value;
        Assert.True(glitch < 0.5e-6 * 0.6, $"glitch {glitch:G3} s");
    }

    [Fact]
    public void A_stated_glitch_requirement_replaces_the_fraction_of_the_period()
    {
        var report = RuleFixture.Verify("slew/slow-follower-rectifier-20khz.yaml");
        Assert.Contains("allowed 10 µs", Assert.Single(report.Findings, f => f.RuleId == "DR103").Message, StringComparison.Ordinal);
    }
}
