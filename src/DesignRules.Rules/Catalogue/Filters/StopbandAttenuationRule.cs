using DesignRules.Diagnostics;
using DesignRules.Elaboration;
using DesignRules.Rules.Evaluation;
using DesignRules.Figures.Filters;

namespace DesignRules.Rules.Catalogue.Filters;

/// <summary>
/// DR531: the attenuation of a filter stage at the frequency of its <c>stopband</c> requirement, relative to its measured
/// pass-band gain, from the engine's AC analysis of the built circuit with nominal parts.
/// </summary>
internal sealed class StopbandAttenuationRule : Rule
{
    public override RuleId Id => RuleIds.StopbandAttenuation;

    public override void Evaluate(DesignEvaluation evaluation)
    {
        foreach (var stage in FilterStage.Of(evaluation))
        {
            if (stage.Requirements.Stopband is not { } stopband || stage.Measured(evaluation) is not { } measured)
            {
                continue;
            }

            double frequency = stopband.Frequency.Value.Value, required = stopband.Attenuation.Value.Value;
            if (FilterFigures.Attenuation(evaluation.Analyses.Chain(BandEnd.Top), stage.Probe, frequency, measured.PassbandGain) is not { } attenuation)
            {
                continue;
            }

            evaluation.Record(stage.Id, FigureKinds.StopbandAttenuation.Of(attenuation).AtLeast(required));
            evaluation.Judged(stage.Id, "stopband", Id);
            if (attenuation >= required)
            {
                continue;
            }

            evaluation.Report(Id, stage.Id, stopband.Attenuation.Span, new Dictionary<string, string>
            {
                ["stage"] = stage.Id,
                ["attenuation"] = Say.Decibels(attenuation),
                ["frequency"] = Say.Hertz(frequency),
                ["required"] = Say.Decibels(required),
                ["margin"] = (20 * Math.Log10(required / attenuation)).ToString("0.#", System.Globalization.CultureInfo.InvariantCulture) + " dB",
            }, FigureKinds.StopbandAttenuation.Of(attenuation).AtLeast(required));
        }
    }
}
