using DesignRules.Rules.Evaluation;

namespace DesignRules.Rules.Catalogue.Bandwidth;

/// <summary>DR503: a decompensated amplifier must run at a noise gain of at least its minimum stable gain.</summary>
internal sealed class MinimumStableGainRule : Rule
{
    public override string Id => "DR503";

    public override void Evaluate(DesignEvaluation evaluation)
    {
        foreach (var amp in StageParts.Amplifiers(evaluation.Design))
        {
            var noiseGain = NoiseGain.Of(amp.Stage, amp.Slot);
            var minimum = amp.Part.MinStableGain.Value.Value;
            if (noiseGain is null || noiseGain.Value >= minimum * (1 - 1e-9))
            {
                continue;
            }

            evaluation.Report(Id, amp.Stage.Id.Value, amp.PartSpan, new Dictionary<string, string>
            {
                ["amplifier"] = $"{amp.Stage.Id.Value}.{amp.Slot}",
                ["gain"] = Say.Ratio(noiseGain.Value),
                ["limit"] = Say.Ratio(minimum),
            }, new Figure("noise gain", noiseGain.Value, "1"), new Figure("minimum stable gain", minimum, "1"));
        }
    }
}
