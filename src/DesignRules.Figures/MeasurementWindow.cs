using DesignRules.Elaboration;
using DesignRules.Simulation;

namespace DesignRules.Figures;

/// <summary>Where in a settled transient the figures are measured.</summary>
internal static class MeasurementWindow
{
    /// <summary>The measurement window: the last whole periods after start-up, or the window after start-up for a DC source.</summary>
    public static (double Start, double End) Of(ElaboratedChain chain, TransientResult result)
    {
        double end = result.Time[^1];
        double from = Math.Min(chain.Window.MeasureFrom, end);
        if (chain.Period is not { } period || !(period > 0))
        {
            return (from, end);
        }

        int periods = (int)Math.Floor(((end - from) / period) + 1e-9);
        return periods < 1 ? (from, end) : (end - (periods * period), end);
    }

    /// <summary>
    /// Average over [start, end] by the trapezoidal rule on the transient's own time points, interpolating linearly at the
    /// window's ends; the last value when the window is empty.
    /// </summary>
    public static double Average(IReadOnlyList<double> time, double[] v, double start, double end)
    {
        if (!(end > start))
        {
            return v[^1];
        }

        double sum = 0;
        for (int i = 1; i < time.Count; i++)
        {
            double t0 = Math.Max(time[i - 1], start), t1 = Math.Min(time[i], end);
            if (t1 <= t0)
            {
                continue;
            }

            double span = time[i] - time[i - 1];
            double va = v[i - 1] + ((v[i] - v[i - 1]) * (t0 - time[i - 1]) / span);
            double vb = v[i - 1] + ((v[i] - v[i - 1]) * (t1 - time[i - 1]) / span);
            sum += 0.5 * (va + vb) * (t1 - t0);
        }

        return sum / (end - start);
    }

    /// <summary>
    /// The transient's values linearly interpolated onto <paramref name="grid"/> (plots want a uniform grid; the engine's
    /// accepted time points are not uniform); held at the first and last value outside the run.
    /// </summary>
    public static double[] Resample(IReadOnlyList<double> time, double[] values, double[] grid)
    {
        var result = new double[grid.Length];
        var j = 0;
        for (var i = 0; i < grid.Length; i++)
        {
            while (j < time.Count - 2 && time[j + 1] < grid[i])
            {
                j++;
            }

            var span = time[j + 1] - time[j];
            var w = span <= 0 ? 0 : Math.Clamp((grid[i] - time[j]) / span, 0, 1);
            result[i] = values[j] + (w * (values[j + 1] - values[j]));
        }

        return result;
    }
}
