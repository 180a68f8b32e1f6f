using System.Numerics;
using DesignRules.Blocks;
using DesignRules.Elaboration;
using DesignRules.Model;
using DesignRules.Simulation;

namespace DesignRules.Figures.Filters;

/// <summary>f0, Q and pass-band gain of a filter stage as the engine's AC analysis of the built circuit shows them.</summary>
/// <param name="F0">Natural (centre) frequency, Hz.</param>
/// <param name="Q">Quality factor.</param>
/// <param name="PassbandGain">Gain magnitude in the pass band (at the centre for a band-pass).</param>
/// <param name="LowerMinus3Db">The −3 dB frequency below the pass band (high-pass, band-pass), Hz; NaN otherwise.</param>
/// <param name="UpperMinus3Db">The −3 dB frequency above the pass band (low-pass, band-pass), Hz; NaN otherwise.</param>
internal sealed record MeasuredFilter(double F0, double Q, double PassbandGain, double LowerMinus3Db, double UpperMinus3Db);

/// <summary>
/// Measures a filter stage from the engine: an AC sweep of the whole chain around the ideal f0 (20 points per decade,
/// f0/10 … 10·f0), the stage's response H = v(out)/v(in), and from it f0 where the second-order denominator is purely
/// imaginary — Re(H·sign K) changes sign for a low- and high-pass, Im(H·sign K) for a band-pass — Q as |H(f0)|/K for a
/// low- and high-pass (K at f0/1000 or 30·f0) and as f0 over the −3 dB
/// width for a band-pass (standard second-order relations). Each crossing found on the coarse sweep is refined on a
/// second sweep of 32 points inside its interval, then interpolated linearly in log-frequency.
/// </summary>
internal static class FilterFigures
{
    public const int PointsPerDecade = 20;

    private const int RefinePoints = 32;

    /// <summary>Measures f0, Q and K; with <paramref name="edges"/> also the −3 dB frequencies (a band-pass always needs them for Q).</summary>
    public static MeasuredFilter? Measure(ElaboratedChain chain, StageProbe stage, FilterResponse ideal, bool edges = true)
    {
        // One sweep holds the coarse grid and the point far into the pass band where K is read: at f0/1000 a low-pass is
        // within 1e-6 of its DC gain; at 30·f0 a high-pass within (2 − 1/Q²)/1800 of its high-frequency gain (0.06 % for
        // Q = 1), where the amplifier still has loop gain to spare.
        var f = Decades(ideal.F0 / 10, ideal.F0 * 10);
        double kAt = ideal.Shape == FilterShape.HighPass ? ideal.F0 * 30 : ideal.F0 / 1000;
        // One operating point serves the coarse sweep and every refinement: the sweeps share it (same figures, one solve).
        var sweeps = Simulate.AcSweeps(chain.Circuit);
        var all = Response(sweeps, chain, stage, [.. f, kAt]);
        if (all is null)
        {
            return null;
        }

        var h = all[..^1];
        double sign = ideal.PassbandGain < 0 ? -1 : 1;
        Func<Complex, double> quadrature = ideal.Shape == FilterShape.BandPass ? x => (x * sign).Imaginary : x => (x * sign).Real;
        var (f0, atF0) = Refine(sweeps, chain, stage, f, h.Select(quadrature).ToArray(), 0, up: true, quadrature);
        double k = ideal.Shape == FilterShape.BandPass ? atF0 : all[^1].Magnitude;
        double lower = double.NaN, upper = double.NaN;
        if (edges || ideal.Shape == FilterShape.BandPass)
        {
            Func<Complex, double> level = x => x.Magnitude - (k / Math.Sqrt(2));
            var levels = h.Select(level).ToArray();
            int peak = Array.IndexOf(levels, levels.Max());
            if (ideal.Shape != FilterShape.LowPass) lower = Refine(sweeps, chain, stage, f, levels, ideal.Shape == FilterShape.HighPass ? levels.Length - 1 : peak, up: false, level).At;
            if (ideal.Shape != FilterShape.HighPass) upper = Refine(sweeps, chain, stage, f, levels, ideal.Shape == FilterShape.LowPass ? 0 : peak, up: true, level).At;
        }

        double q = ideal.Shape == FilterShape.BandPass ? f0 / (upper - lower) : atF0 / k;
        return double.IsFinite(f0) && double.IsFinite(q) && k > 0 ? new MeasuredFilter(f0, q, k, lower, upper) : null;
    }

