using DesignRules.Diagnostics;
using DesignRules.Model;

namespace DesignRules.Rules.Evaluation;

/// <summary>
/// Builds the fix hints of the rules whose relation is closed-form: the figure a replacement part needs is the demand
/// over the allowed fraction (slew rate, output current, power rating). The figure is rounded outward to the three
/// significant digits people read, so that a part with the figure exactly as shown passes; the hint names the least
/// part class in the design's visible parts libraries that reaches it, or says that none does.
/// </summary>
internal static class FixHints
{
    /// <summary>Rounds <paramref name="value"/> up to three significant digits (never below it).</summary>
    public static double RoundUp(double value) => Round(value, up: true);

    /// <summary>Rounds <paramref name="value"/> down to three significant digits (never above it).</summary>
    public static double RoundDown(double value) => Round(value, up: false);

    /// <summary>A replacement amplifier for <paramref name="amplifier"/> needs at least <paramref name="needed"/> V/s in both directions.</summary>
    public static FixHint MinimumSlewRate(DesignEvaluation evaluation, string amplifier, double needed)
    {
        double value = RoundUp(needed);
        var parts = Replacements(evaluation, amplifier).Select(a => (a.Id.Value, Figure: Math.Min(a.SlewRising.Value.Value, a.SlewFalling.Value.Value)));
        return PartFigure(FixKind.MinimumSlewRate, amplifier, value, "V/s", $"a replacement for `{amplifier}` needs a slew rate of at least {Say.Slew(value)}", parts, ReplacementClass);
    }

    /// <summary>A replacement amplifier for <paramref name="amplifier"/> needs at least <paramref name="needed"/> A rated output current.</summary>
    public static FixHint MinimumOutputCurrent(DesignEvaluation evaluation, string amplifier, double needed)
    {
        double value = RoundUp(needed);
        var parts = Replacements(evaluation, amplifier).Select(a => (a.Id.Value, Figure: a.OutputCurrent.Value.Value));
        return PartFigure(FixKind.MinimumOutputCurrent, amplifier, value, "A", $"a replacement for `{amplifier}` needs an output current rating of at least {Say.Amps(value)}", parts, ReplacementClass);
    }

    /// <summary>How the hint names the classes it chose from: only those that could take the amplifier's place.</summary>
    private const string ReplacementClass = "amplifier class that runs on this supply at this noise gain";

    /// <summary>
    /// The amplifier classes of the visible parts libraries that could take the place of <paramref name="amplifier"/>
    /// (<c>stage.slot</c>) without tripping another rule by being there: the design's supply span within the class's
    /// allowed span, its maximum derated as DR604 derates it, and the amplifier's noise gain at least the class's
    /// minimum stable gain (DR503). Naming a 5 V class for a ±15 V stage, or a decompensated class for a follower, would
    /// trade one finding for another. Where the noise gain is not known from the block's formula (a netlist), only
    /// unity-gain-stable classes are offered.
    /// </summary>
    private static IEnumerable<AmplifierPart> Replacements(DesignEvaluation evaluation, string amplifier)
    {
        var design = evaluation.Design;
        var place = StageParts.Amplifiers(design).FirstOrDefault(a => $"{a.Stage.Id.Value}.{a.Slot}" == amplifier);
        double span = design.Supplies.Positive.Value.Value - design.Supplies.Negative.Value.Value;
        double derating = evaluation.Threshold(RuleIds.SupplySpan, "derating", place?.Stage.Id.Value);
        double noiseGain = place is null ? 1 : NoiseGain.Of(place.Stage, place.Slot) ?? 1;
        return design.Libraries.SelectMany(l => l.Amplifiers).Where(a =>
            span >= a.SupplySpanMinimum.Value.Value
            && span <= a.SupplySpanMaximum.Value.Value * derating
            && noiseGain >= a.MinStableGain.Value.Value * (1 - 1e-9));
    }

    /// <summary>A resistor family for <paramref name="component"/> needs at least <paramref name="needed"/> W rated power.</summary>
    public static FixHint MinimumPowerRating(Design design, string component, double needed)
    {
        double value = RoundUp(needed);
        var parts = design.Libraries.SelectMany(l => l.Resistors).Select(r => (r.Id.Value, Figure: r.PowerRating.Value.Value));
        return PartFigure(FixKind.MinimumPowerRating, component, value, "W", $"`{component}` needs a resistor family rated at least {Say.Watts(value)}", parts, "resistor family class");
    }

    /// <summary>The most re-runs a hint's confirmation takes; each raises the candidate, so the search is bounded.</summary>
    private const int MaximumRefits = 8;

    /// <summary>
    /// Confirms a part-figure hint with the engine where the figure changes what the part is asked (a faster amplifier
    /// swings further; a stronger one is asked more current): the rule is re-run on the design with the amplifier's figure
    /// set to the candidate; while it still fires, the candidate rises to its new closed-form hint (at least 1 % more),
    /// at most <see cref="MaximumRefits"/> times. The hint that passes is returned; one that never did says so.
    /// </summary>
    public static FixHint ConfirmAmplifier(DesignEvaluation evaluation, Rule rule, FixHint hint,
        Func<AmplifierPart, double, AmplifierPart> apply)
    {
        if (evaluation.ConfirmsHint || !double.IsFinite(hint.Value))
        {
            return hint;
        }

        var candidate = hint;
        for (int i = 0; i < MaximumRefits; i++)
        {
            var refit = evaluation.Refit(WithAmplifier(evaluation.Design, hint.Subject, p => apply(p, candidate.Value)));
            rule.Evaluate(refit);
            if (refit.Findings.Any(f => f.RuleId.StartsWith("DR9", StringComparison.Ordinal)))
            {
                break;
            }

            if (refit.Findings.FirstOrDefault(f => f.RuleId == rule.Id.ToString() && f.Fix?.Subject == hint.Subject) is not { Fix: { } again })
            {
                return candidate;
            }

            double next = RoundUp(Math.Max(again.Value, candidate.Value * 1.01));
            candidate = Rebuild(candidate, next, evaluation);
        }

        return hint with { Text = hint.Text.TrimEnd('.') + "; a re-run with it did not confirm the fix, so the figure is a lower bound." };
    }

