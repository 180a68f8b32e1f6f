using DesignRules.Diagnostics;
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
    public override RuleId Id => RuleIds.HoldCapacitorFilling;

    public override void Evaluate(DesignEvaluation evaluation)
    {
        foreach (var (stageId, filling) in evaluation.Analyses.FillingHolds.OrderBy(f => f.Key, StringComparer.Ordinal))
        {
            double limit = filling.Amplifier.Part.OutputCurrent.Value.Value;
            evaluation.Record(stageId, FigureKinds.HoldChargeCurrent.Of(filling.Demand).AtMost(limit));
            evaluation.Record(stageId, FigureKinds.HeldRisePerPeriod.Of(filling.RisePerPeriod));
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
            }, FigureKinds.HoldChargeCurrent.Of(filling.Demand), FigureKinds.HoldAmplifierCurrent.Of(limit),
               FigureKinds.HeldRisePerPeriod.Of(filling.RisePerPeriod));
        }
    }
}
