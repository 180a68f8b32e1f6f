using DesignRules.Model;
using DesignRules.Rules.Evaluation;
using DesignRules.Rules.Evaluation.LoadingBandwidthStress;

namespace DesignRules.Rules.Catalogue.Stress;

/// <summary>
/// DR601: the power each resistor of a stage dissipates, P = v²/R from its node voltages (Joule's law): averaged over the
/// whole periods of the transient's measurement window at each band end, or at the DC operating point for a DC source;
/// the larger is compared with the family's rated power times the derating factor.
/// </summary>
internal sealed class ResistorPowerRule : Rule
{
    public override string Id => "DR601";

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
                var figure = new Figure($"power in {r.Name}", p, "W");
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
                    ["power"] = Say.Watts(p),
                    ["rating"] = Say.Watts(rating),
                    ["derating"] = Say.Percent(derating),
                    ["limit"] = Say.Watts(limit),
                    ["margin"] = Say.Watts(p - limit),
                }, new Figure("resistor power", p, "W"), new Figure("derated power", limit, "W"));
            }
        }
    }

    /// <summary>
    /// The power of every resistor by element id, the larger of the band ends (or at the DC operating point for a DC
    /// source), computed once per design and shared with DR605; null when the chain cannot be analysed.
    /// </summary>
    public static IReadOnlyDictionary<string, double>? Powers(DesignEvaluation evaluation) =>
        evaluation.Analyses.Shared("stress:resistor-power", () => new PowerTable(Compute(evaluation))).Power;

    private static Dictionary<string, double>? Compute(DesignEvaluation evaluation)
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

    private sealed record PowerTable(Dictionary<string, double>? Power);

    private static double Square(double v) => v * v;

    private static double[] Voltages(Simulation.TransientResult result, string node) =>
        result.Voltage(node);
}
