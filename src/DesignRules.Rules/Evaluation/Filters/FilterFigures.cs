using System.Numerics;
using DesignRules.Blocks;
using DesignRules.Elaboration;
using DesignRules.Model;
using DesignRules.Rules.Evaluation.Tolerance;
using DesignRules.Simulation;

namespace DesignRules.Rules.Evaluation.Filters;

/// <summary>f0, Q and pass-band gain of a filter stage as the engine's AC analysis of the built circuit shows them.</summary>
/// <param name="F0">Natural (centre) frequency, Hz.</param>
/// <param name="Q">Quality factor.</param>
/// <param name="PassbandGain">Gain magnitude in the pass band (at the centre for a band-pass).</param>
/// <param name="Frequencies">The swept frequencies, Hz.</param>
/// <param name="Response">The stage's response v(out)/v(in) at each frequency.</param>
internal sealed record MeasuredFilter(double F0, double Q, double PassbandGain, IReadOnlyList<double> Frequencies, Complex[] Response)
{
    /// <summary>
    /// The −3 dB frequencies (|H| = K/√2) that bound the pass band, Hz: the upper one of a low-pass, the lower one of a
    /// high-pass, both of a band-pass; NaN where the sweep does not reach one.
    /// </summary>
    public (double Low, double High) MinusThreeDb(FilterShape shape)
    {
        var level = Response.Select(h => h.Magnitude - (PassbandGain / Math.Sqrt(2))).ToArray();
        int peak = Array.IndexOf(level, level.Max());
        return shape switch
        {
            FilterShape.LowPass => (double.NaN, FilterFigures.ZeroCrossing(Frequencies, level, 0)),
            FilterShape.HighPass => (FilterFigures.ZeroCrossingBelow(Frequencies, level, level.Length - 1), double.NaN),
            _ => (FilterFigures.ZeroCrossingBelow(Frequencies, level, peak), FilterFigures.ZeroCrossing(Frequencies, level, peak)),
        };
    }
}

/// <summary>
/// Measures a filter stage from the engine: an AC sweep of the whole chain around the ideal f0 (40 points per decade,
/// f0/10 … 10·f0), the stage's response H = v(out)/v(in), and from it f0 where the second-order denominator is purely
/// imaginary — Re(H·sign K) changes sign for a low- and high-pass, Im(H·sign K) for a band-pass — Q as |H(f0)|/K for a
/// low- and high-pass (K at f0/10 or 10·f0, within 0.01 % of the pass-band gain for Q near 0.7) and as f0 over the −3 dB
/// width for a band-pass (standard second-order relations), each crossing interpolated linearly in log-frequency.
/// </summary>
internal static class FilterFigures
{
    public const int PointsPerDecade = 40;

    public static MeasuredFilter? Measure(ElaboratedChain chain, StageProbe stage, FilterResponse ideal)
    {
        var sweep = AcSweep.Decades(chain.SourceId, ideal.F0 / 10, ideal.F0 * 10, PointsPerDecade);
        var ac = Simulate.AcSweep(chain.Circuit, sweep);
        if (!ac.Succeeded)
        {
            return null;
        }

        var vin = ac.Voltage(stage.InputNode);
        var vout = ac.Voltage(stage.OutputNode);
        var f = ac.Frequencies;
        var h = new Complex[f.Count];
        for (int i = 0; i < h.Length; i++) h[i] = vin[i] == Complex.Zero ? Complex.Zero : vout[i] / vin[i];
        double sign = ideal.PassbandGain < 0 ? -1 : 1;
        var signed = h.Select(x => x * sign).ToArray();
        double f0, q, k;
        if (ideal.Shape == FilterShape.BandPass)
        {
            f0 = ZeroCrossing(f, signed.Select(x => x.Imaginary).ToArray(), 0);
            k = Interpolate(f, h.Select(x => x.Magnitude).ToArray(), f0);
            var level = h.Select(x => x.Magnitude - (k / Math.Sqrt(2))).ToArray();
            int peak = Array.IndexOf(level, level.Max());
            double low = ZeroCrossingBelow(f, level, peak);
            double high = ZeroCrossing(f, level, peak);
            q = f0 / (high - low);
        }
        else
        {
            f0 = ZeroCrossing(f, signed.Select(x => x.Real).ToArray(), 0);
            k = ideal.Shape == FilterShape.LowPass ? h[0].Magnitude : h[^1].Magnitude;
            q = Interpolate(f, h.Select(x => x.Magnitude).ToArray(), f0) / k;
        }

        return double.IsFinite(f0) && double.IsFinite(q) && k > 0 ? new MeasuredFilter(f0, q, k, f, h) : null;
    }

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

    /// <summary>The last frequency before index <paramref name="start"/> where <paramref name="y"/> changes sign, searching downwards; NaN if none.</summary>
    internal static double ZeroCrossingBelow(IReadOnlyList<double> f, double[] y, int start)
    {
        for (int i = start; i > 0; i--)
        {
            if (Math.Sign(y[i - 1]) != Math.Sign(y[i]) || y[i - 1] == 0) return Between(f[i - 1], f[i], y[i - 1], y[i]);
        }

        return double.NaN;
    }

    private static double Between(double fa, double fb, double ya, double yb)
    {
        double t = ya == yb ? 0 : ya / (ya - yb);
        double la = Math.Log10(fa), lb = Math.Log10(fb);
        return Math.Pow(10, la + ((lb - la) * t));
    }