    /// <summary>The stage's response v(out)/v(in) at the given frequencies; null when the AC analysis failed.</summary>
    private static Complex[]? Response(Simulate.AcSweepSession sweeps, ElaboratedChain chain, StageProbe stage, double[] frequencies)
    {
        var ac = sweeps.Run(AcSweep.List(chain.SourceId, frequencies));
        if (!ac.Succeeded)
        {
            return null;
        }

        var vin = ac.Voltage(stage.InputNode);
        var vout = ac.Voltage(stage.OutputNode);
        return vin.Select((v, i) => v == Complex.Zero ? Complex.Zero : vout[i] / v).ToArray();
    }

    /// <summary>
    /// The sign change of <paramref name="y"/> nearest <paramref name="start"/> in one direction, refined on a fine sweep of
    /// its interval (steps of 0.2 % at 20 points per decade), with |H| there; NaN if none.
    /// </summary>
    private static (double At, double Magnitude) Refine(Simulate.AcSweepSession sweeps, ElaboratedChain chain, StageProbe stage, double[] f, double[] y, int start, bool up, Func<Complex, double> of)
    {
        int i = up ? Next(y, start) : Previous(y, start);
        if (i < 0)
        {
            return (double.NaN, double.NaN);
        }

        var fine = Geometric(f[i - 1], f[i], RefinePoints);
        var h = Response(sweeps, chain, stage, fine);
        if (h is null)
        {
            return (Between(f[i - 1], f[i], y[i - 1], y[i]), double.NaN);
        }

        var fy = h.Select(of).ToArray();
        for (int n = 1; n < fine.Length; n++)
        {
            if (Math.Sign(fy[n - 1]) != Math.Sign(fy[n]) || fy[n] == 0)
            {
                double at = Between(fine[n - 1], fine[n], fy[n - 1], fy[n]);
                double t = (Math.Log(at) - Math.Log(fine[n - 1])) / (Math.Log(fine[n]) - Math.Log(fine[n - 1]));
                return (at, h[n - 1].Magnitude + ((h[n].Magnitude - h[n - 1].Magnitude) * t));
            }
        }

        return (double.NaN, double.NaN);
    }

    private static int Next(double[] y, int start)
    {
        for (int i = start + 1; i < y.Length; i++) if (Math.Sign(y[i - 1]) != Math.Sign(y[i]) || y[i] == 0) return i;
        return -1;
    }

    private static int Previous(double[] y, int start)
    {
        for (int i = start; i > 0; i--) if (Math.Sign(y[i - 1]) != Math.Sign(y[i]) || y[i - 1] == 0) return i;
        return -1;
    }

    private static double[] Decades(double start, double stop) =>
        Geometric(start, stop, (int)Math.Round(Math.Log10(stop / start) * PointsPerDecade) + 1);

    private static double[] Geometric(double start, double stop, int count) =>
        Enumerable.Range(0, count).Select(i => start * Math.Pow(stop / start, i / (double)(count - 1))).ToArray();

    /// <summary>The attenuation |K| / |H(f)| of the stage at one frequency, from its own AC point.</summary>
    public static double? Attenuation(ElaboratedChain chain, StageProbe stage, double frequency, double passbandGain)
    {
        var ac = Simulate.AcSweep(chain.Circuit, AcSweep.List(chain.SourceId, frequency));
        if (!ac.Succeeded)
        {
            return null;
        }

        var vin = ac.Voltage(stage.InputNode)[0];
        var h = vin == Complex.Zero ? 0 : (ac.Voltage(stage.OutputNode)[0] / vin).Magnitude;
        return h > 0 ? passbandGain / h : double.PositiveInfinity;
    }

    /// <summary>The first frequency after index <paramref name="start"/> where <paramref name="y"/> changes sign, log-interpolated; NaN if none.</summary>
    internal static double ZeroCrossing(IReadOnlyList<double> f, double[] y, int start)
    {
        for (int i = start + 1; i < y.Length; i++)
        {
            if (Math.Sign(y[i - 1]) != Math.Sign(y[i]) || y[i] == 0) return Between(f[i - 1], f[i], y[i - 1], y[i]);
        }

        return double.NaN;
    }

    private static double Between(double fa, double fb, double ya, double yb)
    {
        double t = ya == yb ? 0 : ya / (ya - yb);
        double la = Math.Log10(fa), lb = Math.Log10(fb);
        return Math.Pow(10, la + ((lb - la) * t));
    }
}
