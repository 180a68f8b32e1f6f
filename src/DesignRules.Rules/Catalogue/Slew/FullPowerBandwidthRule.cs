using DesignRules.Diagnostics;
using DesignRules.Elaboration;
using DesignRules.Rules.Evaluation;
using DesignRules.Rules.Evaluation.Tolerance;

namespace DesignRules.Rules.Catalogue.Slew;

/// <summary>
/// DR101: the full-power bandwidth of every amplifier, with Vp its output's peak excursion from its mean in the band-top
/// transient and SR the slower of its rising and falling slew rates, against the highest signal frequency times the
/// min-ratio threshold. For a sine source it is the sine formula SR/(2π·Vp); for any other waveform it is the frequency at
/// which the actual waveform's steepest slope (scaled to the output's excursion) equals SR — SR/(4·Vp) for a triangle,
/// whose steepest slope is 4·Vp·f. A square's edges are steps, judged as slewing events by DR102, not here. Where the
/// design states a temperature range and the part a slew-rate derating, SR is the slowest over the range (at one of its
/// ends) and the finding names that temperature.
/// </summary>
internal sealed class FullPowerBandwidthRule : Rule
{
    public override RuleId Id => RuleIds.FullPowerBandwidth;

    public override void Evaluate(DesignEvaluation evaluation)
    {
        if (AmplifierWaveforms.At(evaluation.Analyses, BandEnd.Top) is not { IsPeriodic: true, Frequency: { } frequency } band)
        {
            return;
        }

        if (WaveformShape.Of(band.Chain.SourceWaveform, band.Period!.Value, frequency) is not { } shape)
        {
            return;
        }

        foreach (var a in band.Amplifiers)
        {
            var stageId = a.Stage.StageId;
            double peak = a.PeakExcursion;
            var (derating, at) = TemperatureBehaviour.SlowestSlew(evaluation.Design, a.Probe.Part);
            double slew = a.SlewSlower * derating;
            // The output's steepest slope is the source's shape factor times 2π·f·Vp (exactly 2π·f·Vp for a sine).
            double fpbw = peak > 0 ? slew / (2 * Math.PI * shape.Factor * peak) : double.PositiveInfinity;
            double limit = frequency * evaluation.Threshold(Id, "min-ratio", stageId);
            if (double.IsFinite(fpbw))
            {
                evaluation.Record(stageId, FigureKinds.FullPowerBandwidth.Of(a.Probe.Slot, fpbw).AtLeast(limit).AtTemperature(at));
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
                ["slew"] = Say.Slew(slew) + ToleranceAnalyses.AtTemperature(at),
                ["formula"] = shape.Formula,
                ["fpbw"] = Say.Hertz(fpbw),
                ["limit"] = Say.Hertz(limit),
                ["margin"] = Say.Hertz(limit - fpbw),
            }, FixHints.ConfirmAmplifier(evaluation, this, FixHints.MinimumSlewRate(evaluation, a.Name, 2 * Math.PI * shape.Factor * peak * limit / derating), FixHints.WithSlewRate)
                // As it stands: the full-power bandwidth falls as 1/Vp, so the amplitude (and the band top) may be fpbw/limit
                // of today's, the closed-form guess the search confirms.
                .Or(SearchedFixHints.MaximumAmplitude(evaluation, this, stageId, a.Named.PartSpan, fpbw / limit))
                .Or(SearchedFixHints.MaximumBandTop(evaluation, this, stageId, a.Named.PartSpan, fpbw / limit)), FigureKinds.FullPowerBandwidth.Of(a.Probe.Slot, fpbw).AtTemperature(at), FigureKinds.RequiredFullPowerBandwidth.Of(limit),
               FigureKinds.PeakExcursion.Of(peak), FigureKinds.SlewRate.Of(slew).AtTemperature(at),
               FigureKinds.SteepestSlope.Of(2 * Math.PI * shape.Factor * frequency * peak));
        }
    }
}
