using DesignRules.Diagnostics;
using DesignRules.Elaboration;
using DesignRules.Figures.Tolerance;
using DesignRules.Loading;
using DesignRules.Model;
using DesignRules.Quantities;

namespace DesignRules.Rules.Tests.Tolerance;

/// <summary>
/// Issue 14 point 1: a design states an operating range; the tolerance analyses run at its ends and middle on the stage's
/// one compiled circuit, and a finding names the temperature where it occurs.
/// </summary>
public sealed class OperatingTemperatureTests
{
    [Fact]
    public void A_design_that_meets_its_accuracy_at_25_C_builds_clean() => RuleFixture.Verify("tolerance/drift-at-25-only-passes.yaml");

    [Fact]
    public void The_same_design_over_0_to_85_C_fails_its_accuracy_at_the_amplifier() => RuleFixture.Verify("tolerance/drift-hot-end-fails.yaml");

    [Fact]
    public void A_lower_drift_amplifier_class_meets_the_accuracy_over_the_range() => RuleFixture.Verify("tolerance/drift-low-drift-passes.yaml");

    [Fact]
    public void The_finding_names_the_hot_end_and_records_it_as_a_figure()
    {
        var report = RuleFixture.Verify("tolerance/drift-hot-end-fails.yaml");
        var finding = Assert.Single(report.Findings, f => f.RuleId == RuleIds.WorstCaseTransfer);
        Assert.Contains("at 85 °C", finding.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void The_offset_drift_of_an_inverting_stage_is_the_drift_times_the_noise_gain_times_the_temperature_change()
    {
        var analysis = ToleranceFixture.WorstCase("drift-hot-end-fails.yaml");

        // Standard op-amp offset/drift relation: ΔVout = TCVos · (1 + Rf/Rin) · ΔT, worst at the end farthest from 25 °C:
        // 50 µV/°C · (1 + 100k/10k) · (85 − 25) °C = 33 mV; the output offset there is (Vos,max + TCVos·ΔT)·(1 + Rf/Rin)
        // = (1 mV + 3 mV) · 11 = 44 mV (exact resistors, 1 fA bias, 180 dB open-loop gain).
        Assert.Equal(33e-3, analysis.OffsetDrift, 33e-3 * 1e-5);
        Assert.Equal(44e-3, analysis.OutputOffset, 44e-3 * 1e-5);
        Assert.Equal(85, analysis.WorstTemperatureOf(a => a.OutputOffset));
        Assert.Equal([0.0, 42.5, 85.0], analysis.AtTemperatures.Select(a => a.Temperature));
    }

    [Fact]
    public void Every_temperature_reuses_the_one_compiled_circuit()
    {
        var analysis = ToleranceFixture.WorstCase("drift-hot-end-fails.yaml");
        Assert.All(analysis.AtTemperatures, a => Assert.Same(analysis.Circuit, a.Circuit));
    }

    [Fact]
    public void Monte_Carlo_draws_temperature_over_the_range_and_repeats_with_its_seed()
    {
        var settings = new MonteCarloSettings(400, 7, ToleranceDistribution.Normal);
        var first = ToleranceFixture.MonteCarlo("drift-hot-end-fails.yaml", settings, threads: 2);
        var again = ToleranceFixture.MonteCarlo("drift-hot-end-fails.yaml", settings, threads: 1);
        var at25 = ToleranceFixture.MonteCarlo("drift-at-25-only-passes.yaml", settings);

        Assert.Equal(first.Errors, again.Errors);
        // Drawing a temperature widens the spread of the errors beyond the 25 °C samples of the same part.
        Assert.True(first.Errors.Max() > at25.Errors.Max(), $"{first.Errors.Max()} vs {at25.Errors.Max()}");
    }

    [Theory]
    [InlineData("temperature: 85 °C..-40 °C", "runs backwards")]
    [InlineData("temperature: -40 °C", "-40 °C..85 °C")]
    [InlineData("temperature: -40 °C..85 V", "temperature")]
    [InlineData("temperature: -400 °C..85 °C", "-100 °C..250 °C")]
    public void A_malformed_or_reversed_range_gets_a_located_diagnostic_with_a_hint(string line, string hint)
    {
        var text = File.ReadAllText(RuleFixture.Path(Path.Combine("tolerance", "drift-hot-end-fails.yaml")))
            .Replace("temperature: 0 °C..85 °C", line, StringComparison.Ordinal);
        var dir = Directory.CreateTempSubdirectory("dr-temperature-");
        try
        {
            Directory.CreateDirectory(Path.Combine(dir.FullName, "parts"));
            File.Copy(RuleFixture.Path(Path.Combine("tolerance", "parts", "tolerance-parts.yaml")), Path.Combine(dir.FullName, "parts", "tolerance-parts.yaml"));
            var file = Path.Combine(dir.FullName, "design.yaml");
            File.WriteAllText(file, text);
            var loaded = DesignLoader.LoadFiles([file]);
            int lineOfRange = Array.FindIndex(text.Split('\n'), l => l.Contains(line, StringComparison.Ordinal)) + 1;
            var diagnostic = Assert.Single(loaded.Diagnostics, d => d.Span.Line == lineOfRange);
            Assert.StartsWith("DR9", diagnostic.Id, StringComparison.Ordinal);
            Assert.Contains(hint, diagnostic.Message, StringComparison.Ordinal);
        }
        finally
        {
            dir.Delete(recursive: true);
        }
    }

    [Fact]
    public void Offset_drift_reads_in_microvolts_per_degree()
    {
        // 1 µV/°C is 1e-6 V/K (a kelvin and a degree Celsius are the same step, SI brochure).
        Assert.True(Quantity.TryParse("1 µV/°C", Dimension.VoltageDrift, out var q, out _));
        Assert.Equal(1e-6, q.Value, 1e-18);
        Assert.Equal("10 µV/°C", new Quantity(10e-6, Dimension.VoltageDrift).Format());
    }

    [Fact]
    public void A_diode_part_moves_its_forward_voltage_by_its_own_coefficient_and_one_that_states_none_by_minus_2_mV_per_C()
    {
        // The fixture diode states -1.5 mV/°C: at 85 °C its forward voltage is 1.5 mV/°C × (85 − 25) °C = 90 mV lower.
        var (_, stated) = ToleranceFixture.Load("diode-coefficient-stated.yaml");
        var own = ToleranceVariables.Of(stated, ElaborationOptions.Default).Diodes;
        Assert.Equal(2, own.Count);
        Assert.All(own, d => Assert.Equal(-90e-3, TemperatureBehaviour.DiodeShift(d, 85), 1e-12));

        // The same block with a part that states none: −2 mV/°C (common practice for silicon junctions), 120 mV at 85 °C,
        // and the cold end raises it: +2 mV/°C × 65 °C = +130 mV at −40 °C.
        var (_, defaulted) = ToleranceFixture.Load("absolute-value-symmetric.yaml");
        var others = ToleranceVariables.Of(defaulted, ElaborationOptions.Default).Diodes;
        Assert.All(others, d => Assert.Equal(-120e-3, TemperatureBehaviour.DiodeShift(d, 85), 1e-12));
        Assert.All(others, d => Assert.Equal(130e-3, TemperatureBehaviour.DiodeShift(d, -40), 1e-12));
    }

    [Fact]
    public void The_design_with_its_own_diode_coefficient_checks_clean_over_its_range() => RuleFixture.Verify("tolerance/diode-coefficient-stated.yaml");
}
