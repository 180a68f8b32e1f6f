namespace DesignRules.Rules.Tests.Slew;

/// <summary>
/// DR102: every amplifier output's slewing events against the time allowed. The single-diode follower rectifier is
/// fine at 1 kHz and fails at 20 kHz, while the two-diode inverting form with the same amplifier and signal passes.
/// </summary>
public sealed class SlewDemandTests
{
    [Fact]
    public void The_follower_rectifier_is_fine_at_one_kilohertz() =>
        RuleFixture.Verify("slew/follower-rectifier-1khz.yaml");

    [Fact]
    public void The_follower_rectifier_fails_at_twenty_kilohertz_on_the_amplifiers_own_output()
    {
        var report = RuleFixture.Verify("slew/follower-rectifier-20khz.yaml");
        var finding = Assert.Single(report.Findings, f => f.RuleId == "DR102");
        Assert.Contains("`rect.u1.out`", finding.Message, StringComparison.Ordinal);
        Assert.Contains("at 20 kHz", finding.Message, StringComparison.Ordinal);
        Assert.Contains("the part gives 20 V/µs", finding.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void The_two_diode_inverting_rectifier_with_the_same_amplifier_passes_at_twenty_kilohertz() =>
        RuleFixture.Verify("slew/inverting-rectifier-20khz.yaml");

    [Fact]
    public void With_a_slow_amplifier_the_follower_form_fails_its_glitch_requirement_and_the_inverting_form_meets_it()
    {
        RuleFixture.Verify("slew/slow-follower-rectifier-20khz.yaml");
        RuleFixture.Verify("slew/slow-inverting-rectifier-20khz.yaml");
    }

    [Fact]
    public void A_sine_inside_its_full_power_bandwidth_raises_no_slewing_event_and_demands_two_pi_f_Vp()
    {
        var report = RuleFixture.Verify("slew/gain-stage-inside-full-power-bandwidth.yaml");
        var demand = report.Designs.Single().StageFigures.Single(s => s.Key == "amp").Value.Single(f => f.Name == "slew demanded at amp.out").Value;

        // Textbook: a sine of peak Vp at f demands 2π·f·Vp; here gain −5 × 1 V = 5 V peak at 2 kHz.
        double expected = 2 * Math.PI * 2e3 * 5;
        Assert.InRange(demand, expected * 0.98, expected * 1.02);
    }
}
