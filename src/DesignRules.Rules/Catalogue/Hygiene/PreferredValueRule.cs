using DesignRules.Diagnostics;
using DesignRules.Quantities;
using DesignRules.Rules.Evaluation;

namespace DesignRules.Rules.Catalogue.Hygiene;

/// <summary>DR701: every resistor value belongs to the E-series the design declares (IEC 60063).</summary>
internal sealed class PreferredValueRule : Rule
{
    public override RuleId Id => RuleIds.PreferredValue;

    public override void Evaluate(DesignEvaluation evaluation)
    {
        var declared = evaluation.Design.ESeries;
        if (declared is null || !ESeries.TryGet(declared.Value, out var series))
        {
            return;
        }

        foreach (var resistor in StageParts.Resistors(evaluation.Design))
        {
            if (series.Contains(resistor.Value))
            {
                continue;
            }

            var nearest = series.Nearest(resistor.Value);
            evaluation.Report(Id, resistor.Stage.Id.Value, resistor.ValueSpan, new Dictionary<string, string>
            {
                ["component"] = $"{resistor.Stage.Id.Value}.{resistor.Name}",
                ["value"] = Say.Ohms(resistor.Value),
                ["series"] = series.Name,
                ["nearest"] = Say.Ohms(nearest),
            }, PreferredValueFix.Of($"{resistor.Stage.Id.Value}.{resistor.Name}", nearest, Dimension.Resistance, resistor.ValueSpan), FigureKinds.ResistorValue.Of(resistor.Value), FigureKinds.NearestPreferredValue.Of(nearest));
        }
    }
}
