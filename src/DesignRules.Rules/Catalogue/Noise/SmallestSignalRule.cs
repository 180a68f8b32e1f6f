using DesignRules.Diagnostics;
using DesignRules.Elaboration;
using DesignRules.Rules.Evaluation;
using DesignRules.Rules.Evaluation.LoadingBandwidthStress;
using DesignRules.Rules.Evaluation.Tolerance;
using DesignRules.Figures.Tolerance;

namespace DesignRules.Rules.Catalogue.Noise;

/// <summary>
/// DR422: a precision rectifier's smallest signal (<c>min-signal</c>, at the stage input) must clear its dead zone and its
/// noise floor together. The dead zone at the amplifier's inputs is its maximum offset voltage plus the diode's forward
/// voltage (at 1 mA) over the open-loop gain at the top of the signal band, A(f) = A0/√(1 + (f·A0/GBW)²) (textbook
/// single-pole amplifier); referred to the stage input it is divided by the fraction of the input that reaches the
/// amplifier's inputs with the loop open (<see cref="Figures.DesignAnalyses.DeadZoneFractionOf"/>: 1 for the follower
/// form, rf/(rin + rf) or more for the inverting forms, depending on what holds the output side); the noise floor is the stage output's RMS noise over the band divided by the stage gain, taken
/// <c>crest-factor</c> times (3: a Gaussian noise exceeds 3σ 0.27 % of the time, property of the normal distribution).
/// Over a stated operating range the dead zone is taken at 25 °C and at both ends (offset plus drift × |T − 25 °C|, the
/// diode drop moved by its coefficient, the GBW by its derating), and the widest counts.
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

            // The dead zone is met at the amplifier's inputs; referred to the stage input it is divided by the fraction of
            // the input that reaches them with the loop open (1 in the follower form, less through an input resistor).
            if (evaluation.Analyses.DeadZoneFractionOf(stage, amp) is not { } fraction)
            {
                evaluation.Report(RuleIds.UncheckedRequirement, id, StageFacts.PartSpan(stage.Stage, amp.Slot), new Dictionary<string, string>
                {
                    ["requirement"] = $"min-signal {Say.Volts(minSignal.Value.Value)}",
                    ["target"] = $"stage `{id}`",
                    ["reason"] = "how much of its input reaches the amplifier with the loop open could not be computed, so the dead zone could not be referred to the input (DR422 did not judge it)",
                });
                continue;
            }

            double gbw = amp.Part.GainBandwidth.Value.Value;
            double a0 = amp.Part.OpenLoopGain.Value.Value;
            // The loop gain that hides the diode drop is taken at the top of the signal (the noise band's top for a DC source).
            double top = SourceSignal.TopFrequency(evaluation.Design.Source.Waveform) ?? figures.High;
            double vf25 = diode.Model.ForwardVoltage(DiodeCurrent, chain.Options.Temperature);
            double coefficient = diode.Part.ForwardVoltageCoefficient?.Value.Value ?? TemperatureBehaviour.DiodeForwardVoltageCoefficient;
            double drift = Math.Abs(amp.Part.OffsetDrift?.Value.Value ?? 0);

            // The dead zone over the operating range: the offset grows by its drift away from 25 °C, the diode drop
            // rises as it cools (its coefficient), and the GBW follows its derating; the widest end counts and is named.
            double DeadZone(double celsius, out double offsetAt)
            {
                double gbwAt = gbw * TemperatureBehaviour.GbwFactor(amp.Part, celsius);
                double openLoop = a0 / Math.Sqrt(1 + Math.Pow(top * a0 / gbwAt, 2));
                offsetAt = Math.Abs(amp.Part.OffsetVoltage.Maximum.Value.Value) + (drift * Math.Abs(celsius - TemperatureBehaviour.Reference));
                double vf = vf25 + (coefficient * (celsius - TemperatureBehaviour.Reference));
                return (offsetAt + (vf / openLoop)) / fraction;
            }

            double? at = null;
            double deadZone = DeadZone(TemperatureBehaviour.Reference, out double offset);
            if (evaluation.Design.Temperature is { } range)
            {
                foreach (double end in (double[])[range.Value.Low.Value, range.Value.High.Value])
                {
                    double there = DeadZone(end, out double offsetThere);
                    if (there > deadZone)
                    {
                        (deadZone, offset, at) = (there, offsetThere, end);
                    }
                }
            }

            double crest = evaluation.Threshold(Id, "crest-factor", id);
            double noise = figures.NoiseAtStageInput;
            double floor = deadZone + (crest * noise);
            double signal = minSignal.Value.Value;
            evaluation.Record(id, FigureKinds.RectifierDeadZone.Of(deadZone).AtTemperature(at));
            evaluation.Record(id, FigureKinds.NoiseFloorAtInput.Of(noise));
            var figure = FigureKinds.DeadZoneAndFloor.Of(floor).AtMost(signal).AtTemperature(at);
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
                ["deadzone"] = Say.Volts(deadZone) + ToleranceAnalyses.AtTemperature(at),
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
