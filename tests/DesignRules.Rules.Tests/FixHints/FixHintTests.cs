using System.Globalization;
using System.Text;
using DesignRules.Quantities;

namespace DesignRules.Rules.Tests.FixHints;

/// <summary>
/// Every fix-hint kind is applied the way a person would (a part class with the hinted figure swapped in, or the YAML
/// value rewritten with the replacement) and the finding disappears; a value just short of the hint still fails. The
/// check values are the tool's own relations run forward again, so each test holds the hint to the rule that judges it.
/// </summary>
public sealed class FixHintTests : IDisposable
{
    // "Just short": 2 % below the hint, well above the three-digit rounding of the hinted figure.
    private const double JustShort = 0.98;

    private readonly string folder = Directory.CreateTempSubdirectory("designrules-fixhints-").FullName;

    public void Dispose() => Directory.Delete(folder, recursive: true);

    [Fact]
    public void An_amplifier_with_the_hinted_slew_rate_meets_the_slew_demand_and_one_just_slower_does_not()
    {
        var fix = HintOf("slew/slow-follower-rectifier-20khz.yaml", "DR102", FixKind.MinimumSlewRate);

        Assert.Empty(Findings(SwapAmplifier("slew/slow-follower-rectifier-20khz.yaml", "bipolar-general-15v", SlewRate(fix.Value)), "DR102"));
        Assert.NotEmpty(Findings(SwapAmplifier("slew/slow-follower-rectifier-20khz.yaml", "bipolar-general-15v", SlewRate(fix.Value * JustShort)), "DR102"));
    }

    [Fact]
    public void An_amplifier_with_the_hinted_slew_rate_has_the_full_power_bandwidth_and_one_just_slower_does_not()
    {
        var fix = HintOf("slew/gain-stage-beyond-full-power-bandwidth.yaml", "DR101", FixKind.MinimumSlewRate);

        // Textbook full-power bandwidth SR = 2π·f·Vp with f = 1.2 × 20 kHz (the rule's min-ratio, common practice) and
        // Vp = 5 V: 0.754 V/µs, rounded up to the three digits shown.
        Assert.InRange(fix.Value, 2 * Math.PI * 1.2 * 20e3 * 5 * 0.99, 2 * Math.PI * 1.2 * 20e3 * 5 * 1.01);
        Assert.Empty(Findings(SwapAmplifier("slew/gain-stage-beyond-full-power-bandwidth.yaml", "bipolar-general-15v", SlewRate(fix.Value)), "DR101"));
        Assert.NotEmpty(Findings(SwapAmplifier("slew/gain-stage-beyond-full-power-bandwidth.yaml", "bipolar-general-15v", SlewRate(fix.Value * JustShort)), "DR101"));
    }

    [Fact]
    public void An_amplifier_with_the_hinted_output_current_drives_the_load_and_one_just_weaker_does_not()
    {
        var fix = HintOf("loading/output-current-heavy-load.yaml", "DR301", FixKind.MinimumOutputCurrent);

        Assert.Empty(Findings(SwapAmplifier("loading/output-current-heavy-load.yaml", "jfet-input-15v", OutputCurrent(fix.Value)), "DR301"));
        Assert.NotEmpty(Findings(SwapAmplifier("loading/output-current-heavy-load.yaml", "jfet-input-15v", OutputCurrent(fix.Value * JustShort)), "DR301"));
    }

    [Fact]
    public void A_resistor_family_with_the_hinted_power_rating_passes_and_one_just_below_does_not()
    {
        var fix = HintOf("stress/resistor-power-dc.yaml", "DR601", FixKind.MinimumPowerRating);

        // Joule's law: 10 V across 1k is 100 mW; over the 50 % derating (the catalogue default) a 200 mW rating.
        Assert.InRange(fix.Value, 0.2 * 0.999, 0.2 * 1.01);
        Assert.Empty(Findings(SwapResistors("stress/resistor-power-dc.yaml", "thin-film-1pct", fix.Value), "DR601"));
        Assert.NotEmpty(Findings(SwapResistors("stress/resistor-power-dc.yaml", "thin-film-1pct", fix.Value * JustShort), "DR601"));
    }

