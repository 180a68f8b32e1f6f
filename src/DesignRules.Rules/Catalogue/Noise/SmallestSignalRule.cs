using DesignRules.Diagnostics;
using DesignRules.Elaboration;
using DesignRules.Rules.Evaluation;
using DesignRules.Rules.Evaluation.LoadingBandwidthStress;

namespace DesignRules.Rules.Catalogue.Noise;

/// <summary>
/// DR422: a precision rectifier's smallest signal (<c>min-signal</c>, at the stage input) must clear its dead zone and its
/// noise floor together. The dead zone referred to the input is the amplifier's maximum offset voltage plus the diode's
/// forward voltage (at 1 mA) over the open-loop gain at the top of the signal band, A(f) = A0/√(1 + (f·A0/GBW)²) (textbook
/// single-pole amplifier); the noise floor is the stage output's RMS noise over the band divided by the stage gain, taken
/// <c>crest-factor</c> times (3: a Gaussian noise exceeds 3σ 0.27 % of the time, property of the normal distribution).
/// </summary>
internal sealed class SmallestSignalRule : Rule
{
    /// <summary>The forward current the diode drop is taken at, A (as DR502).</summary>
    private const double DiodeCurrent = 1e-3;

    public override RuleId Id => RuleIds.SmallestSignal;

    public override void Evaluate(DesignEvaluation evaluation)
    {
        var chain = evaluation.Analyses.Chain(BandEnd.Top);
        foreach (var figures in evaluation.Analyses.Noise)
        {
            var stage = figures.Stage;
            if (!StageProperties.IsRectifying(stage) || stage.Stage.Requirements.MinSignal is not { } minSignal)
            {
                continue;
            }

            var amp = stage.Amplifiers.FirstOrDefault(a => stage.Diodes.Any(d => d.Anode == a.OutputNode || d.Cathode == a.OutputNode));
            var diode = amp is null ? null : stage.Diodes.First(d => d.Anode == amp.OutputNode || d.Cathode == amp.OutputNode);
            if (amp is null || diode is null)
            {
                continue;
            }

            string id = stage.StageId;
            double gbw = amp.Part.GainBandwidth.Value.Value;
            double a0 = amp.Part.OpenLoopGain.Value.Value;
            // The loop gain that hides the diode drop is taken at the top of the signal (the noise band's top for a DC source).
            double top = SourceSignal.TopFrequency(evaluation.Design.Source.Waveform) ?? figures.High;
            double openLoop = a0 / Math.Sqrt(1 + Math.Pow(top * a0 / gbw, 2));
            double offset = Math.Abs(amp.Part.OffsetVoltage.Maximum.Value.Value);
            double vf = diode.Model.ForwardVoltage(DiodeCurrent, chain.Options.Temperature);
            double deadZone = offset + (vf / openLoop);
            double crest = evaluation.Threshold(Id, "crest-factor", id);
            double noise = figures.NoiseAtStageInput;
            double floor = deadZone + (crest * noise);
            double signal = minSignal.Value.Value;
            evaluation.Record(id, FigureKinds.RectifierDeadZone.Of(deadZone));
            evaluation.Record(id, FigureKinds.NoiseFloorAtInput.Of(noise));
            var figure = FigureKinds.DeadZoneAndFloor.Of(floor).AtMost(signal);
            evaluation.Record(id, figure);
            evaluation.Judged(id, "min-signal", Id);
            if (floor <= signal)
            {
                continue;
            }

            evaluation.Report(Id, id, StageFacts.PartSpan(stage.Stage, amp.Slot), new Dictionary<string, string>
            {
                ["stage"] = id,
                ["signal"] = Say.Volts(signal),
                ["deadzone"] = Say.Volts(deadZone),
                ["offset"] = Say.Volts(offset),
                ["frequency"] = Say.Hertz(top),
                ["crest"] = crest.ToString("0.##", System.Globalization.CultureInfo.InvariantCulture),
                ["noise"] = Say.Volts(noise),
                ["band"] = NoiseFindings.Band(figures),
                ["floor"] = Say.Volts(floor),
                ["margin"] = Say.Volts(floor - signal),
            }, figure, FigureKinds.SmallestSignal.Of(signal));
        }
    }
}
