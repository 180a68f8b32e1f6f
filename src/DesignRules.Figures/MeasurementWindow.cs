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

    /// <summary>Average of f(sample) over [start, end] by the trapezoidal rule on the transient's own time points.</summary>
    public static double Average(IReadOnlyList<double> time, Func<int, double> f, double start, double end)
    {
        double sum = 0, span = 0;
        for (int i = 1; i < time.Count; i++)
        {
            if (time[i - 1] < start - 1e-15 || time[i] > end + 1e-15)
            {
                continue;
            }

            double dt = time[i] - time[i - 1];
            sum += 0.5 * (f(i) + f(i - 1)) * dt;
            span += dt;
        }

        return span > 0 ? sum / span : f(time.Count - 1);
    }
}
