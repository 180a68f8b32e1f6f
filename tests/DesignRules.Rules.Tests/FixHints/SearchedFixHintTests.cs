using System.Globalization;
using DesignRules.Quantities;

namespace DesignRules.Rules.Tests.FixHints;

/// <summary>
/// The fix hints searched with the engine (largest amplitude, highest band top, loosest resistor tolerance, nearest E-series
/// value of a gain-setting resistor) are applied the way a person would — the source's amplitude or frequency rewritten, a
/// resistor family with the hinted tolerance swapped in, the YAML value replaced — and the finding disappears; a value just
/// beyond the hint still fails. Where a textbook relation bounds the hint, the test checks it against that relation too.
/// </summary>
public sealed class SearchedFixHintTests : IDisposable
{
    // "Just beyond": 2 % past the hint, well outside the search's 0.5 % bracket and the three-digit rounding down.
    private const double JustBeyond = 1.02;

    private readonly string folder = Directory.CreateTempSubdirectory("designrules-searched-hints-").FullName;

    public SearchedFixHintTests()
    {
        // The tolerance fixtures name their parts library relative to themselves: the rewritten copies need it beside them.
        var parts = Path.Combine(Path.GetDirectoryName(RuleFixture.Path("tolerance/inverting-over-budget.yaml"))!, "parts");
        Directory.CreateDirectory(Path.Combine(folder, "parts"));
        foreach (var file in Directory.GetFiles(parts))
        {
            File.Copy(file, Path.Combine(folder, "parts", Path.GetFileName(file)));
        }
    }

    public void Dispose() => Directory.Delete(folder, recursive: true);

    [Fact]
    public void A_clipping_stage_driven_at_the_hinted_amplitude_stays_inside_its_swing_and_one_just_louder_clips()
    {
        const string fixture = "saturation/clipping-inverting-stage.yaml";
        var fix = HintOf(fixture, "DR201", FixKind.MaximumAmplitude);

        // Textbook inverting gain rf/rin = 100k/10k = 10; the output may reach 15 V − 1.5 V headroom (the part class) less
        // the 100 mV margin (the catalogue default, common practice) = 13.4 V, so the source at most 1.34 V; the offset
        // voltage's share (8 mV × noise gain 11 = 88 mV) brings it to about 1.33 V.
        Assert.InRange(fix.Value, 1.25, 1.34);
        var text = File.ReadAllText(RuleFixture.Path(fixture));
        Assert.Empty(Findings(Write(text.Replace("amplitude: 2 V", $"amplitude: {Volts(fix.Value)}", StringComparison.Ordinal)), "DR201"));
        Assert.NotEmpty(Findings(Write(text.Replace("amplitude: 2 V", $"amplitude: {Volts(fix.Value * JustBeyond)}", StringComparison.Ordinal)), "DR201"));
    }

    [Fact]
    public void A_gain_stage_at_the_hinted_amplitude_or_band_top_is_inside_its_full_power_bandwidth_and_just_beyond_is_not()
    {
        const string fixture = "slew/gain-stage-beyond-full-power-bandwidth.yaml";
        var amplitude = HintOf(fixture, "DR101", FixKind.MaximumAmplitude);
        var bandTop = HintOf(fixture, "DR101", FixKind.MaximumBandTop);

        // Textbook full-power bandwidth SR/(2π·Vp) ≥ 1.2 × 20 kHz (the rule's min-ratio, common practice) with SR = 0.6 V/µs:
        // Vp ≤ 3.98 V at the output, over the inverting gain rf/rin = 5 a source of at most 0.796 V (the engine's gain is a
        // little under 5); and at Vp = 5 V the band top at most SR/(2π·5 V)/1.2 = 15.9 kHz.
        Assert.InRange(amplitude.Value, 0.79, 0.80);
        Assert.InRange(bandTop.Value, 15.7e3, 16.05e3);
        var text = File.ReadAllText(RuleFixture.Path(fixture));
        Assert.Empty(Findings(Write(text.Replace("amplitude: 1 V", $"amplitude: {Volts(amplitude.Value)}", StringComparison.Ordinal)), "DR101"));
        Assert.NotEmpty(Findings(Write(text.Replace("amplitude: 1 V", $"amplitude: {Volts(amplitude.Value * JustBeyond)}", StringComparison.Ordinal)), "DR101"));
        Assert.Empty(Findings(Write(text.Replace("frequency: 20 kHz", $"frequency: {Hertz(bandTop.Value)}", StringComparison.Ordinal)), "DR101"));
        Assert.NotEmpty(Findings(Write(text.Replace("frequency: 20 kHz", $"frequency: {Hertz(bandTop.Value * JustBeyond)}", StringComparison.Ordinal)), "DR101"));
    }

