using DesignRules.Diagnostics;
using DesignRules.Elaboration;
using DesignRules.Model;
using DesignRules.Quantities;

namespace DesignRules.Rules.Evaluation;

/// <summary>
/// The fix hints whose relation is not closed form, searched with the engine: the rule is re-run on changed copies of the
/// design (<see cref="HintProbe"/>) along one value by a bounded bisection (<see cref="BoundedSearch"/>, 0.5 % relative
/// tolerance, at most <see cref="MaximumRuns"/> re-runs), and the value a person would write (three digits, or a member of
/// the declared E-series) is confirmed by one more re-run. A re-run that cannot judge (an analysis failed) gives no hint;
/// a search that finds no passing value says so. Inside a re-run (<see cref="DesignEvaluation.ConfirmsHint"/>) nothing is
/// searched, so that searches never nest.
/// </summary>
internal static class SearchedFixHints
{
    /// <summary>The most re-runs one search takes, confirmation aside.</summary>
    public const int MaximumRuns = 12;

    /// <summary>The relative width of the bracket a bisection stops at.</summary>
    public const double Tolerance = 0.005;

    /// <summary>How far below the design's amplitude or band top a search looks (a factor of 64: six halvings).</summary>
    private const double Reach = 64;

    /// <summary>
    /// Resistor tolerance classes of IEC 60062 (the letter codes marked on parts, from memory): the hint names the loosest
    /// class within the searched tolerance, since those are the classes sold.
    /// </summary>
    private static readonly (double Tolerance, char Letter)[] ToleranceClasses =
    [
        (0.20, 'M'), (0.10, 'K'), (0.05, 'J'), (0.02, 'G'), (0.01, 'F'), (0.005, 'D'), (0.0025, 'C'), (0.001, 'B'),
        (0.0005, 'W'), (0.0002, 'P'), (0.0001, 'L'),
    ];

    /// <summary>
    /// The largest source amplitude at which the finding of <paramref name="rule"/> at <paramref name="span"/> in stage
    /// <paramref name="stageId"/> is gone, the design otherwise as it stands; <paramref name="guessScale"/> is a closed-form
    /// estimate of it as a fraction of the present amplitude, where the rule has one.
    /// </summary>
    public static FixHint? MaximumAmplitude(DesignEvaluation evaluation, Rule rule, string stageId, SourceSpan span, double? guessScale)
    {
        var design = evaluation.Design;
        if (!Searches(evaluation, rule, stageId) || DesignEdits.Amplitude(design) is not { } present)
        {
            return null;
        }

        var probe = new HintProbe(evaluation, rule, stageId, span);
        var outcome = BoundedSearch.Boundary(x => probe.Passes(DesignEdits.WithAmplitude(design, x)), present, present / Reach,
            guessScale * present, Tolerance, MaximumRuns);
        if (!outcome.Judged)
        {
            return null;
        }

        if (outcome.Passing is not { } passing)
        {
            return new FixHint(FixKind.MaximumAmplitude, "source", 0, "V",
                $"no smaller source amplitude clears it (still there at {Say.Volts(outcome.Failing)}, now {Say.Volts(present)}): the cause does not shrink with the signal.");
        }

        double value = FixHints.RoundDown(passing);
        bool confirmed = value == passing || probe.Passes(DesignEdits.WithAmplitude(design, value)) == true;
        return new FixHint(FixKind.MaximumAmplitude, "source", value, "V",
            $"as it stands, the design handles a source amplitude up to {Say.Volts(value)} (now {Say.Volts(present)})" + Confirmation(confirmed, "an upper bound"));
    }

