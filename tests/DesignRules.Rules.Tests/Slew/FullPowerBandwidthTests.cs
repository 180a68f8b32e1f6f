namespace DesignRules.Rules.Tests.Slew;

/// <summary>DR101: the full-power bandwidth SR/(2π·Vp) of every amplifier against the band top with margin.</summary>
public sealed class FullPowerBandwidthTests
{
    [Fact]
    public void A_stage_swinging_beyond_its_full_power_bandwidth_is_an_error_at_its_part() =>
        RuleFixture.Verify("slew/gain-stage-beyond-full-power-bandwidth.yaml");

    [Fact]
    public void A_stage_well_inside_its_full_power_bandwidth_is_clean() =>
        RuleFixture.Verify("slew/gain-stage-inside-full-power-bandwidth.yaml");

    [Fact]
    public void The_recorded_full_power_bandwidth_is_the_slew_rate_over_two_pi_times_the_peak_swing()
    {
        var report = RuleFixture.Verify("slew/follower-textbook.yaml");
        var fpbw = report.Designs.Single().StageFigures.Single(s => s.Key == "buf").Value.Single(f => f.Name == "full-power bandwidth u1").Value;

        // Textbook: full-power bandwidth = SR / (2π·Vp). The part (built-in jfet-input-15v) gives 12 V/µs; a unity
        // follower driven with 2 V peak swings 2 V peak.
        double expected = 12e6 / (2 * Math.PI * 2.0);
        Assert.InRange(fpbw, expected * 0.98, expected * 1.02);
    }

    [Fact]
    public void The_finding_states_the_swing_the_slew_rate_the_bandwidth_and_the_shortfall()
    {
        var report = RuleFixture.Verify("slew/gain-stage-beyond-full-power-bandwidth.yaml");
        var finding = Assert.Single(report.Findings, f => f.RuleId == "DR101");
        Assert.Contains("`amp.out`", finding.Message, StringComparison.Ordinal);
        Assert.Contains("0.6 V/µs", finding.Message, StringComparison.Ordinal);
        Assert.Contains("24 kHz", finding.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void A_stage_inside_its_full_power_bandwidth_at_25_C_is_clean() =>
        RuleFixture.Verify("slew/slew-derated-at-25-only.yaml");

    [Fact]
    public void The_same_stage_over_a_range_fails_at_the_hot_end_where_its_derated_slew_rate_is_slowest()
    {
        var report = RuleFixture.Verify("slew/slew-derated-hot-end-fails.yaml");
        var finding = Assert.Single(report.Findings, f => f.RuleId == Diagnostics.RuleIds.FullPowerBandwidth);
        Assert.Contains("at 85 °C", finding.Message, StringComparison.Ordinal);

        // Textbook full-power bandwidth SR/(2π·Vp) with the class's derating applied by hand: 0.6 V/µs × (1 − 0.002 × 60)
        // = 0.528 V/µs over 2π × 5 V = 16.8 kHz, at 85 °C.
        var fpbw = report.Designs.Single().StageFigures.Single(s => s.Key == "amp").Value.Single(f => f.Key == FigureKinds.FullPowerBandwidth.At("u1"));
        double expected = 0.6e6 * 0.88 / (2 * Math.PI * 5);
        Assert.InRange(fpbw.Value, expected * 0.98, expected * 1.02);
        Assert.Equal(85, fpbw.Temperature);
    }
}
