using DesignRules.Rules.Evaluation;
using DesignRules.Rules.Evaluation.Stability;
using DesignRules.Rules.Evaluation.Tolerance;
using DesignRules.Diagnostics;
using DesignRules.Figures.Stability;

namespace DesignRules.Rules.Catalogue.Stability;

/// <summary>
/// DR511: the closed-loop response of every amplifier's loop, |T/(1+T)|, must not peak above its low-frequency value by
/// more than the threshold. Reads the loop alone, so a filter's intended resonance is not counted against it. Where a part
/// states a <c>gbw-derating</c> and the design a temperature range, the loop is judged at the end where its GBW is highest
/// when that is worse (<see cref="LoopsOverTemperature"/>).
/// </summary>
internal sealed class LoopPeakingRule : Rule
{
    public override RuleId Id => RuleIds.LoopPeaking;

    public override void Evaluate(DesignEvaluation evaluation)
    {
        foreach (var amp in StageParts.Amplifiers(evaluation.Design))
        {
            var stageId = amp.Stage.Id.Value;
            if (LoopsOverTemperature.Worst(evaluation, stageId, amp.Slot, m => m.Peaking) is not { } judged)
            {
                continue;
            }

            var (loop, m, at, _) = judged;

            var limit = evaluation.Threshold(Id, "max-peaking", stageId);
            // Recorded in dB, as the trade reads a peak.
            evaluation.Record(stageId, FigureKinds.LoopPeaking.Of(amp.Slot, 20 * Math.Log10(m.Peaking)).AtMost(20 * Math.Log10(limit)).AtTemperature(at));
            if (m.Peaking <= limit)
            {
                continue;
            }

            evaluation.Report(Id, stageId, amp.PartSpan, new Dictionary<string, string>
            {
                ["amplifier"] = $"{stageId}.{amp.Slot}",
                ["peaking"] = Say.Decibels(m.Peaking),
                ["frequency"] = Say.Hertz(m.PeakingFrequency),
                ["point"] = loop.OperatingPoint() + ToleranceAnalyses.AtTemperature(at),
                ["limit"] = Say.Decibels(limit),
                ["over"] = (20 * Math.Log10(m.Peaking / limit)).ToString("0.#", System.Globalization.CultureInfo.InvariantCulture) + " dB",
            }, FigureKinds.LoopPeaking.Of(amp.Slot, 20 * Math.Log10(m.Peaking)).AtMost(20 * Math.Log10(limit)).AtTemperature(at), FigureKinds.LoopPeakingFrequency.Of(amp.Slot, m.PeakingFrequency).AtTemperature(at));
        }
    }
}