    /// <summary>
    /// The highest band top (or single frequency) at which the finding is gone, the design otherwise as it stands; never
    /// below the band's bottom. <paramref name="guessScale"/> as for <see cref="MaximumAmplitude"/>.
    /// </summary>
    public static FixHint? MaximumBandTop(DesignEvaluation evaluation, Rule rule, string stageId, SourceSpan span, double? guessScale)
    {
        var design = evaluation.Design;
        if (!Searches(evaluation, rule, stageId) || DesignEdits.BandTop(design) is not { } present)
        {
            return null;
        }

        // A band keeps a width: its top stays 1 % above its bottom.
        double bound = DesignEdits.BandBottom(design) is { } bottom ? bottom * 1.01 : present / Reach;
        if (bound >= present)
        {
            return null;
        }

        var probe = new HintProbe(evaluation, rule, stageId, span);
        var outcome = BoundedSearch.Boundary(f => probe.Passes(DesignEdits.WithBandTop(design, f)), present, bound, guessScale * present, Tolerance, MaximumRuns);
        if (!outcome.Judged)
        {
            return null;
        }

        if (outcome.Passing is not { } passing)
        {
            return new FixHint(FixKind.MaximumBandTop, "source", 0, "Hz",
                $"no lower band top clears it (still there at {Say.Hertz(outcome.Failing)}, now {Say.Hertz(present)}).");
        }

        double value = FixHints.RoundDown(passing);
        bool confirmed = value == passing || probe.Passes(DesignEdits.WithBandTop(design, value)) == true;
        return new FixHint(FixKind.MaximumBandTop, "source", value, "Hz",
            $"as it stands, the design handles signals up to {Say.Hertz(value)} (now {Say.Hertz(present)})" + Confirmation(confirmed, "an upper bound"));
    }

    /// <summary>
    /// The loosest tolerance the resistors of stage <paramref name="stageId"/> may have for the finding of the tolerance rule
    /// <paramref name="rule"/> to go (all of the stage's resistors with a family set to it, their other figures kept). The
    /// worst case is close to linear in the tolerance, so the guess is the straight line through the present error and the
    /// error with exact resistors (both read from the rule's figure <paramref name="figure"/>); the bisection confirms it.
    /// With exact resistors still failing, the hint says that no resistor tolerance fixes it.
    /// </summary>
    public static FixHint? MaximumResistorTolerance(DesignEvaluation evaluation, Rule rule, string stageId, FigureKind figure)
    {
        var design = evaluation.Design;
        double present = DesignEdits.ResistorTolerance(design, stageId);
        if (!Searches(evaluation, rule, stageId) || present <= 0)
        {
            return null;
        }

        // The worst case is a DC analysis: its re-runs cost no settled transient.
        var probe = new HintProbe(evaluation, rule, stageId, null, transient: false);
        switch (probe.Passes(DesignEdits.WithResistorTolerance(design, stageId, 0)))
        {
            case null:
                return null;
            case false:
                var exact = Judged(probe.Last!, stageId, figure);
                return new FixHint(FixKind.MaximumResistorTolerance, stageId, 0, "%",
                    $"no resistor tolerance meets it: with exact resistors stage `{stageId}` is still off by {(exact is { } e ? Say.Percent(e.Value) : "more than allowed")}" +
                    $"{(exact is { Limit: { } l } ? $" against {Say.Percent(l)}" : string.Empty)}; the rest comes from the nominal values, offsets, bias currents or diodes.")
                { BeyondPartClasses = true };
        }

        double? guess = null;
        if (Judged(probe.Last!, stageId, figure) is { Limit: { } limit } atZero && Judged(evaluation, stageId, figure) is { } now && now.Value > atZero.Value)
        {
            guess = present * (limit - atZero.Value) / (now.Value - atZero.Value);
        }

        var outcome = BoundedSearch.Boundary(t => probe.Passes(DesignEdits.WithResistorTolerance(design, stageId, t)), present, present / 1000, guess, Tolerance, MaximumRuns);
        if (!outcome.Judged || outcome.Passing is not { } passing)
        {
            return null;
        }

        double value = FixHints.RoundDown(passing);
        bool confirmed = value == passing || probe.Passes(DesignEdits.WithResistorTolerance(design, stageId, value)) == true;
        var text = $"the resistors of stage `{stageId}` need a tolerance of at most {Say.Percent(value)} (now {Say.Percent(present)})";
        var sold = ToleranceClasses.FirstOrDefault(c => c.Tolerance <= value * (1 + 1e-9));
        if (sold.Letter != default)
        {
            text += $"; the loosest class sold within it is {Say.Percent(sold.Tolerance)} (IEC 60062 letter {sold.Letter})";
        }

        var families = design.Libraries.SelectMany(l => l.Resistors).DistinctBy(r => r.Id.Value, StringComparer.Ordinal).ToList();
        var fitting = families.Where(r => Math.Abs(r.Tolerance.Si()) <= value * (1 + 1e-9))
            .OrderByDescending(r => Math.Abs(r.Tolerance.Si())).ThenBy(r => r.Id.Value, StringComparer.Ordinal).FirstOrDefault();
        bool beyond = fitting is null;
        if (fitting is not null)
        {
            text += $", e.g. `{fitting.Id.Value}` in the visible parts libraries";
        }
        else
        {
            var tightest = families.OrderBy(r => Math.Abs(r.Tolerance.Si())).ThenBy(r => r.Id.Value, StringComparer.Ordinal).FirstOrDefault();
            text += tightest is null
                ? "; no resistor family is in the visible parts libraries"
                : $"; no resistor family in the visible parts libraries is that tight (the tightest is `{tightest.Id.Value}`, {Say.Percent(Math.Abs(tightest.Tolerance.Si()))})";
        }

        return new FixHint(FixKind.MaximumResistorTolerance, stageId, value, "%", text + Confirmation(confirmed, "a lower bound")) { BeyondPartClasses = beyond };
    }

