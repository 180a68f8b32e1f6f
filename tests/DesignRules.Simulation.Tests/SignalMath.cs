namespace DesignRules.Simulation.Tests;

/// <summary>Small helpers the tests use to read waveforms (interpolation, sine fitting).</summary>
internal static class SignalMath
{
    public static double Interpolate(IReadOnlyList<double> time, IReadOnlyList<double> values, double t)
    {
        if (t <= time[0]) return values[0];
        if (t >= time[^1]) return values[^1];
        int lo = 0, hi = time.Count - 1;
        while (hi - lo > 1)
        {
            int mid = (lo + hi) / 2;
            if (time[mid] <= t) lo = mid; else hi = mid;
        }

        double f = (t - time[lo]) / (time[hi] - time[lo]);
        return values[lo] + (f * (values[hi] - values[lo]));
    }

    /// <summary>Amplitude and phase (radians, of sin) of the fundamental over [start, start + period], from a fine resampling.</summary>
    public static (double Amplitude, double Phase) FitSine(IReadOnlyList<double> time, IReadOnlyList<double> values, double frequency, double start)
    {
        const int n = 4096;
        double period = 1 / frequency, a = 0, b = 0;
        for (int i = 0; i < n; i++)
        {
            double t = start + (period * i / n);
            double v = Interpolate(time, values, t);
            double w = 2 * Math.PI * frequency * t;
            a += v * Math.Sin(w);
            b += v * Math.Cos(w);
        }

        a *= 2.0 / n;
        b *= 2.0 / n;
        return (Math.Sqrt((a * a) + (b * b)), Math.Atan2(b, a));
    }
}
