using DesignRules.Diagnostics;
using DesignRules.Model;
using DesignRules.Rules.Evaluation;
using DesignRules.Rules.Evaluation.LoadingBandwidthStress;

namespace DesignRules.Rules.Catalogue.Stress;

/// <summary>
/// DR601: the power each resistor of a stage dissipates, P = v²/R from its node voltages (Joule's law): averaged over the
/// whole periods of the transient's measurement window at each band end, or at the DC operating point for a DC source;
/// the largest over the nominal values and every resistor-tolerance corner of <see cref="ToleranceCorners"/> (each resistor
/// at its corner value) is compared with the family's rated power times the derating factor, naming the corner.
/// </summary>
internal sealed class ResistorPowerRule : Rule
{
    public override RuleId Id => RuleIds.ResistorPower;

    public override void Evaluate(DesignEvaluation evaluation)
    {
        var chain = evaluation.Analyses.Chain(Elaboration.BandEnd.Top);
        if (!chain.Succeeded || Powers(evaluation) is not { } power)
        {
            return;
        }

        foreach (var stage in chain.Stages)
        {
            foreach (var r in stage.Components.Where(c => c.Kind == ElementKind.Resistor && power.ContainsKey(c.ElementId)))
            {
                double p = power[r.ElementId];
                var figure = FigureKinds.ResistorPower.Of(r.Name, p);
                if (r.ResistorFamily is not { } family)
                {
                    evaluation.Record(stage.StageId, figure);
                    continue;
                }

                double rating = family.PowerRating.Value.Value;
                double derating = evaluation.Threshold(Id, "derating", stage.StageId);
                double limit = rating * derating;
                evaluation.Record(stage.StageId, figure.AtMost(limit));
                if (p <= limit)
                {
                    continue;
                }

                evaluation.Report(Id, stage.StageId, r.Span, new Dictionary<string, string>
                {
                    ["component"] = r.ElementId,
                    ["power"] = CornerOf(evaluation, r.ElementId) is { } corner ? $"{Say.Watts(p)} ({corner.Phrase})" : Say.Watts(p),
                    ["rating"] = Say.Watts(rating),
                    ["derating"] = Say.Percent(derating),
                    ["limit"] = Say.Watts(limit),
                    ["margin"] = Say.Watts(p - limit),
                }, FixHints.MinimumPowerRating(evaluation.Design, r.ElementId, p / derating), FigureKinds.ResistorPower.Of(r.Name, p), FigureKinds.DeratedPower.Of(limit));
            }
        }
    }

    /// <summary>
    /// The power of every resistor by element id, the larger of the band ends (or at the DC operating point for a DC
    /// source), computed once per design and shared with DR605; null when the chain cannot be analysed.
    /// </summary>
    public static IReadOnlyDictionary<string, double>? Powers(DesignEvaluation evaluation) => Table(evaluation).Power;

    /// <summary>The tolerance corner at which a resistor dissipates most, or null when that is at its nominal values.</summary>
    private static ToleranceCorner? CornerOf(DesignEvaluation evaluation, string elementId) =>
        Table(evaluation).Corners.GetValueOrDefault(elementId);

    private static PowerTable Table(DesignEvaluation evaluation) =>
        evaluation.Analyses.Shared("stress:resistor-power", () =>
        {
            var corners = new Dictionary<string, ToleranceCorner>(StringComparer.Ordinal);
            return new PowerTable(Compute(evaluation, corners), corners);
        });

    private static Dictionary<string, double>? Compute(DesignEvaluation evaluation, Dictionary<string, ToleranceCorner> corners)
    {
        var analyses = evaluation.Analyses;
        var chain = analyses.Chain(Elaboration.BandEnd.Top);
        if (!chain.Succeeded)
        {
            return null;
        }

        var power = new Dictionary<string, double>(StringComparer.Ordinal);
        void Keep(string id, double p) => power[id] = Math.Max(power.GetValueOrDefault(id), p);
        if (analyses.IsPeriodic)
        {
            foreach (var (_, run, result) in TransientRuns.Of(evaluation))
            {
                var (start, end) = TransientRuns.Window(run, result);
                foreach (var r in run.Stages.SelectMany(s => s.Components).Where(c => c.Kind == ElementKind.Resistor))
                {
                    var a = Voltages(result, r.NodeA);
                    var b = Voltages(result, r.NodeB);
                    Keep(r.ElementId, TransientRuns.Average(result.Time, i => Square(a[i] - b[i]) / r.Value, start, end));
                }
            }

            // The same at every resistor-tolerance corner, with each resistor at its corner value.
            foreach (var run in evaluation.Analyses.CornerRuns)
            {
                var (start, end) = TransientRuns.Window(run.Chain, run.Transient);
                foreach (var r in run.Chain.Stages.SelectMany(s => s.Components).Where(c => c.Kind == ElementKind.Resistor))
                {
                    var a = Voltages(run.Transient, r.NodeA);
                    var b = Voltages(run.Transient, r.NodeB);
                    double p = TransientRuns.Average(run.Transient.Time, i => Square(a[i] - b[i]) / r.Value, start, end);
                    if (p > power.GetValueOrDefault(r.ElementId))
                    {
                        power[r.ElementId] = p;
                        corners[r.ElementId] = run.Corner;
                    }
                }
            }
        }
        else
        {
            var op = analyses.OperatingPoint();
            if (!op.Succeeded)
            {
                evaluation.ReportFailure("operating point", op.Failure!, chain);
                return null;
            }

            foreach (var r in chain.Stages.SelectMany(s => s.Components).Where(c => c.Kind == ElementKind.Resistor))
            {
                Keep(r.ElementId, Square(op.Voltage(r.NodeA) - op.Voltage(r.NodeB)) / r.Value);
            }
        }

        return power;
    }

    private sealed record PowerTable(Dictionary<string, double>? Power, Dictionary<string, ToleranceCorner> Corners);

    private static double Square(double v) => v * v;

    private static double[] Voltages(Simulation.Results.TransientResult result, string node) =>
        result.Voltage(node);
}