    /// <summary>
    /// The value of the declared E-series (IEC 60063) nearest to the present one at which the finding is gone, for the
    /// resistor of the block stage that sets its gain most strongly (its ideal transfer's sensitivity, computed by
    /// elaborating the stage with the resistor 1 % up), moved the way that lowers the gain: a bisection with the engine
    /// finds the boundary, the value is rounded to the series on the passing side and re-checked (stepping one series value
    /// further at most twice). <paramref name="gainScale"/>, where known (the largest amplitude over the present one), guesses
    /// the boundary. A SARIF fix replaces the value in the design file.
    /// </summary>
    public static FixHint? GainSettingValue(DesignEvaluation evaluation, Rule rule, string stageId, SourceSpan? span, double? gainScale) =>
        GainSettingValue(evaluation, rule, stageId, span, gainScale, null, transient: true);

    /// <summary>
    /// As <see cref="GainSettingValue(DesignEvaluation, Rule, string, SourceSpan?, double?)"/>, for a stage whose nominal gain
    /// is off its required one: the resistor moves toward the value that gives the required gain exactly (its ideal
    /// gain times <paramref name="targetScale"/>, to first order in the resistor's sensitivity), the search's bound.
    /// </summary>
    public static FixHint? GainCorrectingValue(DesignEvaluation evaluation, Rule rule, string stageId, double targetScale) =>
        Math.Abs(Math.Log(targetScale)) > Tolerance && double.IsFinite(targetScale) && targetScale > 0
            ? GainSettingValue(evaluation, rule, stageId, null, null, targetScale, transient: false)
            : null;

