namespace DesignRules.Rules.Tests.Saturation;

/// <summary>DR202: an amplifier that runs open-loop by design, and the recovery it costs each period.</summary>
public sealed class OpenLoopExcursionTests
{
    [Fact]
    public void A_slow_peak_detector_spends_too_much_of_each_period_recovering() =>
        RuleFixture.Verify("saturation/peak-detector-slow.yaml");

    [Fact]
    public void A_fast_follower_rectifier_at_a_low_frequency_recovers_within_the_threshold() =>
        RuleFixture.Verify("saturation/follower-rectifier-recovers-quickly.yaml");

    [Fact]
    public void The_recovery_time_is_the_excursion_plus_a_diode_drop_over_the_slew_rate_plus_overload_recovery()
    {
        var report = RuleFixture.Verify("saturation/follower-rectifier-recovers-quickly.yaml");
        var figures = report.Designs.Single().StageFigures.Single(s => s.Key == "rect").Value;
        double excursion = figures.Single(f => f.Name == "open-loop excursion u1").Value;
        double recovery = figures.Single(f => f.Name == "recovery time u1").Value;

        // Common practice: t ≈ (ΔV + Vf)/SR + overload recovery. The part (jfet-input-15v) gives 12 V/µs and 1 µs; the
        // silicon small-signal diode drops 0.5 to 0.7 V at small currents (built-in library description).
        Assert.InRange(excursion, 13.3, 13.6);
        Assert.InRange(recovery, ((excursion + 0.5) / 12e6) + 1e-6, ((excursion + 0.7) / 12e6) + 1e-6);
    }
}
