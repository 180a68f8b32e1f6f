using DesignRules.Model;
using DesignRules.Rules.Evaluation;
using DesignRules.Rules.Evaluation.LoadingBandwidthStress;

namespace DesignRules.Rules.Catalogue.Loading;

/// <summary>
/// DR305: a peak stage whose hold capacitor is still filling in the settled window (its held value rises period after
/// period, <see cref="HoldFilling"/>) cannot have its droop or accuracy judged; the finding says so, with the charge current
/// that following the input from empty asks (C·2π·f·Vp), and points at the hold capacitor.
/// </summary>
internal sealed class HoldFillingRule : Rule
{
    public override string Id => "DR305";

    public override void Evaluate(DesignEvaluation evaluation)
    {
        foreach (var (stageId, filling) in HoldFilling.Of(evaluation).OrderBy(f => f.Key, StringComparer.Ordinal))
        {
            double limit = filling.Amplifier.Part.OutputCurrent.Value.Value;
            evaluation.Record(stageId, new Figure("hold charge current demanded", filling.Demand, "A").AtMost(limit));
            evaluation.Record(stageId, "held value rise per period", filling.RisePerPeriod, "V");
            var span = filling.Stage.Stage is BlockStage block && block.Values.TryGetValue(filling.Capacitor.Name, out var value)
                ? value.Value.Span : filling.Capacitor.Span;
            evaluation.Report(Id, stageId, span, new Dictionary<string, string>
            {
                ["stage"] = stageId,
                ["capacitor"] = filling.Capacitor.Name,
                ["rise"] = Say.Volts(filling.RisePerPeriod),
                ["demand"] = Say.Amps(filling.Demand),
                ["amplifier"] = filling.Amplifier.ElementId,
                ["limit"] = Say.Amps(limit),
            }, new Figure("hold charge current demanded", filling.Demand, "A"), new Figure("amplifier output current", limit, "A"),
               new Figure("held value rise per period", filling.RisePerPeriod, "V"));
        }
    }
}
