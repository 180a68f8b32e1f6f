using DesignRules.Elaboration;
using DesignRules.Simulation;

namespace DesignRules.Rules.Evaluation.LoadingBandwidthStress;

/// <summary>The common walk of the diode stress rules: a figure per diode from the transients, worst band end, against a derated rating.</summary>
internal static class DiodeStress
{
    public static void Evaluate(
        DesignEvaluation evaluation, DesignRules.Diagnostics.RuleId ruleId, FigureKind figure, FigureKind derated, Func<ElaboratedChain, TransientResult, DiodeProbe, double> measure,
        Func<DiodeProbe, double> rating, Func<double, string> say, string placeholder)
    {
        var worst = new Dictionary<string, (double Value, StageProbe Stage, DiodeProbe Diode)>(StringComparer.Ordinal);
        foreach (var (_, chain, result) in evaluation.Analyses.SettledTransients)
        {
            foreach (var stage in chain.Stages)
            {
                foreach (var diode in stage.Diodes)
                {
                    double value = measure(chain, result, diode);
                    if (!worst.TryGetValue(diode.ElementId, out var known) || value > known.Value)
                    {
                        worst[diode.ElementId] = (value, stage, diode);
                    }
                }
            }
        }

        foreach (var (id, (value, stage, diode)) in worst.OrderBy(w => w.Key, StringComparer.Ordinal))
        {
            double rated = rating(diode);
            double derating = evaluation.Threshold(ruleId, "derating", stage.StageId);
            double limit = rated * derating;
            evaluation.Record(stage.StageId, figure.Of(diode.Slot, value).AtMost(limit));
            if (value <= limit)
            {
                continue;
            }

            evaluation.Report(ruleId, stage.StageId, StageFacts.PartSpan(stage.Stage, diode.Slot), new Dictionary<string, string>
            {
                ["component"] = id,
                [placeholder] = say(value),
                ["rating"] = say(rated),
                ["derating"] = Say.Percent(derating),
                ["limit"] = say(limit),
                ["margin"] = say(value - limit),
            }, figure.Of(diode.Slot, value), derated.Of(limit));
        }
    }

    public static double[] Voltages(TransientResult result, string node) =>
        result.Voltage(node);
}
