using DesignRules.Rules.Evaluation;
using DesignRules.Rules.Evaluation.Noise;

namespace DesignRules.Rules.Catalogue.Noise;

/// <summary>
/// DR420: the signal-to-noise ratio at a stage's output for the smallest signal it must handle (<c>min-signal</c>, else the
/// source's level carried through the stages before it), RMS signal over the RMS noise integrated over the noise band,
/// against the stage's <c>snr</c> requirement.
/// </summary>
internal sealed class SignalToNoiseRule : Rule
{
    public override string Id => "DR420";

    public override void Evaluate(DesignEvaluation evaluation)
    {
        foreach (var figures in StageNoise.Stages(evaluation))
        {
            string id = figures.Stage.StageId;
            double snr = figures.SignalToNoiseDecibels;
            var stated = figures.Stage.Stage.Requirements.SignalToNoise;
            double? required = stated is null ? null : 20 * Math.Log10(stated.Value.Value);
            var figure = new Figure("signal-to-noise ratio", snr, "dB");
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

            var top = figures.Result.Contributors.Count > 0 ? figures.Result.Contributors[0] : null;
            evaluation.Report(Id, id, StageNoise.Target(evaluation, figures), new Dictionary<string, string>
            {
                ["stage"] = id,
                ["snr"] = Decibels(snr),
                ["signal"] = Say.Volts(figures.SignalPeak),
                ["noise"] = Say.Volts(figures.Result.OutputRms),
                ["band"] = figures.Band,
                ["limit"] = Decibels(limit),
                ["margin"] = Decibels(limit - snr),
                ["cause"] = StageNoise.Cause(top),
                ["fix"] = StageNoise.Fix(top),
            }, figure, new Figure("required signal-to-noise ratio", limit, "dB"));
        }
    }

    private static string Decibels(double db) => db.ToString("0.#", System.Globalization.CultureInfo.InvariantCulture) + " dB";
}
