using DesignRules.Diagnostics;
using DesignRules.Elaboration;
using DesignRules.Model;
using DesignRules.Rules.Evaluation;
using DesignRules.Rules.Evaluation.LoadingBandwidthStress;

namespace DesignRules.Rules.Catalogue.Loading;

/// <summary>
/// DR303: a stage output driven only through a diode (half-wave follower, unbuffered peak detector, a netlist output
/// reached from its amplifier only through a diode) is high-impedance while the diode is off. In the transient at each
/// band end, while that diode carries less than a thousandth of its peak current, the output is compared with the
/// ideal: the ideal transfer of the input for a rectifier, the held value decaying with the stage's own time constant
/// for a peak detector. The two-diode inverting rectifier, whose feedback resistor holds its output at the virtual ground
/// while the diode is off, is judged too when its load returns to a voltage other than 0 V. Only the half-cycle a rectifier blocks is looked at (elsewhere an off diode is the zero-crossing
/// glitch, which the slew rules judge), and not while an amplifier of the stage is slewing. The largest deviation, over the full-scale output, is compared with the stage's accuracy.
/// </summary>
internal sealed class HighImpedanceOutputRule : Rule
{
    public override RuleId Id => RuleIds.HighImpedanceOutput;

    public override void Evaluate(DesignEvaluation evaluation)
    {
        if (!evaluation.Analyses.IsPeriodic)
        {
            return;
        }

        var worst = new Dictionary<string, double>(StringComparer.Ordinal);
        var probes = new Dictionary<string, StageProbe>(StringComparer.Ordinal);
        foreach (var (_, chain, result) in evaluation.Analyses.SettledTransients)
        {
            foreach (var stage in chain.Stages)
            {
                var diode = OutputDiode(stage);
                bool held = diode is null;
                diode ??= HeldDiode(evaluation, chain, stage);
                if (diode is null)
                {
                    continue;
                }

                double error = Deviation(chain, result, stage, diode, held);
                probes[stage.StageId] = stage;
                worst[stage.StageId] = Math.Max(worst.GetValueOrDefault(stage.StageId), error);
            }
        }

        foreach (var (stageId, error) in worst.OrderBy(w => w.Key, StringComparer.Ordinal))
        {
            var stage = probes[stageId];
            double accuracy = StageFacts.Accuracy(evaluation, Id, stage.Stage);
            evaluation.Record(stageId, FigureKinds.DiodeOffError.Of(error).AtMost(accuracy));
            if (error <= accuracy)
            {
                continue;
            }

            evaluation.Report(Id, stageId, Location(stage.Stage), new Dictionary<string, string>
            {
                ["stage"] = stageId,
                ["error"] = Say.Percent(error),
                ["limit"] = Say.Percent(accuracy),
                ["margin"] = Say.Percent(error - accuracy),
            }, FigureKinds.DiodeOffError.Of(error), FigureKinds.Accuracy.Of(accuracy));
        }
    }

    /// <summary>The diode through which alone the stage output is driven, or null when an amplifier drives it.</summary>
    internal static DiodeProbe? OutputDiode(StageProbe stage)
    {
        var output = stage.OutputNode;
        if (stage.Amplifiers.Any(a => a.OutputNode == output) || stage.Diodes.Count == 0)
        {
            return null;
        }

        // A feedback resistor from the output to a summing junction (the two-diode rectifier's rf) holds the output at the
        // virtual ground while the diode is off: the stage drives it, not the diode alone.
        var held = stage.SummingJunctions.Concat(stage.Amplifiers.Select(a => a.InvertingNode)).Where(n => n != output).ToHashSet(StringComparer.Ordinal);
        if (stage.Components.Any(c => c.Kind == ElementKind.Resistor && ((c.NodeA == output && held.Contains(c.NodeB)) || (c.NodeB == output && held.Contains(c.NodeA)))))
        {
            return null;
        }

        var direct = stage.Diodes.FirstOrDefault(d => d.Anode == output || d.Cathode == output);
        if (direct is not null)
        {
            return direct;
        }

        // A series resistor between the diode and the output (a peak detector's rser).
        foreach (var r in stage.Components.Where(c => c.Kind == ElementKind.Resistor && (c.NodeA == output || c.NodeB == output)))
        {
            var other = r.NodeA == output ? r.NodeB : r.NodeA;
            var diode = stage.Diodes.FirstOrDefault(d => d.Anode == other || d.Cathode == other);
            if (diode is not null && !stage.Amplifiers.Any(a => a.OutputNode == other))
            {
                return diode;
            }
        }

        return null;
    }

