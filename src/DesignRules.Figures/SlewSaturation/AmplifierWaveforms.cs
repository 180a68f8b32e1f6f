using DesignRules.Elaboration;
using DesignRules.Figures.Tolerance;
using DesignRules.Simulation;

namespace DesignRules.Figures.SlewSaturation;

/// <summary>
/// Measures every amplifier of a design in the shared transient of a band end, once, for the slew (1xx) and saturation
/// (2xx) rules: output mean, extremes and peak excursion, input extremes, differential input, and slewing events.
/// </summary>
internal static class AmplifierWaveforms
{
    /// <summary>
    /// An output moving faster than this multiple of the fastest a smooth signal of its own size can move (2π·f·Vp, the
    /// peak slope of a sine of the source's highest frequency and the output's peak excursion) is jumping, not following.
    /// </summary>
    private const double JumpFactor = 1.5;

    /// <summary>... and, however small the signal, at least this fraction of the slew rate.</summary>
    private const double JumpFloor = 0.1;

    /// <summary>Runs of the same direction closer than this fraction of the period, with no reversal between, are one event.</summary>
    private const double MergeGap = 0.01;

    /// <summary>Events smaller than this are numerical noise, V.</summary>
    private const double SmallestEvent = 1e-3;

    /// <summary>The measurements at <paramref name="end"/>, or null when the chain cannot be built or simulated (<see cref="DesignAnalyses.Waveforms"/>).</summary>
    public static BandWaveforms? At(DesignAnalyses analyses, BandEnd end) => analyses.Waveforms(end);

    /// <summary>The measurements at every band end the design has (top first), skipping ends that cannot be simulated.</summary>
    public static IEnumerable<BandWaveforms> AtEveryEnd(DesignAnalyses analyses) =>
        analyses.BandEnds.Select(analyses.Waveforms).OfType<BandWaveforms>();

    internal static BandWaveforms? Compute(DesignAnalyses analyses, BandEnd end)
    {
        var chain = analyses.Chain(end);
        if (!chain.Succeeded)
        {
            return null;
        }

        var transient = analyses.Transient(end);
        if (!transient.Succeeded)
        {
            analyses.ReportFailure("transient", transient.Failure!, chain);
            return null;
        }

        if (!analyses.IsSettled(end))
        {
            return null;
        }

        return Measure(analyses, end, chain, transient);
    }

    /// <summary>
    /// The same measurements at every resistor-tolerance corner and band end (<see cref="ToleranceCorners"/>), for the
    /// rules that judge the worst corner.
    /// </summary>
    internal static IReadOnlyList<(ToleranceCorner Corner, BandWaveforms Band)> AtCorners(DesignAnalyses analyses) =>
        analyses.CornerRuns.Select(r => (r.Corner, Band: Measure(analyses, r.End, r.Chain, r.Transient)))
            .Where(x => x.Band is not null).Select(x => (x.Corner, x.Band!)).ToList();

    private static BandWaveforms? Measure(DesignAnalyses analyses, BandEnd end, ElaboratedChain chain, TransientResult transient)
    {
        if (transient.Time.Count < 2)
        {
            return null;
        }

        double from = Math.Min(chain.Window.MeasureFrom, transient.Time[^1]);
        var named = StageParts.Amplifiers(analyses.Design).ToList();
        double? frequency = chain.Period is null ? null : HighestFrequency(chain.SourceWaveform);
        var amplifiers = new List<AmplifierWaveform>();
        foreach (var stage in chain.Stages)
        {
            double inputPeak = InputPeak(transient, from, stage);
            foreach (var probe in stage.Amplifiers)
            {
                var part = named.FirstOrDefault(a => a.Stage.Id.Value == stage.StageId && a.Slot == probe.Slot);
                if (part is null)
                {
                    continue;
                }

                amplifiers.Add(Measure(transient, from, frequency, inputPeak, stage, probe, part));
            }
        }

        return new BandWaveforms(end, chain, transient, from, frequency, chain.Period, amplifiers);
    }