    private static FixHint? GainSettingValue(DesignEvaluation evaluation, Rule rule, string stageId, SourceSpan? span, double? gainScale, double? targetScale, bool transient)
    {
        var design = evaluation.Design;
        if (!Searches(evaluation, rule, stageId) || design.Stages.FirstOrDefault(s => s.Id.Value == stageId) is not BlockStage)
        {
            return null;
        }

        if (GainSetter(design, stageId) is not { } setter)
        {
            return null;
        }

        var (resistor, sensitivity) = setter;
        double present = resistor.Value;
        // Lowering the gain: down for a resistor the gain rises with (rf), up for one it falls with (rin); raising it, the other way.
        bool down = (targetScale is not { } raise || raise < 1) == (sensitivity > 0);
        double bound = targetScale is { } exact ? present * Math.Exp(Math.Log(exact) / sensitivity) : down ? present / 16 : present * 16;
        double? guess = gainScale is { } k && k > 0 ? present * Math.Exp(Math.Log(k) / sensitivity) : null;
        var probe = new HintProbe(evaluation, rule, stageId, span, transient);
        var outcome = BoundedSearch.Boundary(r => probe.Passes(DesignEdits.WithValue(design, stageId, resistor.Name, r)), present, bound, guess, Tolerance, MaximumRuns);
        if (!outcome.Judged || outcome.Passing is not { } passing)
        {
            return null;
        }

        ESeries? series = design.ESeries is { } declared && ESeries.TryGet(declared.Value, out var s) ? s : null;
        double candidate = series is null ? (down ? FixHints.RoundDown(passing) : FixHints.RoundUp(passing)) : SeriesBeyond(series, passing, down);
        for (int i = 0; i < 3; i++)
        {
            if (candidate == passing || probe.Passes(DesignEdits.WithValue(design, stageId, resistor.Name, candidate)) == true)
            {
                var component = $"{stageId}.{resistor.Name}";
                var fix = PreferredValueFix.Of(component, candidate, Dimension.Resistance, resistor.ValueSpan);
                var where = series is null ? "to three digits (the design declares no E-series)" : $"the nearest {series.Name} value (IEC 60063)";
                return fix with
                {
                    Text = $"write `{fix.Replacement}` for `{component}` (now {Say.Ohms(present)}), {where} that clears it, found by bisection with the engine and re-checked.",
                };
            }

            if (series is null)
            {
                break;
            }

            candidate = SeriesBeyond(series, down ? candidate * (1 - 1e-6) : candidate * (1 + 1e-6), down);
        }

        return null;
    }

    /// <summary>The resistor of the stage whose value moves its ideal gain most (d ln|gain| / d ln R), and that sensitivity.</summary>
    private static (StageResistor Resistor, double Sensitivity)? GainSetter(Design design, string stageId)
    {
        double? Gain(Design d)
        {
            var chain = ChainElaborator.Elaborate(d);
            return chain.Succeeded && chain.Stage(stageId) is { } stage && Math.Abs(stage.Transfer.Gain) is var g && g > 0 && double.IsFinite(g) ? g : null;
        }

        if (Gain(design) is not { } nominal)
        {
            return null;
        }

        (StageResistor, double)? best = null;
        foreach (var r in StageParts.Resistors(design).Where(r => r.Stage.Id.Value == stageId).OrderBy(r => r.Name, StringComparer.Ordinal))
        {
            if (Gain(DesignEdits.WithValue(design, stageId, r.Name, r.Value * 1.01)) is not { } moved)
            {
                continue;
            }

            double sensitivity = Math.Log(moved / nominal) / Math.Log(1.01);
            if (Math.Abs(sensitivity) > 0.05 && (best is null || Math.Abs(sensitivity) > Math.Abs(best.Value.Item2) * (1 + 1e-6)))
            {
                best = (r, sensitivity);
            }
        }

        return best;
    }

    /// <summary>The first member of <paramref name="series"/> at or beyond <paramref name="value"/>: below it when <paramref name="down"/>, above otherwise.</summary>
    private static double SeriesBeyond(ESeries series, double value, bool down)
    {
        int decade = (int)Math.Floor(Math.Log10(value));
        // Nearest() gives each member exactly as the series writes it (integer hundredths scaled by a power of ten).
        var members = Enumerable.Range(decade - 1, 3)
            .SelectMany(d => series.Mantissas.Select(m => series.Nearest(m * Math.Pow(10, d))))
            .Order().ToList();
        return down
            ? members.Where(m => m <= value * (1 + 1e-9)).DefaultIfEmpty(members[0]).Max()
            : members.Where(m => m >= value * (1 - 1e-9)).DefaultIfEmpty(members[^1]).Min();
    }

    /// <summary>False inside a re-run (searches never nest) and where the rule is off for the stage (its finding is dropped).</summary>
    private static bool Searches(DesignEvaluation evaluation, Rule rule, string stageId) =>
        !evaluation.ConfirmsHint && evaluation.IsOn(rule.Id, stageId);

    private static Figure? Judged(DesignEvaluation evaluation, string stageId, FigureKind kind) =>
        evaluation.Figures.TryGetValue(stageId, out var figures) ? figures.FirstOrDefault(f => f.Key.Kind == kind) : null;

    private static string Confirmation(bool confirmed, string bound) =>
        confirmed ? "." : $"; a re-run at it did not confirm it, so take it as {bound}.";
}
