using DesignRules.Rules.Evaluation;
using DesignRules.Diagnostics;
using DesignRules.Figures.Stability;

namespace DesignRules.Rules.Catalogue.Stability;

/// <summary>
/// DR513: an amplifier whose loop has no crossover at any operating point tried (open at every one, its crossover beyond
/// the sweep, or a regenerative loop) is said to be unjudged by the stability rules, never passed in silence.
/// </summary>
internal sealed class UnjudgedLoopRule : Rule
{
    public override RuleId Id => RuleIds.StabilityNotJudged;

    public override void Evaluate(DesignEvaluation evaluation)
    {
        var figures = evaluation.Analyses.LoopGains;
        foreach (var amp in StageParts.Amplifiers(evaluation.Design))
        {
            var stageId = amp.Stage.Id.Value;
            if (figures.Of(stageId, amp.Slot) is not { } loop || loop.Loop.Margins.State == LoopState.Closed)
            {
                continue;
            }

            var m = loop.Loop.Margins;
            evaluation.Report(Id, stageId, amp.PartSpan, new Dictionary<string, string>
            {
                ["amplifier"] = $"{stageId}.{amp.Slot}",
                ["reason"] = m.State switch
                {
                    LoopState.Open => $"its loop gain stays below 1 (at most {Say.Ratio(m.LowFrequencyGain)} at 1 Hz) at the quiescent point and with the source at either extreme, so its loop is open there (an amplifier run open-loop, or a diode that never conducts)",
                    LoopState.BeyondSweep => "its loop gain is still above 1 at 1 GHz, beyond the sweep",
                    _ => $"its loop gain is negative at low frequency with a magnitude of {Say.Ratio(m.LowFrequencyGain)}: the feedback is positive and the output latches (by design in a comparator with hysteresis)",
                },
            });
        }
    }
}