    [Fact]
    public void A_rectifier_at_the_hinted_amplitude_meets_its_slew_demand_and_says_when_no_band_top_would()
    {
        // DR101 fires here too and would take most of the design's budget of re-runs for hints first: off, so DR102 has it.
        const string fixture = "slew/slow-follower-rectifier-20khz.yaml";
        var rules = Path.Combine(folder, "design-rules.yaml");
        File.WriteAllText(rules, "rules:\n  DR101: off\n");
        var text = File.ReadAllText(RuleFixture.Path(fixture));
        var finding = Findings(Write(text), "DR102", rules).Single();
        Assert.EndsWith("Fix: " + finding.Fix!.Said, finding.Message, StringComparison.Ordinal);
        var amplitude = finding.Fix.All.SingleOrDefault(h => h.Kind == FixKind.MaximumAmplitude);
        var bandTop = finding.Fix.All.SingleOrDefault(h => h.Kind == FixKind.MaximumBandTop);
        Assert.True(amplitude is not null && bandTop is not null, finding.Message);

        Assert.Empty(Findings(Write(text.Replace("amplitude: 2 V", $"amplitude: {Volts(amplitude.Value)}", StringComparison.Ordinal)), "DR102", rules));
        Assert.NotEmpty(Findings(Write(text.Replace("amplitude: 2 V", $"amplitude: {Volts(amplitude.Value * JustBeyond)}", StringComparison.Ordinal)), "DR102", rules));
        // The stage's glitch requirement fixes the time allowed whatever the frequency, so no band top helps: the hint says so.
        Assert.Equal(0, bandTop.Value);
        Assert.StartsWith("no lower band top clears it", bandTop.Text, StringComparison.Ordinal);
    }

    [Fact]
    public void Resistors_of_the_hinted_tolerance_meet_the_accuracy_and_ones_just_looser_do_not()
    {
        const string fixture = "tolerance/inverting-over-budget.yaml";
        var fix = HintOf(fixture, "DR401", FixKind.MaximumResistorTolerance);

        // Textbook worst case of an inverting gain rf/rin: the ratio moves by (1+t)/(1−t) − 1 = 2t/(1−t); the offset voltage
        // takes 8 mV × noise gain 3 over the 2 V full scale = 1.2 % of the 2 % accuracy, leaving 0.8 %: t ≤ 0.398 %.
        Assert.InRange(fix.Value, 0.0039, 0.003985);
        Assert.Contains("0.25 % (IEC 60062 letter C)", fix.Text, StringComparison.Ordinal);
        Assert.Empty(Findings(SwapTolerance(fixture, "thick-film-5pct", fix.Value), "DR401"));
        Assert.NotEmpty(Findings(SwapTolerance(fixture, "thick-film-5pct", fix.Value * JustBeyond), "DR401"));
    }

    [Fact]
    public void An_absolute_value_stage_with_resistors_of_the_hinted_tolerance_is_symmetric_and_one_just_looser_is_not()
    {
        // The symmetric fixture with 5 % resistors: its half-cycles then differ by more than the 5 % it requires.
        const string fixture = "tolerance/absolute-value-symmetric.yaml";
        var loose = Write(Fixture(fixture).Replace("resistors: thin-film-0p1pct", "resistors: thick-film-5pct", StringComparison.Ordinal));
        var finding = Findings(loose, "DR404").Single();
        var fix = finding.Fix!;
        Assert.Equal(FixKind.MaximumResistorTolerance, fix.Kind);
        Assert.InRange(fix.Value, 1e-4, 0.05);

        Assert.Empty(Findings(SwapTolerance(fixture, "thin-film-0p1pct", fix.Value), "DR404"));
        Assert.NotEmpty(Findings(SwapTolerance(fixture, "thin-film-0p1pct", fix.Value * JustBeyond), "DR404"));
    }

