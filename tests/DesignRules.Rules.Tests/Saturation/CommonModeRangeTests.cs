namespace DesignRules.Rules.Tests.Saturation;

/// <summary>DR203: both inputs of every amplifier inside the part's common-mode range.</summary>
public sealed class CommonModeRangeTests
{
    [Fact]
    public void A_follower_driven_below_its_input_range_is_an_error_at_its_part()
    {
        var report = RuleFixture.Verify("saturation/follower-beyond-common-mode-range.yaml");
        Assert.Contains("-11 V", Assert.Single(report.Findings, f => f.RuleId == "DR203").Message, StringComparison.Ordinal);
    }

    [Fact]
    public void A_follower_inside_its_input_range_is_clean() =>
        RuleFixture.Verify("saturation/follower-inside-common-mode-range.yaml");

    [Fact]
    public void A_single_supply_stage_without_a_bias_point_is_reported_once_as_such_not_also_as_an_input_range_error() =>
        RuleFixture.Verify("saturation/single-supply-unbiased.yaml");
}