    /// <summary>
    /// For a stage whose output a feedback resistor ties to a summing junction while its diode is off (the two-diode
    /// inverting rectifier), the diode on its output — when what the output drives returns to a voltage other than 0 V
    /// (the design's load `returns-to`, for the last stage), so that the load divides that voltage with the feedback
    /// resistor instead of seeing the virtual ground. Null otherwise: into a ground-returned load that form holds 0 V.
    /// </summary>
    private static DiodeProbe? HeldDiode(DesignEvaluation evaluation, ElaboratedChain chain, StageProbe stage)
    {
        bool last = ReferenceEquals(chain.Stages[^1], stage);
        if (!last || evaluation.Design.Load.ReturnsTo.Value.Value == 0 || stage.Amplifiers.Any(a => a.OutputNode == stage.OutputNode))
        {
            return null;
        }

        return stage.Diodes.FirstOrDefault(d => d.Anode == stage.OutputNode || d.Cathode == stage.OutputNode);
    }

    private static double Deviation(ElaboratedChain chain, Simulation.Results.TransientResult result, StageProbe stage, DiodeProbe diode, bool held)
    {
        var (start, end) = MeasurementWindow.Of(chain, result);
        var time = result.Time;
        var anode = result.Voltage(diode.Anode);
        var cathode = result.Voltage(diode.Cathode);
        var output = result.Voltage(stage.OutputNode);
        var inPlus = result.Voltage(stage.InputNode);
        var inMinus = Simulation.Circuits.Circuit.IsReference(stage.ReferenceInputNode) ? null : result.Voltage(stage.ReferenceInputNode);
        double temperature = chain.Options.Temperature;
        var current = new double[time.Count];
        double peakCurrent = 0, fullScale = 0;
        for (int i = 0; i < time.Count; i++)
        {
            current[i] = diode.Model.ForwardCurrent(anode[i] - cathode[i], temperature);
            if (time[i] >= start && time[i] <= end)
            {
                peakCurrent = Math.Max(peakCurrent, current[i]);
                fullScale = Math.Max(fullScale, Math.Abs(stage.Transfer.At(inPlus[i] - (inMinus?[i] ?? 0))));
            }
        }

        if (!(fullScale > 0) || !(peakCurrent > 0))
        {
            return 0;
        }

        var slewing = stage.Amplifiers.Select(a => result.Amplifier(a.ElementId)).ToList();
        bool holds = stage.Transfer.Kind == TransferKind.Peak;
        double tau = stage.TimeConstant ?? double.PositiveInfinity;
        // The held form's output settles onto its load's divider only once the crossing is past: within a tenth of the
        // input's peak of a crossing it is the zero-crossing glitch's (DR103's) concern.
        double inputPeak = 0;
        for (int i = 0; i < time.Count; i++) if (time[i] >= start && time[i] <= end) inputPeak = Math.Max(inputPeak, Math.Abs(inPlus[i] - (inMinus?[i] ?? 0)));
        double worst = 0, heldAt = double.NaN, heldValue = 0;
        for (int i = 0; i < time.Count; i++)
        {
            bool off = current[i] < 1e-3 * peakCurrent;
            if (!off)
            {
                heldAt = double.NaN;
                continue;
            }

            if (double.IsNaN(heldAt))
            {
                heldAt = time[i];
                heldValue = output[i];
            }

            if (time[i] < start || time[i] > end)
            {
                continue;
            }

            // A rectifier's diode is off by design only in the half-cycle its transfer blocks; off in the passed half-cycle
            // it is slewing across its dead zone, which is the glitch rules' concern, not the load's.
            double input = inPlus[i] - (inMinus?[i] ?? 0);
            if (!holds && (input >= 0 ? stage.Transfer.SlopePositive : stage.Transfer.SlopeNegative) != 0)
            {
                continue;
            }

            if (held && Math.Abs(input) < 0.1 * inputPeak)
            {
                continue;
            }

            // Nor is the time an amplifier of the stage spends slewing (the loop is open then, whatever the load).
            if (slewing.Any(trace => trace.SlewLimited[i]))
            {
                continue;
            }

            double ideal = holds ? heldValue * Math.Exp(-(time[i] - heldAt) / tau) : stage.Transfer.At(input);
            worst = Math.Max(worst, Math.Abs(output[i] - ideal));
        }

        return worst / fullScale;
    }

    private static SourceSpan Location(Stage stage) => stage switch
    {
        BlockStage block when block.Flags.TryGetValue("buffer", out var flag) => flag.Span,
        BlockStage block => block.BlockName.Span,
        NetlistStage netlist => netlist.Output.Span,
        _ => stage.Span,
    };
}