    [Fact]
    public void A_difference_stage_with_resistors_of_the_hinted_tolerance_rejects_its_common_mode_and_one_just_looser_does_not()
    {
        const string fixture = "tolerance/difference-mismatched.yaml";
        var fix = HintOf(fixture, "DR403", FixKind.MaximumResistorTolerance);

        // Sedra & Smith, Microelectronic Circuits: worst-case CMRR ≈ (1 + G)/(4·t), so with G = 1 the 5 V common-mode level
        // moves the output by 5 V · 4t/2 = 10·t; the 5 % accuracy of the 1 V full scale allows 50 mV: t ≤ 0.5 % (first order).
        Assert.InRange(fix.Value, 0.0045, 0.005);
        Assert.Empty(Findings(SwapTolerance(fixture, "thin-film-1pct", fix.Value), "DR403"));
        Assert.NotEmpty(Findings(SwapTolerance(fixture, "thin-film-1pct", fix.Value * JustBeyond), "DR403"));
    }

    [Fact]
    public void A_stage_no_resistor_tolerance_can_fix_says_so()
    {
        // r4 = 5.1k where the absolute-value circuit needs r2/2 = 5k: the half-cycles differ by 2 % with exact resistors, so
        // no tolerance meets the 1 % requirement, and the hint must say that rather than name a class.
        var fix = HintOf("tolerance/absolute-value-lopsided.yaml", "DR404", FixKind.MaximumResistorTolerance);

        Assert.Equal(0, fix.Value);
        Assert.True(fix.BeyondPartClasses);
        Assert.StartsWith("no resistor tolerance meets it", fix.Text, StringComparison.Ordinal);
    }

    [Fact]
    public void Writing_the_hinted_E24_feedback_resistor_keeps_the_output_inside_its_swing_and_the_next_value_up_does_not()
    {
        var text = Fixture("saturation/clipping-inverting-stage.yaml").Replace("design:\n", "e-series: E24\ndesign:\n", StringComparison.Ordinal);
        var file = Write(text);
        var finding = Findings(file, "DR201").Single();
        var fix = finding.Fix!;
        Assert.Equal(FixKind.PreferredValue, fix.Kind);
        Assert.Equal("amp.rf", fix.Subject);

        // Textbook: gain rf/rin ≤ 13.4 V / 2 V (as in the amplitude test) puts rf at most 67 kΩ, a little less for the
        // offset; the E24 values around it (IEC 60063) are 62k and 68k, so the nearest that passes is 62k.
        Assert.True(ESeries.E24.Contains(fix.Value), $"{fix.Value} is not an E24 value");
        Assert.Equal(62e3, fix.Value, 1e-6);
        Assert.Equal("62k", fix.Replacement);
        Assert.Empty(Findings(Write(Replace(text, fix, fix.Replacement!)), "DR201"));
        Assert.NotEmpty(Findings(Write(Replace(text, fix, "68k")), "DR201"));
    }

    [Fact]
    public void Writing_the_hinted_E24_feedback_resistor_brings_an_off_gain_stage_within_its_accuracy_and_the_next_value_up_does_not()
    {
        // A gain of −2 required to 2 % from rf = 24k over rin = 10k (−2.4, 20 % off) with 0.1 % resistors: no resistor
        // tolerance can fix that, so the value of the resistor comes first.
        var text = Fixture("tolerance/inverting-over-budget.yaml")
            .Replace("design:\n", "e-series: E24\ndesign:\n", StringComparison.Ordinal)
            .Replace("resistors: thick-film-5pct", "resistors: thin-film-0p1pct", StringComparison.Ordinal)
            .Replace("rf: 20k", "rf: 24k", StringComparison.Ordinal);
        var finding = Findings(Write(text), "DR401").Single();
        var fix = finding.Fix!;
        Assert.Equal(FixKind.PreferredValue, fix.Kind);
        Assert.Equal("amp.rf", fix.Subject);
        Assert.Contains(fix.Alternatives, h => h.Kind == FixKind.MaximumResistorTolerance && h.Value == 0);

        // Textbook inverting gain −rf/rin = −2 with rin = 10k: rf = 20k, an E24 value (IEC 60063); the next one up is 22k.
        Assert.Equal(20e3, fix.Value, 1e-6);
        Assert.Empty(Findings(Write(Replace(text, fix, fix.Replacement!)), "DR401"));
        Assert.NotEmpty(Findings(Write(Replace(text, fix, "22k")), "DR401"));
    }

