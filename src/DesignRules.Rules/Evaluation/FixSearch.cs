using DesignRules.Diagnostics;
using DesignRules.Model;
using DesignRules.Quantities;

namespace DesignRules.Rules.Evaluation;

/// <summary>
/// Re-runs one rule on changed copies of a design and says whether one finding is gone: the judge of every engine-searched
/// fix hint. A finding is the same when it has the rule's id, the stage and (where given) the YAML span it points at. A
/// re-run that ends in a problem of the tool (a DR9xx finding: an analysis failed) cannot judge and answers null, and so
/// does one the design's budget of re-runs (<see cref="DesignEvaluation.HintRunBudget"/>) no longer allows.
/// </summary>
internal sealed class HintProbe(DesignEvaluation evaluation, Rule rule, string? stageId, SourceSpan? span, bool transient = true)
{
    /// <summary>How many re-runs this probe made.</summary>
    public int Runs { get; private set; }

    /// <summary>The evaluation of the last re-run (for the figures it recorded), null before the first.</summary>
    public DesignEvaluation? Last { get; private set; }

    /// <summary>True when the finding is gone from <paramref name="design"/>, false when it is still there, null when the re-run cannot judge.</summary>
    public bool? Passes(Design design)
    {
        if (!evaluation.TakeHintRun(transient))
        {
            return null;
        }

        Runs++;
        var refit = evaluation.Refit(design);
        Last = refit;
        rule.Evaluate(refit);
        if (refit.Findings.Any(f => f.RuleId.StartsWith("DR9", StringComparison.Ordinal)))
        {
            return null;
        }

        return !refit.Findings.Any(f => f.RuleId == rule.Id.ToString() && f.StageId == stageId && (span is null || f.Span == span));
    }
}

/// <summary>The outcome of a bounded search along one value.</summary>
/// <param name="Passing">The passing value nearest the boundary, null when none was found before the search's bound.</param>
/// <param name="Failing">The failing value nearest the boundary.</param>
/// <param name="Converged">True when the two are within the search's tolerance of each other.</param>
/// <param name="Judged">False when a re-run could not judge (an analysis failed); the search then stops.</param>
internal sealed record SearchOutcome(double? Passing, double Failing, bool Converged, bool Judged);

/// <summary>
/// A bounded bisection along one positive value x (an amplitude, a band top, a tolerance, a resistor), in its logarithm,
/// between the design's value (where the finding fires) and a bound on the side where it may pass. A closed-form guess, where
/// a rule has one, is tried first, then the value just beyond it toward the failing side (so an exact guess costs two re-runs);
/// without a passing value the search steps toward the bound by factors of two; then it halves the bracket until the two
/// ends are within <c>tolerance</c> (relative) of each other. Never more than <c>maxRuns</c> re-runs.
/// </summary>
internal static class BoundedSearch
{
    public static SearchOutcome Boundary(Func<double, bool?> passes, double failing, double bound, double? guess, double tolerance, int maxRuns)
    {
        double step = Math.Log(1 + tolerance);
        double fail = Math.Log(failing);
        double end = Math.Log(bound);
        double direction = Math.Sign(end - fail);
        double? pass = null;
        int runs = 0;

        bool? Try(double ln)
        {
            runs++;
            return passes(Math.Exp(ln));
        }

        if (guess is { } g && g > 0 && double.IsFinite(g) && (Math.Log(g) - fail) * direction > 0 && (end - Math.Log(g)) * direction >= 0)
        {
            double lg = Math.Log(g);
            switch (Try(lg))
            {
                case null: return new SearchOutcome(null, failing, false, false);
                case true: pass = lg; break;
                default: fail = lg; break;
            }

            if (pass is { } p && Math.Abs(fail - p) > step && runs < maxRuns)
            {
                double q = p - (direction * step);
                switch (Try(q))
                {
                    case null: return new SearchOutcome(Math.Exp(p), Math.Exp(fail), false, false);
                    case true: pass = q; break;
                    default: fail = q; break;
                }
            }
        }

        while (pass is null && runs < maxRuns)
        {
            double next = fail + (direction * Math.Log(2));
            if ((end - next) * direction <= 0)
            {
                next = end;
            }

            switch (Try(next))
            {
                case null: return new SearchOutcome(null, Math.Exp(fail), false, false);
                case true: pass = next; break;
                default:
                    fail = next;
                    if (next == end)
                    {
                        return new SearchOutcome(null, Math.Exp(fail), false, true);
                    }

                    break;
            }
        }

        if (pass is null)
        {
            return new SearchOutcome(null, Math.Exp(fail), false, true);
        }

        double at = pass.Value;
        while (Math.Abs(fail - at) > step && runs < maxRuns)
        {
            double mid = (fail + at) / 2;
            switch (Try(mid))
            {
                case null: return new SearchOutcome(Math.Exp(at), Math.Exp(fail), false, false);
                case true: at = mid; break;
                default: fail = mid; break;
            }
        }

        return new SearchOutcome(Math.Exp(at), Math.Exp(fail), Math.Abs(fail - at) <= step, true);
    }
}

