using DesignRules.Diagnostics;
using DesignRules.Elaboration;
using DesignRules.Rules.Evaluation;
using DesignRules.Rules.Evaluation.LoadingBandwidthStress;
using DesignRules.Rules.Evaluation.Tolerance;

namespace DesignRules.Rules.Catalogue.Bandwidth;

/// <summary>
/// DR502: a precision rectifier hides its diode drop only by loop gain. At the top of the band the open-loop gain of a
/// single-pole amplifier is A(f) = A0 / √(1 + (f·A0/GBW)²) ≈ GBW/f (textbook), the loop gain T = A(f)·β with β = 1/noise
/// gain, and the output keeps an error of about Vf/T (the diode's forward voltage at 1 mA over the loop gain). Compared
/// with the smallest output to be rectified — the stated <c>min-signal</c> (at the stage input) times the stage gain, else
/// the source amplitude carried through the ideal gains of the stages before it — times the stage's accuracy. Where the
/// design states a temperature range and the part a <c>gbw-derating</c>, GBW is taken at the end of the range where it is
/// lowest (least loop gain, largest error) and the finding names that temperature.
/// </summary>
internal sealed class RectifierLoopGainRule : Rule
{
    /// <summary>The forward current the diode drop is taken at, A.</summary>
    private const double DiodeCurrent = 1e-3;

    public override RuleId Id => RuleIds.RectifierLoopGain;

    public override void Evaluate(DesignEvaluation evaluation)
    {
        var design = evaluation.Design;
        if (SourceSignal.TopFrequency(design.Source.Waveform) is not { } top)
        {
            return;
        }

        var chain = evaluation.Analyses.Chain(BandEnd.Top);
        double level = SourceSignal.Amplitude(design.Source.Waveform);
        foreach (var stage in chain.Stages)
        {
            double gain = Math.Abs(stage.Transfer.Gain);
            if (StageFacts.IsRectifier(stage) && gain > 0)
            {
                foreach (var (amp, diode) in RectifyingAmplifiers(stage))
                {
                    Check(evaluation, chain, stage, amp, diode, top, level, gain);
                }
            }

            level *= Math.Max(Math.Abs(stage.Transfer.SlopePositive), Math.Abs(stage.Transfer.SlopeNegative));
        }
    }

    private void Check(DesignEvaluation evaluation, ElaboratedChain chain, StageProbe stage, AmplifierProbe amp, DiodeProbe diode, double top, double inputLevel, double gain)
    {
        var stageId = stage.StageId;
        var (derating, at) = TemperatureBehaviour.LowestGbw(evaluation.Design, amp.Part);
        double gbw = amp.Part.GainBandwidth.Value.Value * derating;
        double a0 = amp.Part.OpenLoopGain.Value.Value;
        double openLoop = a0 / Math.Sqrt(1 + Math.Pow(top * a0 / gbw, 2));
        double beta = 1 / (NoiseGain.Of(stage.Stage, amp.Slot) ?? 1);
        double loopGain = openLoop * beta;
        double vf = diode.Model.ForwardVoltage(DiodeCurrent, chain.Options.Temperature);
        double outputError = vf / loopGain;
        var minSignal = stage.Stage.Requirements.MinSignal?.Value.Value;
        double signal = (minSignal ?? inputLevel) * gain;
        double relative = signal > 0 ? outputError / signal : double.PositiveInfinity;
        evaluation.Record(stageId, FigureKinds.LoopGain.Of(amp.Slot, loopGain).AtTemperature(at));
        evaluation.Judged(stageId, "min-signal", Id);
        double accuracy = StageFacts.Accuracy(evaluation, Id, stage.Stage);
        evaluation.Record(stageId, FigureKinds.RectifierError.Of(relative).AtMost(accuracy).AtTemperature(at));
        if (relative <= accuracy)
        {
            return;
        }

        evaluation.Report(Id, stageId, StageFacts.PartSpan(stage.Stage, amp.Slot), new Dictionary<string, string>
        {
            ["stage"] = stageId,
            ["frequency"] = Say.Hertz(top),
            ["gain"] = Say.Ratio(loopGain) + (at is null ? string.Empty : $"{ToleranceAnalyses.AtTemperature(at)}, where the part's GBW is lowest (its gbw-derating)"),
            ["error"] = $"{Say.Volts(outputError)} ({Say.Percent(relative)})",
            ["signal"] = Say.Volts(signal),
            ["limit"] = Say.Percent(accuracy),
            ["margin"] = Say.Percent(relative - accuracy),
        }, FigureKinds.LoopGain.Of(amp.Slot, loopGain).AtTemperature(at), FigureKinds.RectifierError.Of(relative).AtTemperature(at), FigureKinds.Accuracy.Of(accuracy));
    }

    /// <summary>The amplifiers whose output drives a diode of the stage (the rectifying loops), each with that diode.</summary>
    private static IEnumerable<(AmplifierProbe Amplifier, DiodeProbe Diode)> RectifyingAmplifiers(StageProbe stage)
    {
        foreach (var amp in stage.Amplifiers)
        {
            var diode = stage.Diodes.FirstOrDefault(d => d.Anode == amp.OutputNode || d.Cathode == amp.OutputNode);
            if (diode is not null)
            {
                yield return (amp, diode);
            }
        }
    }
}
