using DesignRules.Elaboration;
using DesignRules.Rules.Evaluation;

namespace DesignRules.Rules.Catalogue.Slew;

/// <summary>
/// DR101: the full-power bandwidth SR/(2π·Vp) of every amplifier, with Vp its output's peak excursion from its mean in the
/// band-top transient and SR the slower of its rising and falling slew rates, against the highest signal frequency times
/// the min-ratio threshold.
/// </summary>
internal sealed class FullPowerBandwidthRule : Rule
{
    public override string Id => "DR101";

    public override void Evaluate(DesignEvaluation evaluation)
    {
        if (AmplifierWaveforms.At(evaluation.Analyses, BandEnd.Top) is not { IsPeriodic: true, Frequency: { } frequency } band)
        {
            return;
        }

        foreach (var a in band.Amplifiers)
        {
            var stageId = a.Stage.StageId;
            double peak = a.PeakExcursion;
            double fpbw = peak > 0 ? a.SlewSlower / (2 * Math.PI * peak) : double.PositiveInfinity;
            double limit = frequency * evaluation.Threshold(Id, "min-ratio", stageId);
            if (double.IsFinite(fpbw))
            {
                evaluation.Record(stageId, new Figure($"full-power bandwidth {a.Probe.Slot}", fpbw, "Hz").AtLeast(limit));
            }

            if (fpbw >= limit)
            {
                continue;
            }

            evaluation.Report(Id, stageId, a.Named.PartSpan, new Dictionary<string, string>
            {
                ["node"] = a.Node,
                ["peak"] = Say.Volts(peak),
                ["frequency"] = Say.Hertz(frequency),
                ["slew"] = Say.Slew(a.SlewSlower),
                ["fpbw"] = Say.Hertz(fpbw),
                ["limit"] = Say.Hertz(limit),
                ["margin"] = Say.Hertz(limit - fpbw),
            }, new Figure("full-power bandwidth", fpbw, "Hz"), new Figure("required full-power bandwidth", limit, "Hz"),
               new Figure("peak excursion", peak, "V"), new Figure("slew rate", a.SlewSlower, "V/s"));
        }
    }
}
