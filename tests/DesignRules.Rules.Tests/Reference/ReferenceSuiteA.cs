using System.Globalization;
using DesignRules.Diagnostics;
using Xunit.Abstractions;

namespace DesignRules.Rules.Tests.Reference;

/// <summary>
/// Reference suite A: designs of our own (Fixtures/reference/a), each checked against an outside reference — a published
/// formula, a handbook relation or a textbook model, named beside it with the hand calculation — for its verdict and its
/// key figure within 5 %. The parts (parts/reference-a-parts.yaml) are invented classes with a very high open-loop gain so
/// that the ideal-amplifier formulas hold.
/// </summary>
public sealed class ReferenceSuiteA(ITestOutputHelper output)
{
    private const double Within = 0.05;

    // ---- Output current and the cause of clipping (issue 9, points 1 and 2) ----

    [Fact]
    public void A01_a_unity_inverting_stage_into_200_ohms_demands_51_mA_and_the_finding_says_so_not_the_20_mA_limit()
    {
        // Ohm's law: the ideal transfer asks vout = −vin = 10 V peak; the output drives the 200 Ω load (10 V / 200 Ω = 50 mA)
        // and the feedback resistor from the virtual ground (10 V / 10 kΩ = 1 mA): 51 mA demanded of a 20 mA part.
        var report = RuleFixture.Verify("reference/a/output-current-demand.yaml");
        var finding = Assert.Single(report.Findings, f => f.RuleId == "DR301");
        AssertNear(0.051, Figure(report, "driver", "peak output current u1"));
        AssertNear(0.051, finding.Figures.Single(f => f.Key == FigureKinds.OutputCurrent.At("u1")).Value);
        Assert.Contains("must deliver 51 mA", finding.Message, StringComparison.Ordinal);
        // The limited output delivers (nearly) its 20 mA limit and clips: that is the cause, and DR201 does not claim it.
        Assert.Contains("current-limits", finding.Message, StringComparison.Ordinal);
        Assert.Contains("clips", finding.Message, StringComparison.Ordinal);
        AssertNear(0.020, finding.Figures.Single(f => f.Name == "delivered output current").Value);
        Assert.DoesNotContain(report.Findings, f => f.RuleId == "DR201");
    }

    [Fact]
    public void A02_an_inverting_gain_of_10_asked_for_20_V_clips_at_its_13_5_V_swing_limit_and_only_the_swing_rule_says_so()
    {
        // Swing limit = rail − headroom = 15 V − 1.5 V = 13.5 V (the part's stated headroom); the stage asks 2 V × 10 = 20 V.
        // Its current stays small: 13.5 V / 10 kΩ load + 13.5 V / 100 kΩ feedback = 1.49 mA (Ohm's law), so DR301 is silent.
        var report = RuleFixture.Verify("reference/a/swing-limit-clip.yaml");
        var finding = Assert.Single(report.Findings, f => f.RuleId == "DR201");
        Assert.Contains("swing limit", finding.Message, StringComparison.Ordinal);
        AssertNear(13.5, finding.Figures.Single(f => f.Name == "swing limit").Value);
        AssertNear(13.5, finding.Figures.Single(f => f.Name == "output extreme").Value);
        AssertNear(0.00149, Figure(report, "amp", "peak output current u1"));
        var margin = FigureOf(report, "amp", "output swing margin u1");
        Assert.True(margin.Margin < 0, "a clipping output has less room than the margin threshold");
    }

    [Fact]
    public void A03_a_follower_driven_to_13_V_leaves_its_12_V_common_mode_range_and_only_the_common_mode_rule_says_so()
    {
        // Common-mode range = rail − input headroom = ±(15 V − 3 V) = ±12 V (the part's stated input range); a follower
        // puts its 13 V input on both inputs, 1 V beyond. Its output, 13 V, stays inside the ±13.5 V swing limit less the
        // 100 mV margin (13.4 V), so the one cause gets the one finding.
        var report = RuleFixture.Verify("reference/a/common-mode-follower.yaml");
        var finding = Assert.Single(report.Findings, f => f.RuleId == "DR203");
        AssertNear(-13, finding.Figures.Single(f => f.Name == "input extreme").Value);
        AssertNear(-12, finding.Figures.Single(f => f.Name == "common-mode limit").Value);
        Assert.DoesNotContain(report.Findings, f => f.RuleId is "DR201" or "DR301");
    }

