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

    [Fact]
    public void The_capacitive_load_is_judged_at_the_cold_end_too_and_the_hinted_capacitance_keeps_the_margin_there()
    {
        var report = RuleFixture.Verify("stability/gbw-derated-driver-cold-end-fails.yaml");
        var finding = Assert.Single(report.Findings, f => f.RuleId == Diagnostics.RuleIds.CapacitiveLoad);
        Assert.Contains("at -40 °C", finding.Message, StringComparison.Ordinal);

        // The largest capacitance that keeps 45° at -40 °C, by hand with the same three-pole model (Franco, §8.4):
        // GBW 5.04 MHz, f2 = 40 MHz, fp = 1/(2π·10 Ω·C); PM = 45° at C = 3.384 nF (crossover 3.87 MHz).
        var said = System.Text.RegularExpressions.Regex.Match(finding.Fix!.Text, @"at or below (?<c>[0-9.]+) nF").Groups["c"].Value;
        double largest = double.Parse(said, System.Globalization.CultureInfo.InvariantCulture);
        Assert.InRange(largest, 3.384 * 0.98, 3.384);

        var text = File.ReadAllText(RuleFixture.Path("stability/gbw-derated-driver-cold-end-fails.yaml"));
        Assert.Empty(Findings(text.Replace("capacitance: 4 nF", $"capacitance: {said} nF", StringComparison.Ordinal), "DR510", "DR512"));
        // 2 % more capacitance than the hint loses the margin at -40 °C again.
        var more = (largest * 1.02).ToString("0.###", System.Globalization.CultureInfo.InvariantCulture);
        Assert.NotEmpty(Findings(text.Replace("capacitance: 4 nF", $"capacitance: {more} nF", StringComparison.Ordinal), "DR512"));
    }

    [Fact]
    public void The_step_is_also_taken_at_the_cold_end_where_the_thinner_margin_rings_more()
    {
        var hot = StepOvershoot(RuleFixture.Verify("stability/gbw-derated-driver-at-25-only.yaml"));
        var cold = StepOvershoot(RuleFixture.Verify("stability/gbw-derated-driver-cold-end-fails.yaml"));

        // The follower's closed loop is dominated by a complex pole pair; a thinner phase margin means a smaller damping
        // ratio and a larger overshoot (Ogata, Modern Control Engineering, §5-3 and §7-7): 42° at -40 °C rings more than
        // 47.3° at 25 °C, so the range's figure is the cold end's, named by its temperature.
        Assert.Null(hot.Temperature);
        Assert.Equal(-40, cold.Temperature);
        Assert.True(cold.Value > hot.Value, $"overshoot {cold.Value} at -40 °C is not above {hot.Value} at 25 °C");
    }

    private static Figure StepOvershoot(CheckReport report) =>
        report.Designs.Single().StageFigures.Single(s => s.Key == "driver").Value.Single(f => f.Key == FigureKinds.StepOvershoot.Key);

    private static List<Finding> Findings(string designText, params string[] rules)
    {
        var folder = Directory.CreateTempSubdirectory("designrules-gbw-stability-").FullName;
        try
        {
            Directory.CreateDirectory(Path.Combine(folder, "parts"));
            File.Copy(RuleFixture.Path("stability/parts/stability-parts.yaml"), Path.Combine(folder, "parts", "stability-parts.yaml"));
            var file = Path.Combine(folder, "design.yaml");
            File.WriteAllText(file, designText);
            var report = DesignCheck.Run([file], new CheckOptions(null, new DateOnly(2026, 12, 1)));
            Assert.DoesNotContain(report.Findings, f => f.RuleId.StartsWith("DR9", StringComparison.Ordinal));
            return report.Findings.Where(f => rules.Contains(f.RuleId)).ToList();
        }
        finally
        {
            Directory.Delete(folder, recursive: true);
        }
    }

    private static Figure PhaseMargin(CheckReport report) =>
        report.Designs.Single().StageFigures.Single(s => s.Key == "driver").Value.Single(f => f.Key == FigureKinds.PhaseMargin.At("u1"));
}
