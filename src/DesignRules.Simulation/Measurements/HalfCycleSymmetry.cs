namespace DesignRules.Simulation.Measurements;

/// <summary>
/// Peak of an output during the input's positive half-cycles against its peak during the negative half-cycles
/// (the symmetry of a full-wave rectifier or absolute-value circuit). Only complete half-cycles (between two input
/// zero crossings) count; each peak is the mean over the half-cycles of that sign of the largest |output|.
/// </summary>
/// <param name="PositivePeak">Mean peak |output| in positive input half-cycles.</param>
/// <param name="NegativePeak">Mean peak |output| in negative input half-cycles.</param>
/// <param name="Mismatch">PositivePeak − NegativePeak.</param>
/// <param name="RelativeMismatch">Mismatch divided by the mean of the two peaks.</param>
/// <param name="HalfCycles">Complete half-cycles used.</param>
public sealed record HalfCycleSymmetry(double PositivePeak, double NegativePeak, double Mismatch, double RelativeMismatch, int HalfCycles)
{
    /// <summary>Measures the symmetry from <paramref name="from"/> on.</summary>
    /// <param name="time">Time points, s.</param>
    /// <param name="input">Input signal that defines the half-cycles.</param>
    /// <param name="output">Output signal.</param>
    /// <param name="from">Ignore time before this, s.</param>
    public static HalfCycleSymmetry Measure(IReadOnlyList<double> time, IReadOnlyList<double> input, IReadOnlyList<double> output, double from = 0)
    {
        ArgumentNullException.ThrowIfNull(time);
        ArgumentNullException.ThrowIfNull(input);
        ArgumentNullException.ThrowIfNull(output);
        double positive = 0, negative = 0;
        int nPositive = 0, nNegative = 0;
        bool started = false;
        double peak = 0;
        int count = Math.Min(time.Count, Math.Min(input.Count, output.Count));
        for (int i = 1; i < count; i++)
        {
            if (time[i] < from) continue;
            bool crossed = (input[i - 1] < 0) != (input[i] < 0);
            if (crossed)
            {
                if (started)
                {
                    if (input[i - 1] >= 0)
                    {
                        positive += peak;
                        nPositive++;
                    }
                    else
                    {
                        negative += peak;
                        nNegative++;
                    }
                }

                started = true;
                peak = 0;
            }

            peak = Math.Max(peak, Math.Abs(output[i]));
        }

        double p = nPositive > 0 ? positive / nPositive : double.NaN;
        double n = nNegative > 0 ? negative / nNegative : double.NaN;
        double mean = 0.5 * (p + n);
        return new HalfCycleSymmetry(p, n, p - n, mean != 0 ? (p - n) / mean : double.NaN, nPositive + nNegative);
    }
}
