using DesignRules.Elaboration;
using DesignRules.Model;
using DesignRules.Simulation;

namespace DesignRules.Figures.SlewSaturation;

/// <summary>The zero-crossing glitch of one rectifying stage at one band end.</summary>
/// <param name="Width">Longest time the output stays outside the band around the ideal transfer after an input zero crossing, s.</param>
/// <param name="Tolerance">Half-width of that band, V.</param>
/// <param name="Delay">The stage's linear delay taken out before comparing, s.</param>
internal sealed record StageGlitch(double Width, double Tolerance, double Delay);

/// <summary>
/// Measures the zero-crossing glitch at a rectifying stage's output against its ideal transfer: the stage output is
/// compared with the ideal transfer of its own input (engine <see cref="TransferError"/>), after taking out the stage's
/// small linear delay (the delay, up to 5 % of the period, that best fits the output where the input is at least half
/// its peak, far from any crossing), so that a plain phase lag — a bandwidth matter — is not counted as a glitch.
/// The fit uses only points where every amplifier of the stage works linearly: not slew-limited, not at a swing limit,
/// and settled since (<see cref="SettleTimeConstants"/> closed-loop time constants NG/(2π·GBW) after the last such point).
/// Otherwise, when a slow amplifier's slewing after a crossing reaches into the fitted region, the fit takes part of the
/// slewing time for delay, and the glitch measured against that delayed ideal comes out longer than the output is wrong.
/// </summary>
internal static class ZeroCrossingGlitch
{
    private const double FitLevel = 0.5;
    private const double MaxDelayFraction = 0.05;
    private const int GridSteps = 40;

    /// <summary>Closed-loop time constants after slewing or clipping before a point counts as linear (e^−10 of the step left).</summary>
    private const double SettleTimeConstants = 10;

    /// <summary>Fewest linear points the fit needs; with fewer the fit uses every point at the fit level.</summary>
    private const int FewestLinearPoints = 20;

    /// <summary>
    /// The glitch of a rectifying stage (the rules decide which stages rectify), or null when the source has no frequency
    /// or the signal is too small to measure.
    /// </summary>
    /// <param name="band">The band end's waveforms.</param>
    /// <param name="stage">The stage.</param>
    /// <param name="bandFraction">Half-width of the error band as a fraction of the ideal output's peak.</param>
    public static StageGlitch? Of(BandWaveforms band, StageProbe stage, double bandFraction)
    {
        if (band.Frequency is not { } frequency)
        {
            return null;
        }

        var transient = band.Transient;
        var time = transient.Time;
        var input = transient.Voltage(stage.InputNode);
        if (!Circuit.IsReference(stage.ReferenceInputNode) && transient.HasNode(stage.ReferenceInputNode))
        {
            var reference = transient.Voltage(stage.ReferenceInputNode);
            input = input.Select((v, i) => v - reference[i]).ToArray();
        }

        var output = transient.Voltage(stage.OutputNode);
        var ideal = stage.Transfer.At;
        int first = 0;
        while (first < time.Count - 1 && time[first] < band.From)
        {
            first++;
        }

        double peakInput = 0, peakIdeal = 0;
        for (int i = first; i < time.Count; i++)
        {
            peakInput = Math.Max(peakInput, Math.Abs(input[i]));
            peakIdeal = Math.Max(peakIdeal, Math.Abs(ideal(input[i])));
        }

        double tolerance = bandFraction * peakIdeal;
        if (!(tolerance > 0))
        {
            return null;
        }

        var linear = LinearPoints(transient, stage, first);
        double level = peakInput * FitLevel;
        if (Enumerable.Range(first, time.Count - first).Count(i => linear[i] && Math.Abs(input[i]) >= level) < FewestLinearPoints)
        {
            Array.Fill(linear, true);
        }

        double delay = FitDelay(time, input, output, ideal, first, level, MaxDelayFraction / frequency, linear);
        var delayed = time.Select(t => At(time, input, t - delay)).ToArray();

        // A static error in a half-cycle (the output pulled off its ideal by a load returned to another voltage while the
        // diode blocks) is not a glitch: it is there at the half-cycle's peak as much as after the crossing, and the
        // transfer and loading rules judge it. Where a half-cycle's typical error far from the crossings (its median where
        // |input| is above half its peak) is outside the band, the ideal of that half-cycle is moved by it, so that only
        // what follows a zero crossing is measured.
        var (positive, positiveSpread) = StaticError(time, delayed, output, ideal, first, level, linear, 1);
        var (negative, negativeSpread) = StaticError(time, delayed, output, ideal, first, level, linear, -1);
        // Static means steady: an error that changes across the half-cycle (a slow amplifier still recovering) is the glitch.
        positive = Math.Abs(positive) > tolerance && positiveSpread <= tolerance ? positive : 0;
        negative = Math.Abs(negative) > tolerance && negativeSpread <= tolerance ? negative : 0;
        Func<double, double> judged = positive == 0 && negative == 0 ? ideal : x => ideal(x) + (x >= 0 ? positive : negative);
        var error = TransferError.Measure(time, delayed, output, judged, tolerance, band.From);
        return new StageGlitch(error.WorstGlitchWidth, tolerance, delay);
    }

