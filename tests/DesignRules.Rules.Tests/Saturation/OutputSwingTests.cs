namespace DesignRules.Rules.Tests.Saturation;

/// <summary>DR201: every amplifier output inside its swing limits with margin, offsets included.</summary>
public sealed class OutputSwingTests
{
    [Fact]
    public void A_stage_asked_for_more_than_its_rails_allow_clips_and_is_an_error_at_its_part()
    {
        var report = RuleFixture.Verify("saturation/clipping-inverting-stage.yaml");
        Assert.Contains("clips", Assert.Single(report.Findings, f => f.RuleId == "DR201").Message, StringComparison.Ordinal);
    }

    [Fact]
    public void A_stage_with_headroom_for_its_swing_and_its_offset_is_clean() =>
        RuleFixture.Verify("saturation/inverting-stage-with-headroom.yaml");

    [Fact]
    public void An_amplifier_whose_loop_opens_by_design_is_not_a_swing_violation() =>
        RuleFixture.Verify("saturation/follower-rectifier-recovers-quickly.yaml");
}
