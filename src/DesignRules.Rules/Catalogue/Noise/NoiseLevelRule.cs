using DesignRules.Diagnostics;
using DesignRules.Rules.Evaluation;
using DesignRules.Model;

namespace DesignRules.Rules.Catalogue.Noise;

/// <summary>
/// DR421: the RMS noise of a stage over its noise band — at its output, or referred to the design's input (the output noise
/// over the pass-band gain from the source) — against the stage's <c>noise</c> requirement. Records the noise figures of
/// every stage that has a noise analysis, with the shares of its largest contributors.
/// </summary>
internal sealed class NoiseLevelRule : Rule
{
    /// <summary>Contributors whose share is recorded as a figure, largest first.</summary>
    private const int RecordedContributors = 3;

    public override RuleId Id => RuleIds.NoiseLevel;

    public override void Evaluate(DesignEvaluation evaluation)
    {
        foreach (var figures in evaluation.Analyses.Noise)
        {
            string id = figures.Stage.StageId;
            var result = figures.Result;
            var stated = figures.Stage.Stage.Requirements.Noise;
            var at = stated?.At.Value ?? NoiseReference.Output;
            var output = FigureKinds.OutputNoise.Of(result.OutputRms);
            var input = FigureKinds.InputReferredNoise.Of(result.InputReferredRms);
            evaluation.Record(id, stated is not null && at == NoiseReference.Output ? output.AtMost(stated.Rms.Value.Value) : output);
            evaluation.Record(id, stated is not null && at == NoiseReference.Input ? input.AtMost(stated.Rms.Value.Value) : input);
            foreach (var c in result.Contributors.Take(RecordedContributors).Where(c => c.Share > 0))
            {
                evaluation.Record(id, FigureKinds.NoiseShare.Of($"{c.Element}:{Slug(c.Kind)}", c.Share));
            }

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

            var top = figures.Largest;
            evaluation.Report(Id, id, NoiseFindings.Target(evaluation, figures), new Dictionary<string, string>
            {
                ["stage"] = id,
                ["noise"] = Say.Volts(noise),
                ["where"] = at == NoiseReference.Output ? "at its output" : $"referred to the input (pass-band gain {Say.Ratio(result.PassbandGain)})",
                ["band"] = NoiseFindings.Band(figures),
                ["limit"] = Say.Volts(limit),
                ["margin"] = Say.Volts(noise - limit),
                ["cause"] = NoiseFindings.Cause(top),
                ["fix"] = NoiseFindings.Fix(top),
            }, at == NoiseReference.Output ? output : input, FigureKinds.AllowedNoise.Of(limit));
        }
    }

    /// <summary>A kind of noise as a figure subject's suffix (no spaces: figure keys carry it).</summary>
    private static string Slug(NoiseKind kind) => kind switch
    {
        NoiseKind.Thermal => "thermal",
        NoiseKind.AmplifierVoltage => "voltage",
        NoiseKind.AmplifierCurrentNonInverting => "current-plus",
        NoiseKind.AmplifierCurrentInverting => "current-minus",
        _ => "shot",
    };
}
