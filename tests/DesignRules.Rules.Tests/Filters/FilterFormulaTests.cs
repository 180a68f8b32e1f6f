namespace DesignRules.Rules.Tests.Filters;

/// <summary>
/// Filter blocks measured by the engine (AC analysis of the built circuit, a near-ideal amplifier) against the textbook
/// formulas, computed here from the component values. Source for the formulas: R. Schaumann and M. E. Van Valkenburg,
/// Design of Analog Filters, Oxford University Press 2001, the Sallen–Key and multiple-feedback biquads (chapter from
/// memory); the Butterworth Q = 1/√2 and |H(f0)| = K·Q are the standard second-order relations there.
/// </summary>
public sealed class FilterFormulaTests
{
    [Theory]
    [InlineData("filters/sallen-key-cutoff-5pct-capacitors.yaml")]
    [InlineData("filters/sallen-key-cutoff-1pct-capacitors.yaml")]
    [InlineData("filters/sallen-key-cutoff-1pct-over-temperature.yaml")]
    [InlineData("filters/butterworth-sallen-key.yaml")]
    [InlineData("filters/unequal-sallen-key.yaml")]
    [InlineData("filters/mfb-band-pass-equal-c.yaml")]
    [InlineData("filters/sallen-key-high-pass.yaml")]
    [InlineData("filters/sallen-key-low-pass-equal.yaml")]
    [InlineData("filters/mfb-low-pass.yaml")]
    public void Each_fixture_yields_exactly_its_stated_filter_findings(string fixture) => RuleFixture.Verify(fixture);

    [Theory]
    [InlineData("filters/butterworth-sallen-key.yaml", 10e3, 10e3, 20e-9, 10e-9)]
    [InlineData("filters/unequal-sallen-key.yaml", 4.7e3, 22e3, 33e-9, 4.7e-9)]
    public void A_unity_gain_Sallen_Key_low_pass_has_the_textbook_f0_and_Q(string fixture, double r1, double r2, double c1, double c2)
    {
        // f0 = 1/(2π·√(R1R2C1C2)); Q = √(R1R2C1C2)/(C2·(R1 + R2)) for the unity-gain form (Schaumann & Van Valkenburg).
        double f0 = 1 / (2 * Math.PI * Math.Sqrt(r1 * r2 * c1 * c2));
        double q = Math.Sqrt(r1 * r2 * c1 * c2) / (c2 * (r1 + r2));
        var figures = Figures(fixture);
        Assert.Equal(f0, figures["measured f0"], f0 * 2e-3);
        Assert.Equal(q, figures["measured Q"], q * 2e-3);
        Assert.Equal(1, figures["measured pass-band gain"], 1e-3);
        Assert.Equal(f0, figures["ideal f0"], f0 * 1e-9);
        Assert.Equal(q, figures["ideal Q"], q * 1e-9);
    }

    [Fact]
    public void A_Butterworth_section_has_Q_of_one_over_root_two_and_its_minus_3_dB_point_at_f0()
    {
        // Butterworth: Q = 1/√2, so |H(f0)| = K·Q = K/√2 — the −3 dB point is f0 itself.
        var figures = Figures("filters/butterworth-sallen-key.yaml");
        Assert.Equal(1 / Math.Sqrt(2), figures["measured Q"], 2e-3);
        Assert.Equal(figures["measured f0"], figures["upper −3 dB frequency"], figures["measured f0"] * 3e-3);
    }

    [Fact]
    public void A_multiple_feedback_band_pass_has_the_textbook_centre_gain_and_Q()
    {
        // Equal capacitors C: f0 = (1/(2πC))·√((R1 + R2)/(R1·R2·R3)); centre gain −R3/(2·R1); Q = π·f0·R3·C.
        double r1 = 10e3, r2 = 1e3, r3 = 100e3, c = 10e-9;
        double f0 = 1 / (2 * Math.PI * c) * Math.Sqrt((r1 + r2) / (r1 * r2 * r3));
        double gain = r3 / (2 * r1);
        double q = Math.PI * f0 * r3 * c;
        var figures = Figures("filters/mfb-band-pass-equal-c.yaml");
        Assert.Equal(f0, figures["measured centre frequency"], f0 * 2e-3);
        Assert.Equal(gain, figures["measured pass-band gain"], gain * 2e-3);
        Assert.Equal(q, figures["measured Q"], q * 5e-3);
    }

    [Fact]
    public void A_unity_gain_Sallen_Key_high_pass_has_the_textbook_f0_and_Q()
    {
        // High-pass dual of the unity-gain form: f0 = 1/(2π·√(R1R2C1C2)), Q = √(R1R2C1C2)/(R1·(C1 + C2)) (Schaumann & Van Valkenburg).
        double c1 = 10e-9, c2 = 10e-9, r1 = 10e3, r2 = 22e3;
        double f0 = 1 / (2 * Math.PI * Math.Sqrt(r1 * r2 * c1 * c2));
        double q = Math.Sqrt(r1 * r2 * c1 * c2) / (r1 * (c1 + c2));
        var figures = Figures("filters/sallen-key-high-pass.yaml");
        Assert.Equal(f0, figures["measured f0"], f0 * 2e-3);
        Assert.Equal(q, figures["measured Q"], q * 3e-3);
        Assert.Equal(1, figures["measured pass-band gain"], 2e-3);
    }

