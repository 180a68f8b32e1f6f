using DesignRules.Model;
using DesignRules.Rules.Evaluation;
using DesignRules.Rules.Evaluation.Noise;

namespace DesignRules.Rules.Catalogue.Noise;

/// <summary>
/// DR421: the RMS noise of a stage over its noise band — at its output, or referred to the design's input (the output noise
/// over the pass-band gain from the source) — against the stage's <c>noise</c> requirement.
/// </summary>
internal sealed class NoiseLevelRule : Rule
{
    public override string Id => "DR421";

    public override void Evaluate(DesignEvaluation evaluation)
    {
        foreach (var figures in StageNoise.Stages(evaluation))
        {
            string id = figures.Stage.StageId;
            var result = figures.Result;
            var stated = figures.Stage.Stage.Requirements.Noise;
            var at = stated?.At.Value ?? NoiseReference.Output;
            var output = new Figure("output noise", result.OutputRms, "V");
            var input = new Figure("input-referred noise", result.InputReferredRms, "V");
            evaluation.Record(id, stated is not null && at == NoiseReference.Output ? output.AtMost(stated.Rms.Value.Value) : output);
            evaluation.Record(id, stated is not null && at == NoiseReference.Input ? input.AtMost(stated.Rms.Value.Value) : input);
            if (stated is null)
            {
                continue;
            }

            evaluation.Judged(id, "noise", Id);
            double noise = at == NoiseReference.Output ? result.OutputRms : result.InputReferredRms;
            double limit = stated.Rms.Value.Value;
            if (noise <= limit)
            {
                continue;
            }

            var top = result.Contributors.Count > 0 ? result.Contributors[0] : null;
            evaluation.Report(Id, id, StageNoise.Target(evaluation, figures), new Dictionary<string, string>
            {
                ["stage"] = id,
                ["noise"] = Say.Volts(noise),
                ["where"] = at == NoiseReference.Output ? "at its output" : $"referred to the input (pass-band gain {Say.Ratio(result.PassbandGain)})",
                ["band"] = figures.Band,
                ["limit"] = Say.Volts(limit),
                ["margin"] = Say.Volts(noise - limit),
                ["cause"] = StageNoise.Cause(top),
                ["fix"] = StageNoise.Fix(top),
            }, at == NoiseReference.Output ? output : input, new Figure("allowed noise", limit, "V"));
        }
    }
}
