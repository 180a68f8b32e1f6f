using System.Globalization;
using DesignRules.Diagnostics;
using DesignRules.Rules.Evaluation;

namespace DesignRules.Rules.Catalogue.Noise;

/// <summary>
/// DR420: the signal-to-noise ratio at a stage's output for the smallest signal it must handle (<c>min-signal</c>, else the
/// source's level carried through the stages before it), RMS signal over the RMS noise integrated over the noise band,
/// against the stage's <c>snr</c> requirement.
/// </summary>
internal sealed class SignalToNoiseRule : Rule
{
    public override RuleId Id => RuleIds.SignalToNoise;

    public override void Evaluate(DesignEvaluation evaluation)
    {
        foreach (var figures in evaluation.Analyses.Noise)
        {
            string id = figures.Stage.StageId;
            double snr = figures.SignalToNoiseDecibels;
            var stated = figures.Stage.Stage.Requirements.SignalToNoise;
            double? required = stated is null ? null : 20 * Math.Log10(stated.Value.Value);
            var figure = FigureKinds.SignalToNoise.Of(snr);
            evaluation.Record(id, required is { } atLeast ? figure.AtLeast(atLeast) : figure);
            if (stated is null || required is not { } limit)
            {
                continue;
            }

            evaluation.Judged(id, "snr", Id);
            if (snr >= limit)
            {
                continue;
            }

            var top = figures.Largest;
            evaluation.Report(Id, id, NoiseFindings.Target(evaluation, figures), new Dictionary<string, string>
            {
                ["stage"] = id,
                ["snr"] = Decibels(snr),
                ["signal"] = Say.Volts(figures.SignalPeak),
                ["noise"] = Say.Volts(figures.Result.OutputRms),
                ["band"] = NoiseFindings.Band(figures),
                ["limit"] = Decibels(limit),
                ["margin"] = Decibels(limit - snr),
                ["cause"] = NoiseFindings.Cause(top),
                ["fix"] = NoiseFindings.Fix(top),
            }, figure, FigureKinds.RequiredSignalToNoise.Of(limit));
        }
    }

    private static string Decibels(double db) => db.ToString("0.#", CultureInfo.InvariantCulture) + " dB";
}