    [Fact]
    public void An_equal_component_Sallen_Key_low_pass_has_Q_of_one_over_three_minus_K()
    {
        // Equal components: f0 = 1/(2πRC), K = 1 + Rf/Rg, Q = 1/(3 − K); K = 1.586 gives the Butterworth Q ≈ 0.707.
        double r = 10e3, c = 10e-9, k = 1 + (5.86e3 / 10e3);
        double f0 = 1 / (2 * Math.PI * r * c);
        var figures = Figures("filters/sallen-key-low-pass-equal.yaml");
        Assert.Equal(f0, figures["measured f0"], f0 * 2e-3);
        Assert.Equal(1 / (3 - k), figures["measured Q"], 3e-3);
        Assert.Equal(k, figures["measured pass-band gain"], k * 1e-3);
    }

    [Fact]
    public void A_multiple_feedback_low_pass_has_the_gain_f0_and_Q_of_its_nodal_analysis()
    {
        // Nodal analysis of the multiple-feedback low-pass (r1 in, c1 to ground, r2 to the output, r3 to the − input, c2 across
        // the amplifier): H = −(R2/R1)/(s²R2R3C1C2 + sC2(R2 + R3 + R2R3/R1) + 1), the form the textbook gives.
        double r1 = 10e3, r2 = 20e3, r3 = 15e3, c1 = 47e-9, c2 = 2.2e-9;
        double f0 = 1 / (2 * Math.PI * Math.Sqrt(r2 * r3 * c1 * c2));
        double q = Math.Sqrt(r2 * r3 * c1 * c2) / (c2 * (r2 + r3 + (r2 * r3 / r1)));
        var figures = Figures("filters/mfb-low-pass.yaml");
        Assert.Equal(f0, figures["measured f0"], f0 * 2e-3);
        Assert.Equal(q, figures["measured Q"], q * 3e-3);
        Assert.Equal(r2 / r1, figures["measured pass-band gain"], 2e-3);
    }

    [Fact]
    public void Over_an_operating_range_the_cutoff_spread_adds_each_parts_tempco_and_names_the_worst_end()
    {
        // f0 = 1/(2π·√(R1R2C1C2)) (Schaumann & Van Valkenburg): with every part at the low end of its spread f0 rises by
        // 1/((1 − sR)(1 − sC)) − 1. At −40 °C (65 K from 25 °C) sR = 1 % + 50 ppm/K·65 K and sC = 1 % + 100 ppm/K·65 K
        // (the fixture's families), so +3.04 %: beyond the 3 % the design asks; at 25 °C alone it is 1/0.99² − 1 = +2.03 %.
        double sR = 0.01 + (50e-6 * 65), sC = 0.01 + (100e-6 * 65);
        double expected = (1 / ((1 - sR) * (1 - sC))) - 1;
        var report = RuleFixture.Verify("filters/sallen-key-cutoff-1pct-over-temperature.yaml");
        var figures = Assert.Single(report.Designs).StageFigures.Single(s => s.Key == "antialias").Value
            .GroupBy(f => f.Name).ToDictionary(g => g.Key, g => g.First().Value, StringComparer.Ordinal);
        double measured = figures["measured f0"], nominal = 1 / (2 * Math.PI * Math.Sqrt(10e3 * 10e3 * 22e-9 * 10e-9));
        Assert.Equal(((measured / nominal) * (1 + expected)) - 1, figures["worst-case f0 deviation"], 1e-3);
        var finding = Assert.Single(report.Findings, f => f.RuleId == "DR410");
        Assert.Contains("tempcos over -40 °C to 85 °C (worst at -40 °C)", finding.Message, StringComparison.Ordinal);

        var atRoom = Assert.Single(RuleFixture.Verify("filters/sallen-key-cutoff-1pct-capacitors.yaml").Designs).StageFigures
            .Single(s => s.Key == "antialias").Value.First(f => f.Name == "worst-case f0 deviation").Value;
        Assert.Equal((1 / (0.99 * 0.99)) - 1, atRoom, 1e-3);
    }

    private static Dictionary<string, double> Figures(string fixture)
    {
        var report = RuleFixture.Verify(fixture);
        var summary = Assert.Single(report.Designs);
        var stage = summary.StageFigures.Single(s => s.Key == "filter");
        return stage.Value.GroupBy(f => f.Name).ToDictionary(g => g.Key, g => g.First().Value, StringComparer.Ordinal);
    }
}