    private static FixHint HintOf(string fixture, string rule, FixKind kind)
    {
        var report = RuleFixture.Verify(fixture);
        var finding = report.Findings.First(f => f.RuleId == rule);
        var fix = finding.Fix ?? throw new Xunit.Sdk.XunitException($"{rule} in {fixture} has no fix hint: {finding.Message}");
        Assert.EndsWith("Fix: " + fix.Said, finding.Message, StringComparison.Ordinal);
        return fix.All.FirstOrDefault(h => h.Kind == kind) ?? throw new Xunit.Sdk.XunitException($"{rule} in {fixture} has no {kind} hint: {finding.Message}");
    }

    private static List<Finding> Findings(string file, string rule, string? ruleSet = null)
    {
        var report = DesignCheck.Run([file], new CheckOptions(ruleSet, new DateOnly(2026, 12, 1)));
        Assert.DoesNotContain(report.Findings, f => f.RuleId.StartsWith("DR9", StringComparison.Ordinal));
        return report.Findings.Where(f => f.RuleId == rule).ToList();
    }

    private static string Fixture(string fixture) => File.ReadAllText(RuleFixture.Path(fixture));

    private static string Volts(double v) => (v * 1e3).ToString("R", CultureInfo.InvariantCulture) + " mV";

    private static string Hertz(double f) => f.ToString("R", CultureInfo.InvariantCulture) + " Hz";

    /// <summary>The text with the value at the hint's span replaced (SARIF region semantics: end column exclusive).</summary>
    private static string Replace(string text, FixHint fix, string replacement)
    {
        var span = fix.ValueSpan!;
        var lines = text.Split('\n');
        var line = lines[span.Line - 1];
        lines[span.Line - 1] = line[..(span.Column - 1)] + replacement + line[(span.EndColumn - 1)..];
        return string.Join('\n', lines);
    }

    /// <summary>
    /// The fixture with its stage's resistor family swapped for the built-in one with only its tolerance changed (as a
    /// person would swap in a tighter class).
    /// </summary>
    private string SwapTolerance(string fixture, string familyId, double tolerance)
    {
        var family = BuiltInResistors(familyId, (tolerance * 100).ToString("R", CultureInfo.InvariantCulture) + "%");
        File.WriteAllText(Path.Combine(folder, "hinted-parts.yaml"), $"library:\n  id: hinted-parts\n  title: The built-in family with the hinted tolerance\nresistors:\n{family}");
        var text = Fixture(fixture);
        text = text.Contains("libraries: [", StringComparison.Ordinal)
            ? text.Replace("libraries: [", "libraries: [hinted-parts.yaml, ", StringComparison.Ordinal)
            : "libraries: [hinted-parts.yaml]\n" + text;
        text = text.Replace("resistors: thick-film-5pct", "resistors: hinted-resistors", StringComparison.Ordinal)
            .Replace("resistors: thin-film-0p1pct", "resistors: hinted-resistors", StringComparison.Ordinal)
            .Replace("resistors: thin-film-1pct", "resistors: hinted-resistors", StringComparison.Ordinal);
        return Write(text);
    }

    private string Write(string text)
    {
        var file = Path.Combine(folder, $"design-{Guid.NewGuid():N}.yaml");
        File.WriteAllText(file, text);
        return file;
    }

    /// <summary>One resistor family of the built-in parts library, renamed, with its tolerance replaced.</summary>
    private static string BuiltInResistors(string id, string tolerance)
    {
        var lines = File.ReadAllLines(Path.Combine(RuleFixture.RepositoryRoot(), "src", "DesignRules.Core", "Library", "builtin-parts.yaml"));
        int start = Array.FindIndex(lines, l => l.Trim() == $"- id: {id}");
        Assert.True(start >= 0, $"no built-in {id}");
        var entry = new List<string> { lines[start].Replace($"id: {id}", "id: hinted-resistors", StringComparison.Ordinal) };
        for (int i = start + 1; i < lines.Length && lines[i].StartsWith("    ", StringComparison.Ordinal); i++)
        {
            entry.Add(lines[i].TrimStart().StartsWith("tolerance:", StringComparison.Ordinal) ? "    tolerance: " + tolerance : lines[i]);
        }

        return string.Join('\n', entry) + "\n";
    }
}
