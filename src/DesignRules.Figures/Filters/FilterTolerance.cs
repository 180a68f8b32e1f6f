using DesignRules.Blocks;
using DesignRules.Elaboration;
using DesignRules.Figures.Tolerance;
using DesignRules.Model;

namespace DesignRules.Figures.Filters;

/// <summary>
/// The spread of a filter stage's f0, Q and pass-band gain over its resistor and capacitor tolerances: the extreme-value
/// worst case over every vertex of the tolerance box (up to 2^10 corners; beyond that the vertices the one-at-a-time
/// sensitivities point to), and a seeded Monte Carlo with the rule set's sample count, seed and distribution (the same
/// per-sample draws as the transfer's Monte Carlo). Each corner and sample copies the nominal chain's circuit with the changed
/// resistor and capacitor values (<see cref="Circuit.WithValues"/>; the design is not elaborated again) and measures it with
/// <see cref="FilterFigures.Measure"/>.
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

    public static FilterTolerance? Run(DesignAnalyses analyses, StageProbe stage, FilterResponse ideal)
    {
        var chain = analyses.Chain(BandEnd.Top);
        var nominal = analyses.Filter(stage);
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
            return FilterFigures.Measure(chain with { Circuit = chain.Circuit.WithValues(values) }, stage, ideal, edges: false);
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

        var settings = analyses.MonteCarlo;
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
