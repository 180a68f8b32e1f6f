namespace DesignRules.Rules.Tests.Reference;

/// <summary>
/// Reference suite, half B: designs of our own whose verdict and key figure follow from a published formula, a handbook
/// table or a textbook worked example, named beside each case with the hand calculation. Each asserts the verdict and
/// the key figure within 5 %.
/// </summary>
public sealed class ReferenceSuiteB
{
    private static double Figure(CheckReport report, string stage, string name) =>
        report.Designs.Single().StageFigures.Single(s => s.Key == stage).Value.Single(f => f.Name == name).Value;

    private static void Within5Percent(double expected, double actual) =>
        Assert.True(Math.Abs(actual - expected) <= 0.05 * Math.Abs(expected), $"expected {expected:G4} within 5 %, got {actual:G4}");

    [Fact]
    public void A_gain_stage_after_a_slow_average_is_judged_on_the_settled_average_and_clips()
    {
        // Mean of a full-wave rectified sine = 2·Vp/π (handbook value; e.g. any electronics handbook's table of
        // waveform averages): 2 × 1 V / π = 0.6366 V. Gain 1 + 30k/1k = 31 (non-inverting gain, textbook formula)
        // asks for 19.7 V, beyond the 13.5 V the part swings to, so DR201 fires at the gain stage's amplifier.
        var report = RuleFixture.Verify("reference/b/slow-average-into-gain.yaml");
        Within5Percent(2 * 1.0 / Math.PI, Figure(report, "average", "averaged level"));
    }

    [Fact]
    public void A_netlist_follower_on_a_decompensated_part_runs_below_its_minimum_stable_gain()
    {
        // Follower: the whole output returns to the inverting input, β = 1, noise gain 1/β = 1 (textbook; e.g. Franco,
        // Design with Operational Amplifiers and Analog Integrated Circuits, on decompensated amplifiers). The part is
        // stable only from 5, so DR503 fires at the element.
        var report = RuleFixture.Verify("reference/b/netlist-follower-decompensated.yaml");
        Within5Percent(1.0, Figure(report, "buffer", "noise gain u1"));
    }

    [Fact]
    public void A_netlist_non_inverting_gain_of_11_has_a_noise_gain_of_11_and_is_stable()
    {
        // Non-inverting amplifier: β = rg/(rg + rf) = 1k/11k, noise gain 1 + rf/rg = 11 (textbook formula) ≥ 5.
        var report = RuleFixture.Verify("reference/b/netlist-non-inverting-gain-11.yaml");
        Within5Percent(11.0, Figure(report, "gain", "noise gain u1"));
    }

    [Fact]
    public void A_netlist_inverting_gain_of_2_has_a_noise_gain_of_3_below_the_parts_minimum()
    {
        // Inverting amplifier: signal gain −rf/rin = −2, noise gain 1 + rf/rin = 3 (textbook: one more than the magnitude
        // of the inverting gain), below the part's 5: DR503.
        var report = RuleFixture.Verify("reference/b/netlist-inverting-gain-2.yaml");
        Within5Percent(3.0, Figure(report, "invert", "noise gain u1"));
    }

