using DesignRules.Diagnostics;
using DesignRules.Model;
using DesignRules.Rules.Evaluation;
using DesignRules.Rules.Evaluation.LoadingBandwidthStress;
using DesignRules.Figures.LoadingBandwidthStress;

namespace DesignRules.Rules.Catalogue.Stress;

/// <summary>
/// DR601: the power each resistor dissipates (<see cref="ResistorPowers"/>: the mean over the settled periods or at the DC
/// operating point, the largest over the nominal values and every resistor-tolerance corner) against the family's rated
/// power times the derating factor, naming the corner.
/// </summary>
internal sealed class ResistorPowerRule : Rule
{
    public override RuleId Id => RuleIds.ResistorPower;

    public override void Evaluate(DesignEvaluation evaluation)
    {
        var chain = evaluation.Analyses.Chain(Elaboration.BandEnd.Top);
        if (!chain.Succeeded || evaluation.Analyses.ResistorPowers.Power is not { } power)
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
                    ["power"] = evaluation.Analyses.ResistorPowers.Corners.GetValueOrDefault(r.ElementId) is { } corner ? $"{Say.Watts(p)} ({corner.Phrase})" : Say.Watts(p),
                    ["rating"] = Say.Watts(rating),
                    ["derating"] = Say.Percent(derating),
                    ["limit"] = Say.Watts(limit),
                    ["margin"] = Say.Watts(p - limit),
                }, FixHints.MinimumPowerRating(evaluation.Design, r.ElementId, p / derating), FigureKinds.ResistorPower.Of(r.Name, p), FigureKinds.DeratedPower.Of(limit));
            }
        }
    }
}