    [Fact]
    public void A04_a_passing_non_inverting_stage_reports_its_output_current_with_limit_and_margin_in_the_json_figures()
    {
        // Ohm's law: gain 1 + 10k/10k = 2 puts 8 V peak across the 2 kΩ load (4 mA) and the rf + rg divider (8 V / 20 kΩ
        // = 0.4 mA): 4.4 mA. Limit 80 % of the 20 mA rating = 16 mA (DR301's default derating), margin 11.6 mA.
        var report = RuleFixture.Verify("reference/a/light-load-passes.yaml");
        Assert.Empty(report.Findings);
        var current = FigureOf(report, "amp", "peak output current u1");
        AssertNear(0.0044, current.Value);
        AssertNear(0.016, current.Limit!.Value);
        AssertNear(0.0116, current.Margin!.Value);

        var json = System.Text.Json.JsonDocument.Parse(Reports.JsonReport.ToBytes(report, new Reports.ReportSettings(RuleFixture.Path("reference/a"), null, "test")));
        var stage = json.RootElement.GetProperty("designs")[0].GetProperty("stages").EnumerateArray().Single(s => s.GetProperty("id").GetString() == "amp");
        var figure = stage.GetProperty("figures").EnumerateArray().Single(f => f.GetProperty("name").GetString() == "peak output current u1");
        Assert.Equal("A", figure.GetProperty("unit").GetString());
        AssertNear(0.0044, figure.GetProperty("value").GetDouble());
        AssertNear(0.016, figure.GetProperty("limit").GetDouble());
        AssertNear(0.0116, figure.GetProperty("margin").GetDouble());

        // A figure no rule judged (no accuracy stated, so the gain is only recorded) carries no limit and no margin.
        var gain = stage.GetProperty("figures").EnumerateArray().Single(f => f.GetProperty("name").GetString() == "nominal gain");
        AssertNear(2, gain.GetProperty("value").GetDouble());
        Assert.False(gain.TryGetProperty("limit", out _));
        Assert.False(gain.TryGetProperty("margin", out _));
    }

    // ---- Blame (point 4) ----

    [Fact]
    public void A05_a_peak_detector_whose_error_is_droop_blames_the_hold_capacitor_not_the_amplifier_offset()
    {
        // RC discharge between peaks (any circuits textbook): the held value falls as Vp·e^(−t/RC), RC = 100 kΩ · 4.7 µF =
        // 0.47 s, until the input comes back above it a little before the next peak, at T − δ with Vp·cos(2π·f·δ) =
        // Vp·e^(−(T − δ)/RC), T = 10 ms. Solved below by fixed-point iteration: δ ≈ 0.33 ms, droop ≈ 5 V·(1 − e^(−9.67 ms/470 ms))
        // ≈ 0.102 V = 2 % of full scale, against 1 % allowed. The amplifier's 2 mV offset is 0.04 %.
        var report = RuleFixture.Verify("reference/a/peak-detector-droop.yaml");
        double rc = 100e3 * 4.7e-6, period = 10e-3, delta = 0;
        for (int i = 0; i < 50; i++)
        {
            delta = Math.Acos(Math.Exp(-(period - delta) / rc)) / (2 * Math.PI / period);
        }

        double droop = 5 * (1 - Math.Exp(-(period - delta) / rc));
        output.WriteLine($"hand droop {droop:G4} V (delta {delta * 1e6:F1} us)");
        var worstCase = Assert.Single(report.Findings, f => f.RuleId == "DR401");
        var monteCarlo = Assert.Single(report.Findings, f => f.RuleId == "DR402");
        AssertNear(droop, worstCase.Figures.Single(f => f.Name == "hold droop").Value);
        foreach (var finding in new[] { worstCase, monteCarlo })
        {
            Assert.Contains("hold capacitor chold", finding.Message, StringComparison.Ordinal);
            Assert.DoesNotContain("most from amplifier", finding.Message, StringComparison.Ordinal);
            Assert.Equal(29, finding.Span.Line); // chold: 4.7 uF
            Assert.Equal(14, finding.Span.Column);
        }
    }

    // ---- Offset current (point 5) ----