    private static double Interpolate(IReadOnlyList<double> f, double[] y, double at)
    {
        for (int i = 1; i < f.Count; i++)
        {
            if (f[i] >= at)
            {
                double t = (Math.Log10(at) - Math.Log10(f[i - 1])) / (Math.Log10(f[i]) - Math.Log10(f[i - 1]));
                return y[i - 1] + ((y[i] - y[i - 1]) * t);
            }
        }

        return double.NaN;
    }
}

/// <summary>
/// The spread of a filter stage's f0, Q and pass-band gain over its resistor and capacitor tolerances: the extreme-value
/// worst case over every vertex of the tolerance box (up to 2^10 corners; beyond that the vertices the one-at-a-time
/// sensitivities point to), and a seeded Monte Carlo with the rule set's sample count, seed and distribution (the same
/// per-sample draws as the transfer's Monte Carlo). Each corner and sample re-elaborates the chain with the changed values
/// (the elaborator's value overrides) and measures it with <see cref="FilterFigures.Measure"/>.
/// </summary>
/// <param name="Nominal">The nominal figures.</param>
/// <param name="F0">Lowest and highest f0 over the corners, Hz.</param>
/// <param name="Q">Lowest and highest Q over the corners.</param>
/// <param name="Gain">Lowest and highest pass-band gain over the corners.</param>
/// <param name="Samples">Monte Carlo samples: f0, Q, gain (NaN where a sample could not be solved).</param>
/// <param name="Corners">Corners evaluated.</param>
internal sealed record FilterTolerance(MeasuredFilter Nominal, Interval F0, Interval Q, Interval Gain, (double F0, double Q, double Gain)[] Samples, int Corners)
{
    public const int MaxEnumerated = 10;

    public static FilterTolerance? Run(DesignEvaluation evaluation, StageProbe stage, FilterResponse ideal)
    {
        var chain = evaluation.Analyses.Chain(BandEnd.Top);
        var nominal = FilterFigures.Measure(chain, stage, ideal);
        if (nominal is null)
        {
            return null;
        }

        var parts = stage.Components
            .Where(c => c.Kind is ElementKind.Resistor or ElementKind.Capacitor)
            .Select(c => (c.ElementId, c.NominalValue, Tolerance: Math.Abs(c.Kind == ElementKind.Resistor
                ? c.ResistorFamily?.Tolerance.Value.Value ?? 0
                : c.CapacitorFamily?.Tolerance.Value.Value ?? 0)))
            .Where(p => p.Tolerance > 0)
            .OrderBy(p => p.ElementId, StringComparer.Ordinal)
            .ToArray();

        MeasuredFilter? At(double[] u)
        {
            var values = new Dictionary<string, double>(StringComparer.Ordinal);
            for (int i = 0; i < parts.Length; i++) values[parts[i].ElementId] = parts[i].NominalValue * (1 + (u[i] * parts[i].Tolerance));
            var built = ChainElaborator.Elaborate(evaluation.Design, chain.Options with { Values = values });
            var probe = built.Succeeded ? built.Stage(stage.StageId) : null;
            return probe is null ? null : FilterFigures.Measure(built, probe, ideal);
        }

        var corners = new List<double[]>();
        if (parts.Length <= MaxEnumerated)
        {
            for (int mask = 0; mask < 1 << parts.Length; mask++)
            {
                corners.Add(Enumerable.Range(0, parts.Length).Select(i => (mask & (1 << i)) != 0 ? 1.0 : -1.0).ToArray());
            }
        }
        else
        {
            // One-at-a-time sensitivities, then for each figure the two vertices they point to.
            var slopes = Enumerable.Range(0, parts.Length).Select(i =>
            {
                var u = new double[parts.Length];
                u[i] = 1;
                return At(u);
            }).ToArray();
            foreach (var figure in new Func<MeasuredFilter, double>[] { m => m.F0, m => m.Q, m => m.PassbandGain })
            {
                var up = slopes.Select(m => m is null ? 1.0 : figure(m) >= figure(nominal) ? 1.0 : -1.0).ToArray();
                corners.Add(up);
                corners.Add(up.Select(x => -x).ToArray());
            }
        }

        var measured = new MeasuredFilter?[corners.Count];
        Parallel.For(0, corners.Count, i => measured[i] = At(corners[i]));
        var solved = measured.Where(m => m is not null).Select(m => m!).Append(nominal).ToList();
        static Interval Range(IEnumerable<double> xs) => new(xs.Min(), xs.Max());

        var settings = evaluation.MonteCarlo;
        int count = Math.Max(0, settings.Samples);
        var samples = new (double, double, double)[count];
        Parallel.For(0, count, i =>
        {
            var random = SampleDraws.For(settings.Seed, stage.StageId, i);
            var u = parts.Select(_ => SampleDraws.Unit(random, settings.Distribution)).ToArray();
            var m = At(u);
            samples[i] = m is null ? (double.NaN, double.NaN, double.NaN) : (m.F0, m.Q, m.PassbandGain);
        });

        return new FilterTolerance(nominal, Range(solved.Select(m => m.F0)), Range(solved.Select(m => m.Q)), Range(solved.Select(m => m.PassbandGain)),
            samples, corners.Count);
    }

    /// <summary>Fraction of Monte Carlo samples whose figure lies within <paramref name="target"/> (unsolved samples fail).</summary>
    public double YieldWithin(Func<(double F0, double Q, double Gain), double> figure, double target, double within) =>
        Samples.Length == 0 ? double.NaN : Samples.Count(s => Math.Abs((figure(s) / target) - 1) <= within) / (double)Samples.Length;
}
