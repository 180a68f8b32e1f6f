using MathNet.Numerics.Distributions;

namespace DesignRules.Rules.Evaluation.Tolerance;

/// <summary>
/// The Clopper–Pearson ("exact") confidence interval of a binomial proportion, from the quantiles of the Beta
/// distribution (Clopper and Pearson, Biometrika 1934): with k passes in n samples and 1 − α confidence,
/// lower = B(α/2; k, n − k + 1) and upper = B(1 − α/2; k + 1, n − k), with lower = 0 when k = 0 and upper = 1 when k = n.
/// The interval is conservative: it covers the true proportion at least at its stated rate.
/// </summary>
internal static class ClopperPearson
{
    /// <summary>The most samples the "samples needed" search considers; beyond it a requirement is out of practical reach.</summary>
    public const int SearchCap = 100_000_000;

    /// <summary>The two-sided interval at <paramref name="confidence"/> (e.g. 0.95) for <paramref name="passes"/> of <paramref name="samples"/>.</summary>
    public static (double Lower, double Upper) Interval(int passes, int samples, double confidence)
    {
        if (samples <= 0)
        {
            return (0, 1);
        }

        double tail = (1 - confidence) / 2;
        return (Lower(passes, samples, tail), Upper(passes, samples, tail));
    }

    /// <summary>
    /// The one-sided lower bound with <paramref name="tail"/> probability below it (α/2 for a two-sided interval, α for a
    /// one-sided bound). Real-valued <paramref name="passes"/> are allowed: the Beta quantile is defined for them, which
    /// lets <see cref="SamplesToShow"/> hold a failure rate fixed while the sample count grows.
    /// </summary>
    public static double Lower(double passes, double samples, double tail)
    {
        if (passes <= 0)
        {
            return 0;
        }

        if (passes >= samples)
        {
            // Beta(n, 1) has the CDF x^n, so its quantile is closed-form; it is also what the general call returns.
            return Math.Pow(tail, 1 / samples);
        }

        return Beta.InvCDF(passes, samples - passes + 1, tail);
    }

    /// <summary>The one-sided upper bound with <paramref name="tail"/> probability above it.</summary>
    public static double Upper(double passes, double samples, double tail)
    {
        if (passes >= samples)
        {
            return 1;
        }

        if (passes <= 0)
        {
            return 1 - Math.Pow(tail, 1 / samples);
        }

        return Beta.InvCDF(passes + 1, samples - passes, 1 - tail);
    }

    /// <summary>
    /// The smallest sample count whose two-sided lower bound would reach <paramref name="required"/> if the observed yield
    /// held exactly; null when the observed yield does not exceed the requirement (no sample count can then show it) or
    /// the count would exceed <see cref="SearchCap"/>. The search is a bounded doubling followed by bisection.
    /// </summary>
    public static long? SamplesToShow(double observedYield, double required, double confidence)
    {
        if (!(observedYield > required) || !(required > 0) || required >= 1 || !(confidence is > 0 and < 1))
        {
            return null;
        }

        double tail = (1 - confidence) / 2;
        bool Shows(long n) => Lower(observedYield * n, n, tail) >= required;
        long high = 1;
        while (!Shows(high))
        {
            if (high >= SearchCap)
            {
                return null;
            }

            high = Math.Min(high * 2, SearchCap);
        }

        long low = high / 2;
        while (high - low > 1)
        {
            long mid = low + ((high - low) / 2);
            if (Shows(mid))
            {
                high = mid;
            }
            else
            {
                low = mid;
            }
        }

        return high;
    }
}
