namespace DesignRules.Rules.Tests.Stability;

/// <summary>
/// With a <c>gbw-derating</c> and a temperature range, DR510 judges the loop at the end where GBW is highest, since a
/// higher crossover meets the capacitive load's pole with more phase lag.
/// </summary>
public sealed class GbwDeratedStabilityTests
{
    [Fact]
    public void A_line_driver_keeping_45_degrees_at_25_C_is_clean()
    {
        var report = RuleFixture.Verify("stability/gbw-derated-driver-at-25-only.yaml");
        var margin = PhaseMargin(report);

        // Dominant pole plus two extra poles (Franco, Design with Operational Amplifiers, §8.4), worked by hand: the loop
        // gain GBW/f / √(1+(f/f2)²) / √(1+(f/fp)²) with GBW = 4 MHz, f2 = 40 MHz, fp = 1/(2π·10 Ω·4 nF) = 3.979 MHz
        // crosses unity at fc = 3.133 MHz, so PM = 90° − atan(fc/f2) − atan(fc/fp) = 47.30°.
        Assert.InRange(margin.Value, 47.30 - 0.5, 47.30 + 0.5);
        Assert.Null(margin.Temperature);
    }

    [Fact]
    public void The_same_driver_over_minus_40_to_85_C_loses_its_margin_at_the_cold_end_where_its_GBW_is_highest()
    {
        var report = RuleFixture.Verify("stability/gbw-derated-driver-cold-end-fails.yaml");
        var finding = Assert.Single(report.Findings, f => f.RuleId == Diagnostics.RuleIds.PhaseMargin);
        Assert.Contains("at -40 °C", finding.Message, StringComparison.Ordinal);
        Assert.Contains("gbw-derating", finding.Message, StringComparison.Ordinal);

        // The same hand calculation with the GBW at -40 °C: 4 MHz × (1 + 0.004 × 65) = 5.04 MHz crosses unity at
        // fc = 3.683 MHz, so PM = 90° − atan(3.683/40) − atan(3.683/3.979) = 41.95° (Franco, §8.4), below 45°.
        var margin = PhaseMargin(report);
        Assert.InRange(margin.Value, 41.95 - 0.5, 41.95 + 0.5);
        Assert.Equal(-40, margin.Temperature);
    }

    private static Figure PhaseMargin(CheckReport report) =>
        report.Designs.Single().StageFigures.Single(s => s.Key == "driver").Value.Single(f => f.Key == FigureKinds.PhaseMargin.At("u1"));
}
