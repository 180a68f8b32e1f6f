using DesignRules.Diagnostics;
using DesignRules.Rules.Evaluation;

namespace DesignRules.Rules.Catalogue.Stress;

/// <summary>DR604: the supply span against each amplifier's allowed span, the maximum derated.</summary>
internal sealed class SupplySpanRule : Rule
{
    public override RuleId Id => RuleIds.SupplySpan;

    public override void Evaluate(DesignEvaluation evaluation)
    {
        var design = evaluation.Design;
        var span = design.Supplies.Positive.Value.Value - design.Supplies.Negative.Value.Value;
        foreach (var amp in StageParts.Amplifiers(design))
        {
            var derating = evaluation.Threshold(Id, "derating", amp.Stage.Id.Value);
            var minimum = amp.Part.SupplySpanMinimum.Value.Value;
            var maximum = amp.Part.SupplySpanMaximum.Value.Value;
            var limit = maximum * derating;
            if (span >= minimum && span <= limit)
            {
                continue;
            }

            evaluation.Report(Id, amp.Stage.Id.Value, amp.PartSpan, new Dictionary<string, string>
            {
                ["amplifier"] = $"{amp.Stage.Id.Value}.{amp.Slot}",
                ["span"] = Say.Volts(span),
                ["minimum"] = Say.Volts(minimum),
                ["maximum"] = Say.Volts(maximum),
                ["limit"] = span < minimum ? $"at least {Say.Volts(minimum)}" : $"{Say.Volts(limit)} ({Say.Percent(derating)} of the maximum)",
            }, FigureKinds.SupplySpan.Of(span), FigureKinds.AllowedSupplySpan.Of(span < minimum ? minimum : limit));
        }
    }
}