    [Fact]
    public void A06_a_bias_compensated_inverting_stage_keeps_the_offset_current_times_rf()
    {
        // Standard op-amp DC-error analysis (Sedra and Smith, Microelectronic Circuits, input bias and offset currents): with
        // Rcomp = Rin ‖ Rf the bias currents cancel and Ios·Rf remains; the offset voltage adds Vos·(1 + Rf/Rin).
        // 20 nA · 1 MΩ + 2 µV · 101 + 100 nA · (9.901 kΩ − 9.9 kΩ) · 101 = 20 mV + 0.202 mV + 0.01 mV = 20.21 mV > 10 mV.
        var report = RuleFixture.Verify("reference/a/offset-current-ios.yaml");
        var finding = Assert.Single(report.Findings, f => f.RuleId == "DR405");
        AssertNear(0.02021, Figure(report, "amp", "worst-case output offset"));
        Assert.Contains("offset current", finding.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void A07_without_a_stated_offset_current_the_compensation_resistor_cancels_the_bias_error_as_the_help_page_says()
    {
        // Same stage, part without offset-current: the two bias currents are taken as equal (DR405 help page), leaving
        // Vos·(1 + Rf/Rin) + Ib·(Rin‖Rf − Rcomp)·(1 + Rf/Rin) = 0.202 mV + 0.01 mV = 0.212 mV (same textbook analysis).
        var report = RuleFixture.Verify("reference/a/offset-current-no-ios.yaml");
        AssertNear(0.000212, Figure(report, "amp", "worst-case output offset"));
        Assert.Contains("assumed equal", File.ReadAllText(Path.Combine(RuleFixture.RepositoryRoot(), "rules", "DR405.md")), StringComparison.Ordinal);
    }

    // ---- CMRR requirement (point 11) ----

    [Fact]
    public void A08_a_unity_difference_stage_with_1_percent_resistors_rejects_only_34_dB_against_a_50_dB_requirement()
    {
        // Worst-case CMRR of a difference amplifier from resistor mismatch (Sedra and Smith, difference amplifier):
        // CMRR ≈ (1 + G)/(4·t) = 2/(4 · 0.01) = 50 (34 dB), below the required 50 dB (316). The 5 V common mode then
        // moves the output by 5 V / 50 ≈ 0.1 V, inside the 20 % accuracy: only the cmrr requirement fails.
        var report = RuleFixture.Verify("reference/a/cmrr-difference-1pct.yaml");
        var finding = Assert.Single(report.Findings, f => f.RuleId == "DR403");
        AssertNear(50, finding.Figures.Single(f => f.Name == "worst-case common-mode rejection").Value);
        AssertNear(316.2, finding.Figures.Single(f => f.Name == "required common-mode rejection").Value);
        AssertNear(0.1, Figure(report, "diff", "common-mode output error"));
        Assert.Contains("50 dB", finding.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void A09_the_same_stage_with_0_1_percent_resistors_rejects_54_dB_and_meets_the_requirement()
    {
        // (1 + G)/(4·t) = 2/(4 · 0.001) = 500 (54 dB) ≥ 316 (50 dB): margin 184 (same formula).
        var report = RuleFixture.Verify("reference/a/cmrr-difference-0p1pct.yaml");
        var cmrr = FigureOf(report, "diff", "worst-case common-mode rejection");
        AssertNear(500, cmrr.Value);
        AssertNear(316.2, cmrr.Limit!.Value);
        AssertNear(183.8, cmrr.Margin!.Value);
    }

    [Fact]
    public void A10_a_cmrr_requirement_nothing_can_measure_is_reported_as_unchecked()
    {
        // An inverting stage has no common-mode input to reject (textbook: only a differential input has a CMRR).
        var report = RuleFixture.Verify("reference/a/cmrr-not-measurable.yaml");
        Assert.Contains("`cmrr`", Assert.Single(report.Findings, f => f.RuleId == "DR702").Message, StringComparison.Ordinal);
    }

    // ---- Zero-crossing glitch against an independent time-stepping of the textbook model (point 3) ----

    [Theory]
    [InlineData(0.5, 1.0, 1e3)]     // slow part, low frequency
    [InlineData(2.0, 1.0, 5e3)]     // slow part, mid band
    [InlineData(2.0, 1.0, 15e3)]    // slow part near the top of the audio band
    [InlineData(5.0, 10.0, 10e3)]   // fast GBW, moderate slew
    [InlineData(13.0, 3.0, 20e3)]   // general-purpose class at the top of the band
    [InlineData(1.0, 1.0, 10e3)]    // slow part, glitch a third of the half-cycle
    [InlineData(2.0, 1.0, 20e3)]    // slow part at the top of the band
    [InlineData(1.0, 3.0, 20e3)]    // slow slew, faster GBW, top of the band
    [InlineData(0.5, 1.0, 5e3)]
    public void A11_the_follower_rectifier_glitch_agrees_with_a_time_stepped_textbook_model(double slewVPerUs, double gbwMHz, double frequency)
    {
        // Reference: FollowerRectifierModel (single pole from GBW and A0, differential-pair tanh slew limit, constant-drop
        // diode of 0.6 V, the follower's own phase delay taken out). Hand estimate beside it: the amplifier rests at the
        // −13.5 V swing limit while the diode is off and must climb 13.5 V + Vf at the slew rate, t ≈ 14.1 V / SR.
        double slew = slewVPerUs * 1e6, gbw = gbwMHz * 1e6;
        double reference = FollowerRectifierModel.Glitch(slew, gbw, 1e8, -13.5, 0.6, 2, frequency, 0.01);
        var report = DesignCheck.Run([GlitchDesign(slewVPerUs, gbwMHz, frequency)], new CheckOptions(null, new DateOnly(2026, 12, 1)));
        Assert.DoesNotContain(report.Findings, f => f.RuleId.StartsWith("DR9", StringComparison.Ordinal));
        double engine = Figure(report, "rect", "zero-crossing glitch");
        output.WriteLine($"SR {slewVPerUs} V/us, GBW {gbwMHz} MHz, {frequency} Hz: engine {engine * 1e6:F3} us, reference {reference * 1e6:F3} us, 14.1 V/SR {14.1 / slew * 1e6:F3} us");
        AssertNear(reference, engine);
    }

    private static string GlitchDesign(double slewVPerUs, double gbwMHz, double frequency)
    {
        string folder = Path.Combine(Path.GetTempPath(), "designrules-reference-a", Guid.NewGuid().ToString("N"));
        Directory.CreateDirectory(folder);
        var f = CultureInfo.InvariantCulture;
        File.WriteAllText(Path.Combine(folder, "parts.yaml"), string.Create(f, $"""
            library:
              id: glitch-parts
            amplifiers:
              - id: glitch-amp
                description: Single-pole test amplifier (invented figures)
                typical: true
                gbw: {gbwMHz} MHz
                slew-rate: {slewVPerUs} V/us
                open-loop-gain: 160 dB
                output-headroom: {"{"} positive: 1.5 V, negative: 1.5 V {"}"}
                output-resistance: 50
                output-current: 50 mA
                input-range: {"{"} positive: 2 V, negative: 2 V {"}"}
                offset-voltage: {"{"} typical: 0 V, maximum: 1 uV {"}"}
                bias-current: {"{"} typical: 0 A, maximum: 1 fA {"}"}
                supply-span: {"{"} minimum: 10 V, maximum: 36 V {"}"}
            diodes:
              - id: glitch-diode
                description: Sharp small-signal diode, 0.6 V at 100 uA (invented figures)
                typical: true
                forward-voltage: {"{"} voltage: 0.6 V, current: 100 uA {"}"}
                reverse-voltage: 75 V
                forward-current: 150 mA
            """));
        string design = Path.Combine(folder, "glitch.yaml");
        File.WriteAllText(design, string.Create(f, $"""
            design:
              id: glitch-reference
            libraries: [parts.yaml]
            supplies: {"{"} positive: 15 V, negative: -15 V {"}"}
            source: {"{"} waveform: sine, amplitude: 2 V, frequency: {frequency} Hz {"}"}
            load: {"{"} resistance: 10k {"}"}
            stages:
              - id: rect
                block: half-wave-follower
                amplifier: glitch-amp
                diode: glitch-diode
                requires: {"{"} transfer: half-wave-positive, accuracy: 1%, glitch: 1 ms {"}"}
            """));
        return design;
    }

    private static double Figure(CheckReport report, string stage, string name) => FigureOf(report, stage, name).Value;

    private static Figure FigureOf(CheckReport report, string stage, string name)
    {
        var figures = report.Designs.Single().StageFigures.Single(s => s.Key == stage).Value;
        return figures.SingleOrDefault(f => f.Name == name)
            ?? throw new Xunit.Sdk.XunitException($"no figure '{name}' in stage {stage}: {string.Join(", ", figures.Select(f => f.Name))}\n{RuleFixture.Describe(report)}");
    }

    private static void AssertNear(double expected, double actual) =>
        Assert.True(Math.Abs(actual - expected) <= Within * Math.Abs(expected), $"expected {expected:G4} within 5 %, got {actual:G4}");
}