    [Theory]
    [InlineData("hygiene/off-series-value.yaml", "DR701", "E24")]
    [InlineData("hygiene/capacitor-off-series.yaml", "DR710", "E12")]
    public void Writing_the_hinted_preferred_value_clears_the_finding_and_a_value_just_short_of_it_does_not(string fixture, string rule, string seriesName)
    {
        var fix = HintOf(fixture, rule, FixKind.PreferredValue);

        // The hint is a member of the declared series (IEC 60063), never a value outside it.
        Assert.True(ESeries.TryGet(seriesName, out var series));
        Assert.True(series.Contains(fix.Value), $"{fix.Value} is not an {seriesName} value");
        var text = File.ReadAllText(RuleFixture.Path(fixture));
        Assert.Empty(Findings(Write(Replace(text, fix, fix.Replacement!)), rule));
        var shortValue = Replace(text, fix, (fix.Value * JustShort / (fix.Unit == "F" ? 1e-9 : 1)).ToString("R", CultureInfo.InvariantCulture) + (fix.Unit == "F" ? "n" : string.Empty));
        Assert.NotEmpty(Findings(Write(shortValue), rule));
    }

    [Fact]
    public void A_hint_no_part_class_reaches_says_so()
    {
        // 10 V DC across 680 Ω dissipates 147 mW (Joule's law), 294 mW of rating at the 50 % derating: above every resistor
        // family of the built-in library (the largest is rated 250 mW), so the hint must say that none reaches it.
        var text = File.ReadAllText(RuleFixture.Path("stress/resistor-power-dc.yaml"))
            .Replace("rin: 1k", "rin: 680", StringComparison.Ordinal).Replace("rf: 1k", "rf: 680", StringComparison.Ordinal);
        var finding = Findings(Write(text), "DR601").First();

        Assert.InRange(finding.Fix!.Value, 100.0 / 680 / 0.5, 100.0 / 680 / 0.5 * 1.01);
        Assert.True(finding.Fix.BeyondPartClasses);
        Assert.Contains("no resistor family class in the visible parts libraries reaches it", finding.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void A_hint_a_part_class_reaches_names_the_least_such_class()
    {
        var fix = HintOf("slew/gain-stage-beyond-full-power-bandwidth.yaml", "DR101", FixKind.MinimumSlewRate);

        Assert.False(fix.BeyondPartClasses);
        Assert.Matches("e\\.g\\. `[a-z0-9-]+` in the visible parts libraries", fix.Text);
    }

    [Fact]
    public void A_hinted_amplifier_class_runs_on_the_design_supply_and_is_stable_at_its_noise_gain()
    {
        // The follower rectifier on ±15 V demands about 1.4 V/µs. By slew rate alone the least class reaching it is the
        // built-in 5 V CMOS class (7 V/µs), which DR604 would refuse on a 30 V span; the decompensated class (15 V/µs)
        // is not stable at the follower's noise gain of 1 (DR503). The least class that can take the amplifier's place is
        // the JFET-input 15 V class (12 V/µs), and swapping it in leaves neither finding.
        var fix = HintOf("slew/slow-follower-rectifier-20khz.yaml", "DR102", FixKind.MinimumSlewRate);

        Assert.Contains("`jfet-input-15v`", fix.Text, StringComparison.Ordinal);
        Assert.DoesNotContain("cmos-rail-to-rail-5v", fix.Text, StringComparison.Ordinal);
        var swapped = File.ReadAllText(RuleFixture.Path("slew/slow-follower-rectifier-20khz.yaml"))
            .Replace("amplifier: bipolar-general-15v", "amplifier: jfet-input-15v", StringComparison.Ordinal);
        var report = DesignCheck.Run([Write(swapped)], new CheckOptions(null, new DateOnly(2026, 12, 1)));
        Assert.DoesNotContain(report.Findings, f => f.RuleId is "DR102" or "DR503" or "DR604");
    }

    [Fact]
    public void A_hint_on_a_supply_no_class_fits_says_none_fits_rather_than_naming_one()
    {
        // On ±20 V (a 40 V span) every built-in class is beyond its allowed span (36 V at most), so no class can take the
        // amplifier's place and the hint must say so instead of naming one that DR604 would refuse.
        var text = File.ReadAllText(RuleFixture.Path("slew/slow-follower-rectifier-20khz.yaml"))
            .Replace("positive: 15 V", "positive: 20 V", StringComparison.Ordinal).Replace("negative: -15 V", "negative: -20 V", StringComparison.Ordinal);
        var report = DesignCheck.Run([Write(text)], new CheckOptions(null, new DateOnly(2026, 12, 1)));
        var fix = report.Findings.First(f => f.RuleId == "DR102").Fix!;

        Assert.True(fix.BeyondPartClasses);
        Assert.Contains("no amplifier class that runs on this supply at this noise gain is in the visible parts libraries", fix.Text, StringComparison.Ordinal);
    }

    private static FixHint HintOf(string fixture, string rule, FixKind kind)
    {
        var report = RuleFixture.Verify(fixture);
        var finding = report.Findings.First(f => f.RuleId == rule);
        var fix = finding.Fix ?? throw new Xunit.Sdk.XunitException($"{rule} in {fixture} has no fix hint: {finding.Message}");
        Assert.Equal(kind, fix.Kind);
        Assert.EndsWith("Fix: " + fix.Said, finding.Message, StringComparison.Ordinal);
        return fix;
    }

    private static List<Finding> Findings(string file, string rule)
    {
        var report = DesignCheck.Run([file], new CheckOptions(null, new DateOnly(2026, 12, 1)));
        Assert.DoesNotContain(report.Findings, f => f.RuleId.StartsWith("DR9", StringComparison.Ordinal));
        return report.Findings.Where(f => f.RuleId == rule).ToList();
    }

    /// <summary>The fixture with the value at the hint's span replaced (SARIF region semantics: end column exclusive).</summary>
    private static string Replace(string text, FixHint fix, string replacement)
    {
        var span = fix.ValueSpan!;
        Assert.Equal(span.Line, span.EndLine);
        var lines = text.Split('\n');
        var line = lines[span.Line - 1];
        lines[span.Line - 1] = line[..(span.Column - 1)] + replacement + line[(span.EndColumn - 1)..];
        return string.Join('\n', lines);
    }

    private static Func<string, string> SlewRate(double value) => part =>
        ReplaceKey(part, "slew-rate", (value / 1e6).ToString("R", CultureInfo.InvariantCulture) + " V/us");

    private static Func<string, string> OutputCurrent(double value) => part =>
        ReplaceKey(part, "output-current", (value * 1e3).ToString("R", CultureInfo.InvariantCulture) + " mA");

    private string SwapAmplifier(string fixture, string classId, Func<string, string> edit)
    {
        var part = edit(BuiltIn(classId)).Replace($"id: {classId}", "id: hinted-amplifier", StringComparison.Ordinal);
        File.WriteAllText(Path.Combine(folder, "hinted-parts.yaml"), $"library:\n  id: hinted-parts\n  title: The built-in class with the hinted figure\namplifiers:\n{part}");
        var text = "libraries: [hinted-parts.yaml]\n" + File.ReadAllText(RuleFixture.Path(fixture)).Replace($"amplifier: {classId}", "amplifier: hinted-amplifier", StringComparison.Ordinal);
        return Write(text);
    }

    private string SwapResistors(string fixture, string familyId, double rating)
    {
        var family = ReplaceKey(BuiltIn(familyId), "power", (rating * 1e3).ToString("R", CultureInfo.InvariantCulture) + " mW")
            .Replace($"id: {familyId}", "id: hinted-resistors", StringComparison.Ordinal);
        File.WriteAllText(Path.Combine(folder, "hinted-parts.yaml"), $"library:\n  id: hinted-parts\n  title: The built-in family with the hinted rating\nresistors:\n{family}");
        var text = "libraries: [hinted-parts.yaml]\n" + File.ReadAllText(RuleFixture.Path(fixture)).Replace($"resistors: {familyId}", "resistors: hinted-resistors", StringComparison.Ordinal);
        return Write(text);
    }

    private string Write(string text)
    {
        var file = Path.Combine(folder, $"design-{Guid.NewGuid():N}.yaml");
        File.WriteAllText(file, text);
        return file;
    }

    /// <summary>One entry of the built-in parts library, as written there (so the swapped class differs in one figure only).</summary>
    private static string BuiltIn(string id)
    {
        var lines = File.ReadAllLines(Path.Combine(RuleFixture.RepositoryRoot(), "src", "DesignRules.Core", "Library", "builtin-parts.yaml"));
        int start = Array.FindIndex(lines, l => l.Trim() == $"- id: {id}");
        Assert.True(start >= 0, $"no built-in {id}");
        var entry = new StringBuilder(lines[start]).Append('\n');
        for (int i = start + 1; i < lines.Length && lines[i].StartsWith("    ", StringComparison.Ordinal); i++)
        {
            entry.Append(lines[i]).Append('\n');
        }

        return entry.ToString();
    }

    private static string ReplaceKey(string entry, string key, string value)
    {
        var lines = entry.Split('\n');
        int i = Array.FindIndex(lines, l => l.TrimStart().StartsWith(key + ":", StringComparison.Ordinal));
        Assert.True(i >= 0, $"no {key} in\n{entry}");
        lines[i] = lines[i][..(lines[i].IndexOf(key, StringComparison.Ordinal) + key.Length)] + ": " + value;
        return string.Join('\n', lines);
    }
}