    private static FixHint Rebuild(FixHint hint, double value, DesignEvaluation evaluation) => hint.Kind switch
    {
        FixKind.MinimumSlewRate => MinimumSlewRate(evaluation, hint.Subject, value),
        FixKind.MinimumOutputCurrent => MinimumOutputCurrent(evaluation, hint.Subject, value),
        _ => hint,
    };

    /// <summary>The design with the amplifier of element id <paramref name="elementId"/> (<c>stage.slot</c>) changed.</summary>
    private static Design WithAmplifier(Design design, string elementId, Func<AmplifierPart, AmplifierPart> change) =>
        design with
        {
            Stages = design.Stages.Select(stage => stage switch
            {
                BlockStage block => block with
                {
                    Amplifiers = block.Amplifiers.ToDictionary(a => a.Key, a => $"{block.Id.Value}.{a.Key}" == elementId ? change(a.Value) : a.Value, StringComparer.Ordinal),
                },
                NetlistStage netlist => netlist with
                {
                    Elements = netlist.Elements.Select(e => e.Amplifier is { } part && $"{netlist.Id.Value}.{e.Id.Value}" == elementId ? e with { Amplifier = change(part) } : e).ToList(),
                },
                _ => stage,
            }).ToList(),
        };

    /// <summary>The part with slew rate <paramref name="value"/> in both directions.</summary>
    public static AmplifierPart WithSlewRate(AmplifierPart part, double value) => part with
    {
        SlewRising = new Located<Quantities.Quantity>(new Quantities.Quantity(value, Quantities.Dimension.SlewRate), part.SlewRising.Span),
        SlewFalling = new Located<Quantities.Quantity>(new Quantities.Quantity(value, Quantities.Dimension.SlewRate), part.SlewFalling.Span),
    };

    /// <summary>The part with rated output current <paramref name="value"/>.</summary>
    public static AmplifierPart WithOutputCurrent(AmplifierPart part, double value) => part with
    {
        OutputCurrent = new Located<Quantities.Quantity>(new Quantities.Quantity(value, Quantities.Dimension.Current), part.OutputCurrent.Span),
    };

    private static FixHint PartFigure(FixKind kind, string subject, double value, string unit, string text,
        IEnumerable<(string Id, double Figure)> parts, string what)
    {
        var known = parts.DistinctBy(p => p.Id, StringComparer.Ordinal).ToList();
        // The least class that reaches the figure (ties by id, so the choice is deterministic).
        var fitting = known.Where(p => p.Figure >= value).OrderBy(p => p.Figure).ThenBy(p => p.Id, StringComparer.Ordinal).FirstOrDefault();
        if (fitting.Id is not null)
        {
            return new FixHint(kind, subject, value, unit, $"{text} (e.g. `{fitting.Id}` in the visible parts libraries).");
        }

        var best = known.OrderByDescending(p => p.Figure).ThenBy(p => p.Id, StringComparer.Ordinal).FirstOrDefault();
        var beyond = best.Id is null
            ? $"; no {what} is in the visible parts libraries"
            : $"; no {what} in the visible parts libraries reaches it (the highest is `{best.Id}`)";
        return new FixHint(kind, subject, value, unit, text + beyond + ".") { BeyondPartClasses = true };
    }

    private static double Round(double value, bool up)
    {
        if (!double.IsFinite(value) || value <= 0)
        {
            return value;
        }

        double scale = Math.Pow(10, Math.Floor(Math.Log10(value)) - 2);
        // A hair of slack so that a value already on three digits stays where it is despite binary rounding.
        double digits = value / scale;
        return (up ? Math.Ceiling(digits * (1 - 1e-12)) : Math.Floor(digits * (1 + 1e-12))) * scale;
    }
}

/// <summary>The fix hint of a YAML value replaced by a preferred value of the declared E-series.</summary>
internal static class PreferredValueFix
{
    /// <summary>
    /// Replace the value at <paramref name="span"/> by <paramref name="value"/> (a member of the declared series): the
    /// replacement is written as the design files write values, engineering notation with the unit's symbol dropped for
    /// resistors (<c>4.7k</c>) and kept for capacitors (<c>10 nF</c>).
    /// </summary>
    public static FixHint Of(string component, double value, Quantities.Dimension dimension, DesignRules.Diagnostics.SourceSpan span)
    {
        var said = new Quantities.Quantity(value, dimension).Format();
        var text = dimension == Quantities.Dimension.Resistance ? said.Replace(" ", string.Empty, StringComparison.Ordinal).Replace("Ω", string.Empty, StringComparison.Ordinal) : said;
        return new FixHint(FixKind.PreferredValue, component, value, dimension == Quantities.Dimension.Resistance ? "Ω" : "F", $"write `{text}`.")
        {
            ValueSpan = span,
            Replacement = text,
        };
    }
}
