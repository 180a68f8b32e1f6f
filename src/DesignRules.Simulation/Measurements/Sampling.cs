namespace DesignRules.Simulation.Measurements;

/// <summary>Interpolation and integration on the variable time grid of a transient result.</summary>
internal static class Sampling
{
    /// <summary>Linear interpolation of <paramref name="values"/> at <paramref name="t"/> (held at the ends).</summary>
    public static double At(IReadOnlyList<double> time, IReadOnlyList<double> values, double t)
    {
        int count = time.Count;
        if (t <= time[0]) return values[0];
        if (t >= time[count - 1]) return values[count - 1];
        int lo = 0, hi = count - 1;
        while (hi - lo > 1)
        {
            int mid = (lo + hi) >>> 1;
            if (time[mid] <= t) lo = mid; else hi = mid;
        }

        double span = time[hi] - time[lo];
        return span > 0 ? values[lo] + ((values[hi] - values[lo]) * (t - time[lo]) / span) : values[hi];
    }

    /// <summary>Trapezoidal integral of f(value) over [start, end], with the ends interpolated.</summary>
    public static double Integrate(IReadOnlyList<double> time, IReadOnlyList<double> values, double start, double end, Func<double, double> f)
    {
        double sum = 0, tPrev = start, vPrev = f(At(time, values, start));
        for (int i = 0; i < time.Count; i++)
        {
            double t = time[i];
            if (t <= start) continue;
            if (t >= end) break;
            double v = f(values[i]);
            sum += 0.5 * (v + vPrev) * (t - tPrev);
            tPrev = t;
            vPrev = v;
        }

        double vEnd = f(At(time, values, end));
        return sum + (0.5 * (vEnd + vPrev) * (end - tPrev));
    }

    /// <summary>Checks that a time series is usable; returns a reason when it is not.</summary>
    public static string? Check(IReadOnlyList<double> time, IReadOnlyList<double> values)
    {
        ArgumentNullException.ThrowIfNull(time);
        ArgumentNullException.ThrowIfNull(values);
        if (time.Count != values.Count) return "time and values differ in length";
        if (time.Count < 2) return "fewer than two points";
        return null;
    }

    /// <summary>The last whole number of periods ending at the last time point and starting no earlier than <paramref name="from"/>.</summary>
    public static (double Start, double End, int Periods) WholePeriods(IReadOnlyList<double> time, double period, double from)
    {
        double end = time[^1];
        double begin = Math.Max(from, time[0]);
        int periods = (int)Math.Floor(((end - begin) / period) + 1e-9);
        return (end - (periods * period), end, periods);
    }
}
