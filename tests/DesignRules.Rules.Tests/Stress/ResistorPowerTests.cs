namespace DesignRules.Rules.Tests.Stress;

/// <summary>DR601's resistor power agrees with Joule's law.</summary>
public sealed class ResistorPowerTests
{
    [Fact]
    public void The_power_of_a_resistor_at_DC_is_the_square_of_its_voltage_over_its_resistance()
    {
        var report = RuleFixture.Verify("stress/resistor-power-dc.yaml");
        var figures = Assert.Single(report.Designs).StageFigures.Single(s => s.Key == "invert").Value;

        // Joule's law P = V²/R: 10 V DC across rin = 1k (its far end a virtual ground) gives 100 mW.
        Assert.InRange(figures.Single(f => f.Name == "power in rin").Value, 0.1 * 0.999, 0.1 * 1.001);
    }

    [Fact]
    public void The_power_of_a_resistor_with_a_sine_is_averaged_over_whole_periods()
    {
        var report = RuleFixture.Verify("stress/resistor-power-sine.yaml");
        var figures = Assert.Single(report.Designs).StageFigures.Single(s => s.Key == "invert").Value;

        // Joule's law averaged over a period: P = Vp² / (2R) = 12² / 2k = 72 mW at the nominal 1k; the rule records the
        // worst tolerance corner, rin at 1k − 1 %: 72 mW / 0.99 = 72.7 mW.
        Assert.InRange(figures.Single(f => f.Name == "power in rin").Value, 0.072 / 0.99 * 0.99, 0.072 / 0.99 * 1.01);
    }
}
