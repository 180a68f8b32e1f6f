using DesignRules.Diagnostics;
using DesignRules.Model;
using DesignRules.Rules.Evaluation;

namespace DesignRules.Rules.Catalogue.Stress;

/// <summary>
/// DR605: a resistor with no family has no rated power, so DR601 cannot judge its dissipation; say so, with the power
/// it dissipates, rather than let the page record a figure no rule looked at.
/// </summary>
internal sealed class UnratedResistorRule : Rule
{
    public override RuleId Id => RuleIds.UnratedResistor;

    public override void Evaluate(DesignEvaluation evaluation)
    {
        var chain = evaluation.Analyses.Chain(Elaboration.BandEnd.Top);
        if (!chain.Succeeded || evaluation.Analyses.ResistorPowers.Power is not { } power)
        {
            return;
        }

        foreach (var stage in chain.Stages)
        {
            foreach (var r in stage.Components.Where(c => c.Kind == ElementKind.Resistor && c.ResistorFamily is null))
            {
                string hint = stage.Stage is NetlistStage
                    ? $"add `family: <resistor family id>` to element `{r.Name}`"
                    : "add `resistors: <resistor family id>` to the stage, or write the value as `{ value: ..., family: ... }`";
                double p = power.GetValueOrDefault(r.ElementId, double.NaN);
                evaluation.Report(Id, stage.StageId, r.Span, new Dictionary<string, string>
                {
                    ["component"] = r.ElementId,
                    ["power"] = double.IsNaN(p) ? "an unknown power" : Say.Watts(p),
                    ["hint"] = hint,
                }, double.IsNaN(p) ? [] : [FigureKinds.ResistorPower.Of(r.Name, p)]);
            }
        }
    }
}
