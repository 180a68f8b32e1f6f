using DesignRules.Diagnostics;
using DesignRules.Elaboration;
using DesignRules.Model;
using DesignRules.Rules.Evaluation;

namespace DesignRules.Rules.Catalogue.Bandwidth;

/// <summary>
/// DR503: a decompensated amplifier must run at a noise gain of at least its minimum stable gain. Built-in blocks take
/// the noise gain from their feedback network's formula; explicit netlists from an AC analysis of the stage's feedback
/// network (<see cref="NoiseGain.OfCircuit"/>). A netlist amplifier whose noise gain cannot be computed is said to be
/// unjudged (DR702), never passed in silence.
/// </summary>
internal sealed class MinimumStableGainRule : Rule
{
    public override RuleId Id => RuleIds.MinimumStableGain;

    public override void Evaluate(DesignEvaluation evaluation)
    {
        var chain = evaluation.Analyses.Chain(BandEnd.Top);
        foreach (var amp in StageParts.Amplifiers(evaluation.Design))
        {
            var minimum = amp.Part.MinStableGain.Value.Value;
            double? noiseGain = NoiseGain.Of(amp.Stage, amp.Slot);
            if (amp.Stage is NetlistStage)
            {
                var probe = chain.Succeeded ? chain.Stage(amp.Stage.Id.Value) : null;
                var amplifier = probe?.Amplifiers.FirstOrDefault(a => a.Slot == amp.Slot);
                noiseGain = probe is not null && amplifier is not null ? NoiseGain.OfCircuit(probe, amplifier) : null;
                if (noiseGain is null)
                {
                    if (minimum > 1 && chain.Succeeded)
                    {
                        evaluation.Report(RuleIds.UncheckedRequirement, amp.Stage.Id.Value, amp.PartSpan, new Dictionary<string, string>
                        {
                            ["requirement"] = $"minimum stable gain {Say.Ratio(minimum)}",
                            ["target"] = $"amplifier `{amp.Stage.Id.Value}.{amp.Slot}`",
                            ["reason"] = "its noise gain could not be computed from the netlist's feedback network (DR503 did not judge it)",
                        });
                    }

                    continue;
                }

                if (double.IsFinite(noiseGain.Value))
                {
                    evaluation.Record(amp.Stage.Id.Value, FigureKinds.NoiseGain.Of(amp.Slot, noiseGain.Value));
                }
            }

            if (noiseGain is null || noiseGain.Value >= minimum * (1 - 1e-9))
            {
                continue;
            }

            evaluation.Report(Id, amp.Stage.Id.Value, amp.PartSpan, new Dictionary<string, string>
            {
                ["amplifier"] = $"{amp.Stage.Id.Value}.{amp.Slot}",
                ["gain"] = Say.Ratio(noiseGain.Value),
                ["limit"] = Say.Ratio(minimum),
            }, FigureKinds.NoiseGain.Of(amp.Slot, noiseGain.Value), FigureKinds.MinimumStableGain.Of(minimum));
        }
    }
}
