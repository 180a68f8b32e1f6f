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
/// <para>Where the design declares an operating range, the worst case runs at its low end, middle and high end, each part's
/// spread there being its tolerance plus |tempco|·|T − 25 °C| (as the transfer's worst case takes it, see
/// <see cref="TemperatureBehaviour"/>), and each Monte Carlo sample draws its temperature uniformly over the range.</para>
/// </summary>
/// <param name="Nominal">The nominal figures.</param>
/// <param name="F0">Lowest and highest f0 over the corners (and temperatures), Hz.</param>
/// <param name="Q">Lowest and highest Q over the corners (and temperatures).</param>
/// <param name="Gain">Lowest and highest pass-band gain over the corners (and temperatures).</param>
/// <param name="Samples">Monte Carlo samples: f0, Q, gain (NaN where a sample could not be solved).</param>
/// <param name="Corners">Corners evaluated (over every temperature).</param>
/// <param name="AtTemperatures">With a declared range: the spread at its low end, middle and high end, in that order; else empty.</param>
internal sealed record FilterTolerance(
    MeasuredFilter Nominal, Interval F0, Interval Q, Interval Gain, (double F0, double Q, double Gain)[] Samples, int Corners,
    IReadOnlyList<FilterSpreadAt> AtTemperatures)
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

        (double Low, double High)? range = analyses.Design.Temperature is { } declared ? (declared.Value.Low.Value, declared.Value.High.Value) : null;
        var parts = stage.Components
            .Where(c => c.Kind is ElementKind.Resistor or ElementKind.Capacitor)
            .Select(c => new FilterPart(c.ElementId, c.NominalValue,
                Math.Abs(c.Kind == ElementKind.Resistor ? c.ResistorFamily?.Tolerance.Value.Value ?? 0 : c.CapacitorFamily?.Tolerance.Value.Value ?? 0),
                Math.Abs(c.Kind == ElementKind.Resistor ? c.ResistorFamily?.Tempco.Value.Value ?? 0 : c.CapacitorFamily?.Tempco?.Value.Value ?? 0)))
            .Where(p => p.Tolerance > 0 || (range is not null && p.Tempco > 0))
            .OrderBy(p => p.ElementId, StringComparer.Ordinal)
            .ToArray();

        MeasuredFilter? At(double[] u, double celsius)
        {
            var values = new Dictionary<string, double>(StringComparer.Ordinal);
            for (int i = 0; i < parts.Length; i++) values[parts[i].ElementId] = parts[i].NominalValue * (1 + (u[i] * parts[i].SpreadAt(celsius)));
            return FilterFigures.Measure(chain with { Circuit = chain.Circuit.WithValues(values) }, stage, ideal, edges: false);
        }

        double[] temperatures = range is { } r ? [r.Low, (r.Low + r.High) / 2, r.High] : [TemperatureBehaviour.Reference];
        var spreads = temperatures.Select(t => Spread(nominal, parts, u => At(u, t), t, analyses.Parallelism)).ToArray();

        var settings = analyses.MonteCarlo;
        int count = Math.Max(0, settings.Samples);
        var samples = new (double, double, double)[count];
        Parallel.For(0, count, analyses.Parallelism, i =>
        {
            var random = SampleDraws.For(settings.Seed, stage.StageId, i);
            var u = parts.Select(_ => SampleDraws.Unit(random, settings.Distribution)).ToArray();

            // Drawn last, so that a design without a range keeps the samples it had.
            double celsius = range is { } span ? span.Low + ((span.High - span.Low) * random.NextDouble()) : TemperatureBehaviour.Reference;
            var m = At(u, celsius);
            samples[i] = m is null ? (double.NaN, double.NaN, double.NaN) : (m.F0, m.Q, m.PassbandGain);
        });

        static Interval Union(IEnumerable<Interval> xs) => xs.Aggregate((a, b) => a.Include(b.Low).Include(b.High));
        return new FilterTolerance(nominal, Union(spreads.Select(s => s.F0)), Union(spreads.Select(s => s.Q)), Union(spreads.Select(s => s.Gain)),
            samples, spreads.Sum(s => s.Corners), range is null ? [] : spreads);
    }

    /// <summary>The corners of the tolerance box at one temperature, measured in parallel, with the nominal figures.</summary>
    private static FilterSpreadAt Spread(MeasuredFilter nominal, FilterPart[] parts, Func<double[], MeasuredFilter?> at, double celsius, ParallelOptions parallelism)
    {
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
                return at(u);
            }).ToArray();
            foreach (var figure in new Func<MeasuredFilter, double>[] { m => m.F0, m => m.Q, m => m.PassbandGain })
            {
                var up = slopes.Select(m => m is null ? 1.0 : figure(m) >= figure(nominal) ? 1.0 : -1.0).ToArray();
                corners.Add(up);
                corners.Add(up.Select(x => -x).ToArray());
            }
        }

        var measured = new MeasuredFilter?[corners.Count];
        Parallel.For(0, corners.Count, parallelism, i => measured[i] = at(corners[i]));
        var solved = measured.Where(m => m is not null).Select(m => m!).Append(nominal).ToList();
        static Interval Range(IEnumerable<double> xs) => new(xs.Min(), xs.Max());
        return new FilterSpreadAt(celsius, Range(solved.Select(m => m.F0)), Range(solved.Select(m => m.Q)), Range(solved.Select(m => m.PassbandGain)), corners.Count);
    }

    /// <summary>Fraction of Monte Carlo samples whose figure lies within <paramref name="target"/> (unsolved samples fail).</summary>
    public double YieldWithin(Func<(double F0, double Q, double Gain), double> figure, double target, double within) =>
        Samples.Length == 0 ? double.NaN : Samples.Count(s => Math.Abs((figure(s) / target) - 1) <= within) / (double)Samples.Length;

    /// <summary>
    /// The temperature (°C) at which a figure's worst deviation from <paramref name="target"/> occurs, or null without a
    /// declared range: the end (or the middle) a finding names.
    /// </summary>
    public double? WorstTemperature(Func<FilterSpreadAt, Interval> figure, double target) =>
        AtTemperatures.Count == 0 ? null
        : AtTemperatures.MaxBy(s => Math.Max(Math.Abs((figure(s).Low / target) - 1), Math.Abs((figure(s).High / target) - 1)))!.Temperature;

    private sealed record FilterPart(string ElementId, double NominalValue, double Tolerance, double Tempco)
    {
        public double SpreadAt(double celsius) => Tolerance + (Tempco * Math.Abs(celsius - TemperatureBehaviour.Reference));
    }
}

/// <summary>The worst-case spread of a filter stage's figures at one temperature.</summary>
/// <param name="Temperature">°C.</param>
/// <param name="F0">Lowest and highest f0 over the corners, Hz.</param>
/// <param name="Q">Lowest and highest Q over the corners.</param>
/// <param name="Gain">Lowest and highest pass-band gain over the corners.</param>
/// <param name="Corners">Corners evaluated.</param>
internal sealed record FilterSpreadAt(double Temperature, Interval F0, Interval Q, Interval Gain, int Corners);
