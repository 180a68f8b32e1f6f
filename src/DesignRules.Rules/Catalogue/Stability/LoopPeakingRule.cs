using DesignRules.Rules.Evaluation;
using DesignRules.Rules.Evaluation.Stability;
using DesignRules.Diagnostics;
using DesignRules.Figures.Stability;

namespace DesignRules.Rules.Catalogue.Stability;

/// <summary>
/// DR511: the closed-loop response of every amplifier's loop, |T/(1+T)|, must not peak above its low-frequency value by
/// more than the threshold. Reads the loop alone, so a filter's intended resonance is not counted against it.
/// </summary>
internal sealed class LoopPeakingRule : Rule
{
    public override RuleId Id => RuleIds.LoopPeaking;

    public override void Evaluate(DesignEvaluation evaluation)
    {
        var figures = evaluation.Analyses.LoopGains;
        foreach (var amp in StageParts.Amplifiers(evaluation.Design))
        {
            var stageId = amp.Stage.Id.Value;
            if (figures.Of(stageId, amp.Slot) is not { Loop.Margins: { State: LoopState.Closed } m } loop)
            {
                continue;
            }

            var limit = evaluation.Threshold(Id, "max-peaking", stageId);
            // Recorded in dB, as the trade reads a peak.
            evaluation.Record(stageId, FigureKinds.LoopPeaking.Of(amp.Slot, 20 * Math.Log10(m.Peaking)).AtMost(20 * Math.Log10(limit)));
            if (m.Peaking <= limit)
            {
                continue;
            }

            evaluation.Report(Id, stageId, amp.PartSpan, new Dictionary<string, string>
            {
                ["amplifier"] = $"{stageId}.{amp.Slot}",
                ["peaking"] = Say.Decibels(m.Peaking),
                ["frequency"] = Say.Hertz(m.PeakingFrequency),
                ["point"] = loop.OperatingPoint(),
                ["limit"] = Say.Decibels(limit),
                ["over"] = (20 * Math.Log10(m.Peaking / limit)).ToString("0.#", System.Globalization.CultureInfo.InvariantCulture) + " dB",
            }, FigureKinds.LoopPeaking.Of(amp.Slot, 20 * Math.Log10(m.Peaking)).AtMost(20 * Math.Log10(limit)), FigureKinds.LoopPeakingFrequency.Of(amp.Slot, m.PeakingFrequency));
        }
    }
}
