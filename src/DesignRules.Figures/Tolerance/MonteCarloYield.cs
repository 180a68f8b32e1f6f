using DesignRules.Elaboration;
using DesignRules.Model;

namespace DesignRules.Figures.Tolerance;

/// <summary>
/// The random numbers of one Monte Carlo sample, derived from (seed, stage, sample index) alone: a SplitMix64 mix of the
/// three seeds a <see cref="Random"/> of its own. Each sample is therefore the same whichever thread draws it and in
/// whatever order, so a parallel run gives the same samples as a serial one.
/// </summary>
internal static class SampleDraws
{
    public static Random For(int seed, string stageId, int sample)
    {
        ulong h = Mix(unchecked((ulong)(uint)seed) ^ Fnv1a(stageId));
        h = Mix(h + unchecked((ulong)sample));
        return new Random((int)(h >> 33));
    }

    /// <summary>
    /// The variables of Monte Carlo sample <paramref name="sample"/> of a stage, as every run draws them (the one place the
    /// draw order is written): each resistor, each amplifier's offset, each bias, each diode, then the offset currents of
    /// parts that state one, then, with a declared operating range, the temperature uniformly over it. The later draws come
    /// last so that designs without offset currents or a range keep the samples they had.
    /// </summary>
    public static Variation Draw(WorstCaseAnalysis worstCase, MonteCarloSettings settings, int sample)
    {
        var variables = worstCase.Variables;
        var random = For(settings.Seed, worstCase.Stage.StageId, sample);
        var v = variables.Nominal;
        for (int k = 0; k < v.Resistors.Length; k++) v.Resistors[k] = Unit(random, settings.Distribution);
        for (int k = 0; k < v.Offsets.Length; k++) v.Offsets[k] = Unit(random, settings.Distribution);
        for (int k = 0; k < v.Biases.Length; k++) v.Biases[k] = Unit(random, settings.Distribution);
        for (int k = 0; k < v.Diodes.Length; k++) v.Diodes[k] = Unit(random, settings.Distribution);
        for (int k = 0; k < v.OffsetCurrents.Length; k++)
        {
            if (variables.Amplifiers[k].MaximumOffsetCurrent > 0) v.OffsetCurrents[k] = Unit(random, settings.Distribution);
        }

        return worstCase.TemperatureRange is { } range ? v with { Temperature = range.Low + ((range.High - range.Low) * random.NextDouble()) } : v;
    }

    /// <summary>A draw in −1 … +1: a normal with the extremes at ±3σ, truncated there, or a uniform.</summary>
    public static double Unit(Random random, ToleranceDistribution distribution)
    {
        if (distribution == ToleranceDistribution.Uniform)
        {
            return (2 * random.NextDouble()) - 1;
        }

        // Box–Muller, redrawn while outside ±3σ (about 0.27 % of draws); bounded, with 0 as the fallback.
        for (int attempt = 0; attempt < 64; attempt++)
        {
            double u1 = 1 - random.NextDouble();
            double u2 = random.NextDouble();
            double z = Math.Sqrt(-2 * Math.Log(u1)) * Math.Cos(2 * Math.PI * u2);
            if (Math.Abs(z) <= 3)
            {
                return z / 3;
            }
        }

        return 0;
    }

    private static ulong Mix(ulong x)
    {
        x += 0x9E3779B97F4A7C15UL;
        x = (x ^ (x >> 30)) * 0xBF58476D1CE4E5B9UL;
        x = (x ^ (x >> 27)) * 0x94D049BB133111EBUL;
        return x ^ (x >> 31);
    }

    private static ulong Fnv1a(string text)
    {
        ulong h = 14695981039346656037UL;
        foreach (char c in text)
        {
            h = (h ^ c) * 1099511628211UL;
        }

        return h;
    }
}

/// <summary>
/// Seeded Monte Carlo of one stage's DC transfer: every sample draws each resistor (nominal·(1 + u·t)), each amplifier's
/// offset voltage and bias current (u·maximum) and each diode's forward-voltage shift (u·spread), with u from the
/// rule-set's distribution (a normal with the extremes at ±3σ, truncated there, by default), sets them in the stage's
/// compiled chain (<see cref="ToleranceCircuit"/>, warm-started from the nominal solution) and measures the stage's transfer error. Samples run in parallel on every core; each sample's numbers depend only on the
/// seed, the stage and its index, so results are identical whatever the thread count. Where the design declares an
/// operating temperature range, each sample also draws its temperature uniformly over it (see <see cref="TemperatureBehaviour"/>).
/// </summary>
/// <param name="Samples">Sample count.</param>
/// <param name="Seed">Seed.</param>
/// <param name="Distribution">How tolerances were sampled.</param>
/// <param name="Errors">Relative transfer error of each sample (NaN where the sample could not be solved).</param>
/// <param name="Gains">Measured gain of each sample (NaN where not a linear stage or not solved).</param>
internal sealed record MonteCarloYield(int Samples, int Seed, ToleranceDistribution Distribution, double[] Errors, double[] Gains)
{
    /// <summary>Samples that could not be solved (counted as failing).</summary>
    public int Unsolved => Errors.Count(double.IsNaN);

    /// <summary>Fraction of samples whose error is within <paramref name="accuracy"/>.</summary>
    public double YieldWithin(double accuracy) => Samples == 0 ? double.NaN : (double)PassingWithin(accuracy) / Samples;

    /// <summary>Samples whose error is within <paramref name="accuracy"/> (unsolved samples fail).</summary>
    public int PassingWithin(double accuracy) => Errors.Count(e => e <= accuracy);

    /// <summary>These samples followed by <paramref name="more"/>, drawn from the next sample indices.</summary>
    public MonteCarloYield Append(MonteCarloYield more) =>
        new(Samples + more.Samples, Seed, Distribution, [.. Errors, .. more.Errors], [.. Gains, .. more.Gains]);

    public static MonteCarloYield Run(WorstCaseAnalysis worstCase, MonteCarloSettings settings, int maxDegreeOfParallelism = -1) =>
        Run(worstCase, settings, 0, Math.Max(0, settings.Samples), maxDegreeOfParallelism);

    /// <summary>
    /// Draws samples <paramref name="first"/> … <paramref name="first"/> + <paramref name="count"/> − 1. Sample i is
    /// the same whichever batch draws it, so a run in batches equals one run of the whole count.
    /// </summary>
    public static MonteCarloYield Run(WorstCaseAnalysis worstCase, MonteCarloSettings settings, int first, int count, int maxDegreeOfParallelism = -1)
    {
        int samples = Math.Max(0, count);
        var errors = new double[samples];
        var gains = new double[samples];
        Parallel.For(0, samples, new ParallelOptions { MaxDegreeOfParallelism = maxDegreeOfParallelism, TaskScheduler = TaskScheduler.Current }, i =>
        {
            var v = SampleDraws.Draw(worstCase, settings, first + i);
            var transfer = worstCase.Circuit.Measure(v);
            if (!transfer.Succeeded)
            {
                errors[i] = gains[i] = double.NaN;
                return;
            }

            var figures = StageFigures.Of(transfer, worstCase.Target, worstCase.Plan);
            errors[i] = worstCase.Metric.ErrorOf(figures, worstCase.Nominal);
            gains[i] = worstCase.Target.IsLinear ? figures.Gain : double.NaN;
        });

        return new MonteCarloYield(samples, settings.Seed, settings.Distribution, errors, gains);
    }
}
