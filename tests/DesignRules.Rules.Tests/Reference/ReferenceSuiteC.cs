using Xunit.Abstractions;

namespace DesignRules.Rules.Tests.Reference;

/// <summary>
/// Reference suite C (issue 20): designs of our own (Fixtures/reference/c) whose verdict and key figure follow from a
/// textbook formula, named beside each case with the hand calculation; each asserts the verdict and the figure within 5 %.
/// The parts (parts/reference-c-parts.yaml) are invented classes with a very high open-loop gain, so that the
/// ideal-amplifier formulas hold.
/// </summary>
public sealed class ReferenceSuiteC(ITestOutputHelper output)
{
    // ---- Full-power bandwidth of a non-sine source (point 5) ----

    [Fact]
    public void C01_a_triangle_whose_slope_4_Vp_f_is_inside_the_slew_rate_passes_with_the_bandwidth_SR_over_4_Vp()
    {
        // Triangle of peak Vp at f: its slope is 2·Vp per half period, 4·Vp·f (textbook waveform geometry; e.g. Franco,
        // Design with Operational Amplifiers, slew-rate limiting). It reaches SR at f = SR/(4·Vp) = 1 V/µs / 20 V = 50 kHz,
        // above 1.2 × 30 kHz = 36 kHz. The sine formula SR/(2π·Vp) = 31.8 kHz would fire.
        var report = Verify("reference/c/fpbw-triangle-passes.yaml");
        AssertNear(1e6 / (4 * 5.0), Figure(report, "buf", "full-power bandwidth u1"));
    }