/// <summary>
/// Changed copies of a design, for the fix-hint searches: the source's amplitude or band top, one component value, the
/// tolerance of one stage's resistors. Everything else stays as written (spans too, so findings keep their identity).
/// </summary>
internal static class DesignEdits
{
    /// <summary>The source's amplitude (peak, V) when the waveform has a single one (sine, triangle, square); null otherwise.</summary>
    public static double? Amplitude(Design design) =>
        design.Source.Waveform is { Kind: not (WaveformKind.Dc or WaveformKind.Sum), Amplitude: { } a } && a.Si() > 0 ? a.Si() : null;

    /// <summary>The highest signal frequency: the band top, or the single frequency; null for a DC or summed source.</summary>
    public static double? BandTop(Design design) => design.Source.Waveform switch
    {
        { Kind: WaveformKind.Dc or WaveformKind.Sum } => null,
        { Band: { } band } => band.Value.High.Value,
        { Frequency: { } f } => f.Si(),
        _ => null,
    };

    /// <summary>The band bottom where the source has a band (a band top may not go below it); null for a single frequency.</summary>
    public static double? BandBottom(Design design) => design.Source.Waveform.Band?.Value.Low.Value;

    public static Design WithAmplitude(Design design, double amplitude)
    {
        var w = design.Source.Waveform;
        return design with
        {
            Source = design.Source with { Waveform = w with { Amplitude = new Located<Quantity>(new Quantity(amplitude, Dimension.Voltage), w.Amplitude!.Span) } },
        };
    }

    public static Design WithBandTop(Design design, double frequency)
    {
        var w = design.Source.Waveform;
        var hertz = new Quantity(frequency, Dimension.Frequency);
        var changed = w.Band is { } band
            ? w with { Band = band with { Value = band.Value with { High = hertz } } }
            : w with { Frequency = new Located<Quantity>(hertz, w.Frequency!.Span) };
        return design with { Source = design.Source with { Waveform = changed } };
    }

    /// <summary>The design with component <paramref name="name"/> of stage <paramref name="stageId"/> set to <paramref name="value"/> (SI).</summary>
    public static Design WithValue(Design design, string stageId, string name, double value) => design with
    {
        Stages = design.Stages.Select(stage => stage.Id.Value != stageId ? stage : stage switch
        {
            BlockStage block when block.Values.TryGetValue(name, out var v) => block with
            {
                Values = block.Values.ToDictionary(p => p.Key, p => p.Key == name ? p.Value with { Value = p.Value.Value with { Value = p.Value.Quantity with { Value = value } } } : p.Value, StringComparer.Ordinal),
            },
            NetlistStage netlist => netlist with
            {
                Elements = netlist.Elements.Select(e => e.Id.Value == name && e.Value is { } q ? e with { Value = q with { Value = q.Value with { Value = value } } } : e).ToList(),
            },
            _ => stage,
        }).ToList(),
    };

    /// <summary>The largest tolerance among the resistors of stage <paramref name="stageId"/> that have a family (0 when none has).</summary>
    public static double ResistorTolerance(Design design, string stageId) =>
        StageParts.Resistors(design).Where(r => r.Stage.Id.Value == stageId && r.Family is not null)
            .Select(r => Math.Abs(r.Family!.Tolerance.Si())).DefaultIfEmpty(0).Max();

    /// <summary>The design with every resistor family of stage <paramref name="stageId"/> at tolerance <paramref name="tolerance"/> (its other figures kept).</summary>
    public static Design WithResistorTolerance(Design design, string stageId, double tolerance)
    {
        ResistorFamily? Tighter(ResistorFamily? family) => family is null ? null : family with
        {
            Tolerance = family.Tolerance with { Value = family.Tolerance.Value with { Value = tolerance } },
        };

        return design with
        {
            Stages = design.Stages.Select(stage => stage.Id.Value != stageId ? stage : stage switch
            {
                BlockStage block => block with
                {
                    Values = block.Values.ToDictionary(p => p.Key, p => p.Value with { ResistorFamily = Tighter(p.Value.ResistorFamily) }, StringComparer.Ordinal),
                },
                NetlistStage netlist => netlist with
                {
                    Elements = netlist.Elements.Select(e => e with { ResistorFamily = Tighter(e.ResistorFamily) }).ToList(),
                },
                _ => stage,
            }).ToList(),
        };
    }
}