    /// <summary>Per time point: true when every amplifier of the stage has worked linearly (and settled) up to it.</summary>
    private static bool[] LinearPoints(TransientResult transient, StageProbe stage, int first)
    {
        var time = transient.Time;
        var linear = new bool[time.Count];
        Array.Fill(linear, true);
        foreach (var amp in stage.Amplifiers)
        {
            var trace = transient.Amplifier(amp.ElementId);
            double noiseGain = NoiseGain.Of(stage.Stage, amp.Slot) ?? 1;
            double settle = SettleTimeConstants * noiseGain / (2 * Math.PI * amp.Model.GainBandwidth);
            double lastNonlinear = double.NegativeInfinity;
            for (int i = Math.Max(0, first - 1); i < time.Count; i++)
            {
                if (trace.SlewLimited[i] || trace.AtSwingLimit[i])
                {
                    lastNonlinear = time[i];
                }

                if (time[i] - lastNonlinear < settle)
                {
                    linear[i] = false;
                }
            }
        }

        return linear;
    }

    /// <summary>
    /// The median of output − ideal over the points of one half-cycle sign where |input| is at least <paramref name="level"/>,
    /// and the spread between its quartiles, V.
    /// </summary>
    private static (double Median, double Spread) StaticError(IReadOnlyList<double> time, double[] input, double[] output, Func<double, double> ideal, int first, double level, bool[] linear, int sign)
    {
        var errors = new List<double>();
        for (int i = first; i < time.Count; i++)
        {
            if (sign * input[i] >= level && linear[i])
            {
                errors.Add(output[i] - ideal(input[i]));
            }
        }

        if (errors.Count == 0)
        {
            return (0, 0);
        }

        errors.Sort();
        return (errors[errors.Count / 2], errors[3 * errors.Count / 4] - errors[errors.Count / 4]);
    }

    private static double FitDelay(IReadOnlyList<double> time, double[] input, double[] output, Func<double, double> ideal, int first, double level, double maxDelay, bool[] linear)
    {
        double Cost(double delay)
        {
            double sum = 0;
            for (int i = first; i < time.Count; i++)
            {
                if (Math.Abs(input[i]) < level || !linear[i])
                {
                    continue;
                }

                double e = output[i] - ideal(At(time, input, time[i] - delay));
                sum += e * e;
            }

            return sum;
        }

        double step = maxDelay / GridSteps, best = 0, bestCost = Cost(0);
        for (int k = 1; k <= GridSteps; k++)
        {
            double c = Cost(k * step);
            if (c < bestCost)
            {
                bestCost = c;
                best = k * step;
            }
        }

        double centre = best;
        for (int k = -GridSteps / 4; k <= GridSteps / 4; k++)
        {
            double d = centre + (k * step / (GridSteps / 4.0));
            if (d < 0 || d > maxDelay)
            {
                continue;
            }

            double c = Cost(d);
            if (c < bestCost)
            {
                bestCost = c;
                best = d;
            }
        }

        return best;
    }

    /// <summary>Linear interpolation on the transient's time grid (held at the ends).</summary>
    private static double At(IReadOnlyList<double> time, double[] values, double t)
    {
        int count = time.Count;
        if (t <= time[0])
        {
            return values[0];
        }

        if (t >= time[count - 1])
        {
            return values[count - 1];
        }

        int lo = 0, hi = count - 1;
        while (hi - lo > 1)
        {
            int mid = (lo + hi) >>> 1;
            if (time[mid] <= t)
            {
                lo = mid;
            }
            else
            {
                hi = mid;
            }
        }

        double span = time[hi] - time[lo];
        return span > 0 ? values[lo] + ((values[hi] - values[lo]) * (t - time[lo]) / span) : values[hi];
    }
}