    [Fact]
    public void C02_a_triangle_at_45_kHz_misses_its_margin_and_the_message_names_the_triangle_formula()
    {
        // Same formula: SR/(4·Vp) = 50 kHz < 1.2 × 45 kHz = 54 kHz.
        var report = Verify("reference/c/fpbw-triangle-fails.yaml");
        var finding = Assert.Single(report.Findings, f => f.RuleId == "DR101");
        AssertNear(50e3, finding.Figures.Single(f => f.Key.Kind == FigureKinds.FullPowerBandwidth).Value);
        Assert.Contains("SR/(4·Vp)", finding.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void C03_a_sine_keeps_the_sine_formula_and_the_message_names_it()
    {
        // SR/(2π·Vp) (textbook full-power bandwidth); the fixture's own derivation is in its header.
        var report = RuleFixture.Verify("slew/gain-stage-beyond-full-power-bandwidth.yaml");
        var finding = Assert.Single(report.Findings, f => f.RuleId == "DR101");
        Assert.Contains("SR/(2π·Vp), the sine formula", finding.Message, StringComparison.Ordinal);
        double peak = finding.Figures.Single(f => f.Key.Kind == FigureKinds.PeakExcursion).Value;
        AssertNear(0.6e6 / (2 * Math.PI * peak), finding.Figures.Single(f => f.Key.Kind == FigureKinds.FullPowerBandwidth).Value);
    }

    // ---- Slew demand from the waveform followed (point 4) ----

    [Fact]
    public void C04_a_square_with_20_us_edges_demands_only_its_edge_slope_of_0_2_V_per_us()
    {
        // Slope of a linear edge = ΔV / t_edge = 4 V / 20 µs = 0.2 V/µs (the waveform's own geometry), inside 1 V/µs.
        var report = Verify("reference/c/slew-slow-edge-passes.yaml");
        AssertNear(0.2e6, Figure(report, "buf", "slew demanded at buf.out"));
    }

    [Fact]
    public void C05_a_square_with_2_us_edges_demands_2_V_per_us_of_a_1_V_per_us_part()
    {
        // ΔV / t_edge = 4 V / 2 µs = 2 V/µs > 1 V/µs.
        var report = Verify("reference/c/slew-fast-edge-fails.yaml");
        var finding = Assert.Single(report.Findings, f => f.RuleId == "DR102");
        AssertNear(2e6, finding.Figures.Single(f => f.Key.Kind == FigureKinds.SlewDemand).Value);
    }

    // ---- DC transfer over the levels the signal visits (point 3) ----

    [Fact]
    public void C06_a_mid_supply_follower_is_judged_over_4_to_8_V_and_its_offset_relative_to_its_6_V_bias()
    {
        // Follower: vout = vin + Vos (textbook op-amp DC error model, e.g. Sedra and Smith, offset voltage), so the offset
        // at the 6 V bias is Vos,max = 2 µV and the gain 1; the signal (6 V ± 2 V) never visits 0 V, where the output would
        // rest at the 1 V headroom.
        var report = Verify("reference/c/bias-follower-passes.yaml");
        AssertNear(2e-6, Figure(report, "buf", "worst-case output offset"));
        AssertNear(1, Figure(report, "buf", "worst-case gain high"));
        AssertNear(1, Figure(report, "buf", "worst-case gain low"));
        Assert.True(Figure(report, "buf", "worst-case transfer error") < 0.01);
    }

    [Fact]
    public void C07_the_same_follower_with_a_5_mV_offset_part_misses_its_2_mV_offset_at_the_bias()
    {
        // vout − vin = Vos = 5 mV at the 6 V bias (same textbook model) > 2 mV.
        var report = Verify("reference/c/bias-follower-offset-fails.yaml");
        var finding = Assert.Single(report.Findings, f => f.RuleId == "DR405");
        AssertNear(5e-3, finding.Figures.Single(f => f.Key.Kind == FigureKinds.OutputOffset).Value);
    }

    // ---- Offset by extreme-value analysis over every variable (point 2) ----

    /// <summary>
    /// Output offset of a bias-compensated inverting stage (Sedra and Smith, Microelectronic Circuits, input bias current
    /// and offset voltage): Vo = Vos·(1 + rf/rin) + Ib·(rf − rcomp·(1 + rf/rin)) with both bias currents equal; its
    /// extreme-value worst case (the textbook worst-case method: every variable at either extreme, every combination) over
    /// rin, rf, rcomp at ±tolerance and Vos, Ib at ± their maxima.
    /// </summary>
    private static double InvertingOffsetExtreme(double rin, double rf, double rcomp, double tolerance, double vos, double ib)
    {
        double worst = 0;
        for (int mask = 0; mask < 32; mask++)
        {
            double Pick(int bit, double value, double spread) => value * (1 + ((mask & (1 << bit)) != 0 ? spread : -spread));
            double a = Pick(0, rin, tolerance), f = Pick(1, rf, tolerance), c = Pick(2, rcomp, tolerance);
            double v = Pick(3, vos, 1) - vos, i = Pick(4, ib, 1) - ib; // ±vos, ±ib
            worst = Math.Max(worst, Math.Abs((v * (1 + (f / a))) + (i * (f - (c * (1 + (f / a)))))));
        }

        return worst;
    }

    [Fact]
    public void C08_bias_current_times_resistor_mismatch_makes_the_offset_three_times_what_nominal_resistors_give()
    {
        double hand = InvertingOffsetExtreme(10e3, 100e3, 9.1e3, 0.05, 50e-6, 100e-9);
        output.WriteLine($"hand extreme-value offset {hand * 1e3:F3} mV");
        var report = Verify("reference/c/offset-eva-fails.yaml");
        var finding = Assert.Single(report.Findings, f => f.RuleId == "DR405");
        AssertNear(hand, finding.Figures.Single(f => f.Key.Kind == FigureKinds.OutputOffset).Value);
        Assert.Contains("bias currents through the resistors' tolerance", finding.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void C09_with_exact_resistors_the_same_stage_keeps_its_0_56_mV_offset()
    {
        double hand = InvertingOffsetExtreme(10e3, 100e3, 9.1e3, 0, 50e-6, 100e-9);
        var report = Verify("reference/c/offset-eva-passes.yaml");
        AssertNear(hand, Figure(report, "amp", "worst-case output offset"));
    }

    // ---- Swing, current and power at the tolerance corners (point 1) ----

    [Fact]
    public void C10_a_gain_of_13_that_clips_only_at_its_high_gain_corner_fails_the_swing_rule_and_names_the_corner()
    {
        // Non-inverting gain 1 + rf/rg (textbook); at rf·1.05, rg·0.95: 1 + 12.6k/0.95k = 14.26, and 1 V × 14.26 = 14.26 V
        // is beyond the 13.5 V swing limit (15 V rail less the part's 1.5 V headroom).
        double cornerGain = 1 + (12e3 * 1.05 / (1e3 * 0.95));
        var report = Verify("reference/c/corner-swing-fails.yaml");
        var finding = Assert.Single(report.Findings, f => f.RuleId == "DR201");
        Assert.Contains("at the gain-high corner [amp.rf +5 %, amp.rg −5 %]", finding.Message, StringComparison.Ordinal);
        AssertNear(13.5, Math.Abs(finding.Figures.Single(f => f.Key.Kind == FigureKinds.OutputExtreme).Value));
        // The worst-case gain is the corner's linear gain, not the clipped ratio 13.5 V / 1 V.
        AssertNear(cornerGain, Figure(report, "amp", "worst-case gain high"));
        AssertNear(1 + (12e3 * 0.95 / (1e3 * 1.05)), Figure(report, "amp", "worst-case gain low"));
        Assert.True(FigureOf(report, "amp", "output swing margin u1").Value <= 0, "a clipping corner leaves no swing margin");
    }

    [Fact]
    public void C11_the_same_stage_at_0_9_V_keeps_its_swing_margin_at_the_high_gain_corner()
    {
        // 0.9 V × 14.26 = 12.84 V (textbook non-inverting gain at the corner): 13.5 V − 12.84 V = 0.66 V of room.
        double cornerGain = 1 + (12e3 * 1.05 / (1e3 * 0.95));
        var report = Verify("reference/c/corner-swing-passes.yaml");
        AssertNear(13.5 - (0.9 * cornerGain), Figure(report, "amp", "output swing margin u1"));
    }

    [Fact]
    public void C12_an_input_resistor_over_its_rating_only_at_its_low_corner_fails_the_power_rule_and_names_the_corner()
    {
        // Joule's law for a sine: P = Vp²/(2·R); the virtual ground puts the source across rin: 9.85² / (2 · 950 Ω) = 51.1 mW
        // against 50 % of 100 mW.
        double hand = 9.85 * 9.85 / (2 * 950);
        var report = Verify("reference/c/corner-power-fails.yaml");
        var finding = Assert.Single(report.Findings, f => f.RuleId == "DR601");
        AssertNear(hand, finding.Figures.Single(f => f.Key.Kind == FigureKinds.ResistorPower).Value);
        Assert.Contains("corner [", finding.Message, StringComparison.Ordinal);
        Assert.Contains("amp.rin −5 %", finding.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void C13_with_a_1_1_k_input_resistor_its_low_corner_stays_inside_the_rating()
    {
        // P = Vp²/(2·R) at 1.1 kΩ · 0.95 = 1045 Ω: 46.4 mW ≤ 50 mW (Joule's law).
        var report = Verify("reference/c/corner-power-passes.yaml");
        AssertNear(9.85 * 9.85 / (2 * 1045), Figure(report, "amp", "power in rin"));
    }

    /// <summary>Ohm's law: an inverting stage's output current into its load and its feedback resistor from the virtual ground.</summary>
    private static double InvertingOutputCurrent(double source, double rin, double rf, double load) => (source * rf / rin) * ((1 / load) + (1 / rf));

    [Fact]
    public void C14_an_output_over_its_current_only_at_the_high_gain_corner_fails_the_current_rule_and_names_the_corner()
    {
        double hand = InvertingOutputCurrent(0.77, 9.5e3, 105e3, 500);
        var report = Verify("reference/c/corner-current-fails.yaml");
        var finding = Assert.Single(report.Findings, f => f.RuleId == "DR301");
        AssertNear(hand, finding.Figures.Single(f => f.Key.Kind == FigureKinds.OutputCurrent).Value);
        Assert.Contains("at the gain-high corner [amp.rf +5 %, amp.rin −5 %]", finding.Message, StringComparison.Ordinal);
        Assert.True(InvertingOutputCurrent(0.77, 10e3, 100e3, 500) < 0.016, "nominal values alone pass (the class this fixes)");
    }

    [Fact]
    public void C15_at_0_7_V_the_high_gain_corner_stays_inside_the_derated_current()
    {
        var report = Verify("reference/c/corner-current-passes.yaml");
        AssertNear(InvertingOutputCurrent(0.7, 9.5e3, 105e3, 500), Figure(report, "amp", "peak output current u1"));
    }

    // ---- Rectifier into a load returned elsewhere (point 7) ----

    [Fact]
    public void C16_a_two_diode_rectifier_into_a_load_returned_to_1_V_has_a_static_error_judged_by_DR303_not_a_glitch()
    {
        // Voltage divider (Ohm's law): in the blocked half-cycle rf ties the output to the virtual ground and the 100k load
        // to 1 V pulls it to 1 V · 10k / 110k = 90.9 mV, over the 2 V full scale (ideal |−vin| peak) = 4.55 %.
        var report = Verify("reference/c/rect-return-static-fails.yaml");
        var finding = Assert.Single(report.Findings, f => f.RuleId == "DR303");
        AssertNear(1.0 * 10e3 / 110e3 / 2.0, finding.Figures.Single(f => f.Key.Kind == FigureKinds.DiodeOffError).Value);
        // The glitch is what follows a zero crossing: far shorter than the 0.5 ms half-cycle the static error lasts.
        Assert.True(Figure(report, "rect", "zero-crossing glitch") < 10e-6, "the static error is not counted as a glitch");
    }

    [Fact]
    public void C17_into_200k_returned_to_0_3_V_the_blocked_half_cycle_stays_within_its_1_percent()
    {
        // Voltage divider: 0.3 V · 10k / 210k = 14.3 mV over 2 V = 0.714 %.
        var report = Verify("reference/c/rect-return-small-passes.yaml");
        AssertNear(0.3 * 10e3 / 210e3 / 2.0, Figure(report, "rect", "output error while the diode is off"));
    }

    [Fact]
    public void C18_a_slow_rectifier_into_the_same_load_still_has_its_real_glitch_bounded_by_its_slewing_time()
    {
        // ΔV/SR (textbook slewing time): the output is wrong at most while the amplifier slews across the dead zone, the
        // event's swing over 1 V/µs (about 0.9 µs); the glitch exceeds 1 % of the 50 µs period (0.5 µs). Without the static
        // error taken out, it was the whole 25 µs half-cycle.
        var report = Verify("reference/c/rect-return-slow-glitch-fails.yaml");
        var finding = Assert.Single(report.Findings, f => f.RuleId == "DR103");
        double glitch = finding.Figures.Single(f => f.Key.Kind == FigureKinds.Glitch).Value;
        double slewing = finding.Figures.Single(f => f.Key.Kind == FigureKinds.SlewingSwing).Value / 1e6;
        Assert.InRange(glitch, 0.5e-6, slewing * 1.05);
    }

    // ---- Filling versus droop in a hold circuit (point 6) ----

    [Fact]
    public void C19_a_hold_capacitor_still_filling_is_reported_as_filling_with_the_charge_current_it_needs_not_as_droop()
    {
        // Capacitor current i = C·dv/dt at the sine's steepest slope 2π·f·Vp (textbook): 47 µF · 2π · 100 Hz · 5 V = 148 mA.
        var report = Verify("reference/c/peak-filling-fails.yaml");
        var finding = Assert.Single(report.Findings, f => f.RuleId == "DR305");
        AssertNear(47e-6 * 2 * Math.PI * 100 * 5, finding.Figures.Single(f => f.Key.Kind == FigureKinds.HoldChargeCurrent).Value);
        Assert.DoesNotContain(report.Findings, f => f.Message.Contains("droop of hold capacitor", StringComparison.Ordinal));
    }

    [Fact]
    public void C20_a_hold_capacitor_that_fills_at_once_is_judged_on_its_droop_and_blames_the_hold_capacitor()
    {
        // RC discharge between peaks (same method as reference case A05): RC = 1 MΩ · 1 µF = 1 s, T = 10 ms; the input
        // catches the held value δ before the next peak with Vp·cos(2π·f·δ) = Vp·e^(−(T − δ)/RC); droop = Vp·(1 − e^(−(T − δ)/RC)).
        double rc = 1.0, period = 10e-3, delta = 0;
        for (int i = 0; i < 50; i++) delta = Math.Acos(Math.Exp(-(period - delta) / rc)) / (2 * Math.PI / period);
        double droop = 5 * (1 - Math.Exp(-(period - delta) / rc));
        output.WriteLine($"hand droop {droop * 1e3:F2} mV");
        var report = Verify("reference/c/peak-settled-passes.yaml");
        var finding = Assert.Single(report.Findings, f => f.RuleId == "DR401");
        AssertNear(droop, finding.Figures.Single(f => f.Key.Kind == FigureKinds.HoldDroop).Value);
        Assert.Contains("droop of hold capacitor chold", finding.Message, StringComparison.Ordinal);
    }

    // ---- Common-mode range at the tolerance corners (point 1) ----

    [Fact]
    public void C21_a_follower_whose_input_passes_its_common_mode_range_only_at_the_high_gain_corner_before_it_fails_and_names_the_corner()
    {
        // The follower's input is the first stage's output: 1.05 V × (1 + rf/rg) (textbook non-inverting gain); at the
        // gain-high corner 1 + 10.5k/0.95k = 12.05, so 1.05 V × 12.05 = 12.66 V against the +12 V end of the range
        // (15 V rail less the part's 3 V input headroom): 0.66 V beyond. Nominal: 1.05 V × 11 = 11.55 V, inside.
        double cornerGain = 1 + (10e3 * 1.05 / (1e3 * 0.95));
        var report = Verify("reference/c/corner-common-mode-fails.yaml");
        var finding = Assert.Single(report.Findings, f => f.RuleId == "DR203");
        Assert.Contains("at the gain-high corner [amp.rf +5 %, amp.rg −5 %]", finding.Message, StringComparison.Ordinal);
        AssertNear(1.05 * cornerGain, Math.Abs(finding.Figures.Single(f => f.Key.Kind == FigureKinds.InputExtreme).Value));
        AssertNear(12 - (1.05 * cornerGain), Figure(report, "buf", "input common-mode margin u1"));
    }

    [Fact]
    public void C22_at_0_95_V_the_follower_keeps_its_common_mode_margin_at_the_high_gain_corner()
    {
        // 0.95 V × 12.05 = 11.45 V (textbook non-inverting gain at the corner): 12 V − 11.45 V = 0.55 V of room.
        double cornerGain = 1 + (10e3 * 1.05 / (1e3 * 0.95));
        var report = Verify("reference/c/corner-common-mode-passes.yaml");
        AssertNear(12 - (0.95 * cornerGain), Figure(report, "buf", "input common-mode margin u1"));
    }

    private CheckReport Verify(string fixture)
    {
        try
        {
            return RuleFixture.Verify(fixture);
        }
        finally
        {
            var report = DesignCheck.Run([RuleFixture.Path(fixture)], new CheckOptions(null, new DateOnly(2026, 12, 1)));
            output.WriteLine(RuleFixture.Describe(report));
            foreach (var (stage, figures) in report.Designs.Single().StageFigures)
            {
                foreach (var f in figures) output.WriteLine($"  {stage}: {f.Name} = {f.Value:G5} {f.Unit}");
            }
        }
    }

    private static double Figure(CheckReport report, string stage, string name) => FigureOf(report, stage, name).Value;

    private static Figure FigureOf(CheckReport report, string stage, string name) =>
        report.Designs.Single().StageFigures.Single(s => s.Key == stage).Value.Single(f => f.Name == name);

    private static void AssertNear(double expected, double actual) =>
        Assert.True(Math.Abs(actual - expected) <= 0.05 * Math.Abs(expected), $"expected {expected:G4} within 5 %, got {actual:G4}");
}