    private static AmplifierWaveform Measure(
        TransientResult transient, double from, double? frequency, double inputPeak, StageProbe stage, AmplifierProbe probe, StageAmplifier part)
    {
        var time = transient.Time;
        var output = transient.Voltage(probe.OutputNode);
        var plus = Voltage(transient, probe.NonInvertingNode, time.Count);
        var minus = Voltage(transient, probe.InvertingNode, time.Count);
        var trace = transient.Amplifier(probe.ElementId);
        var stress = AmplifierStress.Measure(transient, probe.ElementId, from);
        int first = FirstIndex(time, from);

        double min = double.PositiveInfinity, max = double.NegativeInfinity, atMin = 0, atMax = 0;
        double plusMin = double.PositiveInfinity, plusMax = double.NegativeInfinity, minusMin = double.PositiveInfinity, minusMax = double.NegativeInfinity;
        double area = 0;
        bool atLimit = false;
        for (int i = first; i < time.Count; i++)
        {
            if (output[i] < min)
            {
                min = output[i];
                atMin = minus[i];
            }

            if (output[i] > max)
            {
                max = output[i];
                atMax = minus[i];
            }

            plusMin = Math.Min(plusMin, plus[i]);
            plusMax = Math.Max(plusMax, plus[i]);
            minusMin = Math.Min(minusMin, minus[i]);
            minusMax = Math.Max(minusMax, minus[i]);
            atLimit |= trace.AtSwingLimit[i];
            if (i > first)
            {
                area += 0.5 * (output[i] + output[i - 1]) * (time[i] - time[i - 1]);
            }
        }

        double span = time[^1] - time[first];
        double mean = span > 0 ? area / span : output[first];
        // The size of the signal the output follows between jumps: its own excursion for an amplifier in a linear loop;
        // for one switched by a diode on its output (a rectifier's or peak detector's), whose own excursion includes the
        // jumps, the ideal output's peak, |input| times the steeper slope of the stage's ideal transfer.
        double signal = Math.Max(max - mean, mean - min);
        if (stage.Diodes.Any(d => d.Anode == probe.OutputNode || d.Cathode == probe.OutputNode))
        {
            signal = inputPeak * Math.Max(Math.Abs(stage.Transfer.SlopePositive), Math.Abs(stage.Transfer.SlopeNegative));
        }

        var events = frequency is { } f
            ? Events(time, output, first, JumpFactor * 2 * Math.PI * f * signal, probe.Model.SlewRateRising, probe.Model.SlewRateFalling, MergeGap / f)
            : [];
        return new AmplifierWaveform(stage, probe, part, mean, min, max, atMin, atMax, stress.PeakSlewDemand, events,
            plusMin, plusMax, minusMin, minusMax, stress.PeakDifferentialInput, atLimit);
    }

    /// <summary>
    /// Slewing events: runs of the output moving one way faster than <paramref name="smooth"/> (and at least
    /// <see cref="JumpFloor"/> of the slew rate that way), merged with a following run of the same direction when the
    /// gap between them is shorter than <paramref name="mergeGap"/> and the output does not turn back in it. A sine inside
    /// its full-power bandwidth never moves faster than 2π·f·Vp and so raises no event; a rectifier's jump across its
    /// dead zone or back from a rail, or a square edge, does.
    /// </summary>
    internal static List<SlewingEvent> Events(
        IReadOnlyList<double> time, IReadOnlyList<double> v, int first, double smooth, double rising, double falling, double mergeGap)
    {
        var runs = new List<(int A, int B, int Direction)>();
        int n = Math.Min(time.Count, v.Count);
        double up = Math.Max(smooth, JumpFloor * rising), down = Math.Max(smooth, JumpFloor * falling);
        int i = first;
        while (i < n - 1)
        {
            int direction = Moving(time, v, i, i + 1, 1, up) ? 1 : Moving(time, v, i, i + 1, -1, down) ? -1 : 0;
            if (direction == 0)
            {
                i++;
                continue;
            }

            double rate = direction > 0 ? up : down;
            int a = i, b = i + 1;
            while (b < n - 1 && Moving(time, v, b, b + 1, direction, rate))
            {
                b++;
            }

            if (runs.Count > 0 && runs[^1].Direction == direction && time[a] - time[runs[^1].B] <= mergeGap
                && Enumerable.Range(runs[^1].B, a - runs[^1].B).All(k => direction * (v[k + 1] - v[k]) >= 0))
            {
                runs[^1] = (runs[^1].A, b, direction);
            }
            else
            {
                runs.Add((a, b, direction));
            }

            i = b;
        }

        return runs.Select(r => new SlewingEvent(time[r.A], time[r.B], v[r.A], v[r.B]))
            .Where(e => e.Swing >= SmallestEvent).ToList();
    }

    private static bool Moving(IReadOnlyList<double> time, IReadOnlyList<double> v, int a, int b, int direction, double rate)
    {
        double dt = time[b] - time[a];
        return dt > 0 && direction * (v[b] - v[a]) / dt >= rate;
    }

    /// <summary>The largest |input| of a stage (differential input for a stage fed differentially), V.</summary>
    private static double InputPeak(TransientResult transient, double from, StageProbe stage)
    {
        var time = transient.Time;
        var input = Voltage(transient, stage.InputNode, time.Count);
        var reference = Voltage(transient, stage.ReferenceInputNode, time.Count);
        double peak = 0;
        for (int i = FirstIndex(time, from); i < time.Count; i++)
        {
            peak = Math.Max(peak, Math.Abs(input[i] - reference[i]));
        }

        return peak;
    }

    private static int FirstIndex(IReadOnlyList<double> time, double from)
    {
        for (int i = 0; i < time.Count; i++)
        {
            if (time[i] >= from)
            {
                return i;
            }
        }

        return time.Count - 1;
    }

    private static double[] Voltage(TransientResult transient, string node, int count) =>
        !transient.HasNode(node) ? new double[count] : transient.Voltage(node);

    /// <summary>The highest frequency in a source waveform (a sum's fastest term), Hz; null when it has none.</summary>
    internal static double? HighestFrequency(Simulation.Waveforms.Waveform waveform) => waveform switch
    {
        SineWaveform s => s.Frequency,
        TriangleWaveform t => t.Frequency,
        PulseWaveform p => 1 / p.Period,
        SumWaveform sum => sum.Terms.Select(HighestFrequency).Max(),
        _ => null,
    };
}