    [Fact]
    public void A_netlist_resistor_with_no_family_is_reported_with_the_power_it_dissipates()
    {
        // Joule's law: P = V²/R = (5 V)² / 100 Ω = 250 mW.
        var report = RuleFixture.Verify("reference/b/netlist-unrated-resistor.yaml");
        var finding = Assert.Single(report.Findings, f => f.RuleId == "DR605");
        Within5Percent(0.25, finding.Figures.Single(f => f.Key.Kind == FigureKinds.ResistorPower).Value);
        Assert.Contains("family:", finding.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void A_full_wave_average_settles_to_two_peak_over_pi_within_its_accuracy()
    {
        // Mean of a full-wave rectified sine = 2·Vp/π (handbook table of waveform averages): 2 × 2 V / π = 1.273 V.
        var report = RuleFixture.Verify("reference/b/full-wave-average-accurate.yaml");
        Within5Percent(2 * 2.0 / Math.PI, Figure(report, "average", "averaged level"));
        Within5Percent(2 * 2.0 / Math.PI, Figure(report, "average", "ideal averaged level"));
    }

    [Fact]
    public void A_full_wave_average_divided_by_its_load_misses_its_accuracy()
    {
        // Mean of a full-wave rectified sine = 2·Vp/π (handbook) = 1.273 V ideally; the 10k filter resistor into
        // 10k || 100k = 9.09k divides it by 9.09/19.09 = 0.476 (voltage-divider formula): 0.606 V, 52.4 % off.
        var report = RuleFixture.Verify("reference/b/full-wave-average-divided.yaml");
        double ideal = 2 * 2.0 / Math.PI, divider = 9.0909 / 19.0909;
        Within5Percent(ideal, Figure(report, "average", "ideal averaged level"));
        Within5Percent(ideal * divider, Figure(report, "average", "averaged level"));
        Within5Percent(1 - divider, Figure(report, "average", "average transfer error"));
    }

    [Fact]
    public void A_glitch_requirement_on_a_netlist_gain_stage_with_a_clamp_diode_is_not_checked_and_never_met()
    {
        // Inverting gain −rf/rin = −20k/10k = −2 (textbook formula); 0.2 V in gives 0.4 V out, far below the clamp
        // diode's forward drop, so the stage is linear and has no zero crossing to glitch at.
        var report = RuleFixture.Verify("reference/b/netlist-clamp-with-glitch.yaml");
        var requirements = report.Designs.Single().Requirements;
        Assert.Equal("not checked", requirements.Single(r => r.Name == "glitch").Verdict);
        Assert.Empty(requirements.Single(r => r.Name == "glitch").JudgedBy);
        Assert.Equal("met", requirements.Single(r => r.Name == "gain").Verdict);
        Within5Percent(-2.0, Figure(report, "gain", "nominal gain"));
    }

    [Fact]
    public void A_netlist_non_inverting_gain_of_5_sits_exactly_at_the_parts_minimum_stable_gain()
    {
        // Noise gain 1 + rf/rg = 1 + 4k/1k = 5 (textbook non-inverting amplifier) = the part's minimum: no finding.
        var report = RuleFixture.Verify("reference/b/netlist-non-inverting-gain-5.yaml");
        Within5Percent(5.0, Figure(report, "gain", "noise gain u1"));
    }

    [Fact]
    public void A_netlist_summer_counts_every_input_resistor_in_its_noise_gain()
    {
        // Summing amplifier: noise gain 1 + rf/(r1 || r2) = 1 + 10k/5k = 3 (textbook), below the part's 5: DR503.
        var report = RuleFixture.Verify("reference/b/netlist-summing-gain-1.yaml");
        Within5Percent(3.0, Figure(report, "sum", "noise gain u1"));
    }

    [Fact]
    public void A_netlist_resistor_with_a_family_is_judged_against_its_derated_rating()
    {
        // Joule's law: (5 V)² / 100 Ω = 250 mW, above 125 mW × 50 % = 62.5 mW: DR601, and no DR605 since it is rated.
        var report = RuleFixture.Verify("reference/b/netlist-rated-resistor-overloaded.yaml");
        Within5Percent(0.25, Figure(report, "buffer", "power in rd"));
    }

    [Fact]
    public void A_half_wave_average_settles_to_peak_over_pi()
    {
        // Mean of a half-wave rectified sine = Vp/π (handbook table of waveform averages): 3 V / π = 0.955 V.
        var report = RuleFixture.Verify("reference/b/half-wave-average.yaml");
        Within5Percent(3.0 / Math.PI, Figure(report, "average", "ideal averaged level"));
        Within5Percent(3.0 / Math.PI, Figure(report, "average", "averaged level"));
    }
}
