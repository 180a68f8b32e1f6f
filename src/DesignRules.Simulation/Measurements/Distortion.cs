using System.Numerics;
using MathNet.Numerics.IntegralTransforms;

namespace DesignRules.Simulation.Measurements;

/// <summary>
/// Harmonic content of a periodic signal: the last whole periods are resampled on a uniform grid (linear interpolation
/// of the variable-step result), transformed with the MathNet.Numerics FFT, and THD = √(Σ_{k≥2} A_k²)/A_1.
/// </summary>
/// <param name="TotalHarmonicDistortion">THD as a ratio (0.01 = 1 %).</param>
/// <param name="FundamentalAmplitude">Peak amplitude of the fundamental.</param>
/// <param name="HarmonicAmplitudes">Peak amplitudes of harmonics 1..N (index 0 is the fundamental).</param>
/// <param name="Periods">Whole periods analysed.</param>
public sealed record Distortion(double TotalHarmonicDistortion, double FundamentalAmplitude, IReadOnlyList<double> HarmonicAmplitudes, int Periods)
{
    /// <summary>Measures over the last whole periods after <paramref name="from"/>.</summary>
    /// <param name="time">Time points, s.</param>
    /// <param name="values">Values.</param>
    /// <param name="fundamental">Fundamental frequency, Hz.</param>
    /// <param name="from">Earliest time to use (after settling), s.</param>
    /// <param name="harmonics">Highest harmonic included (at least 2).</param>
    /// <param name="samplesPerPeriod">Resampling density (a power of two is fastest).</param>
    public static Distortion Measure(IReadOnlyList<double> time, IReadOnlyList<double> values, double fundamental, double from = 0, int harmonics = 10, int samplesPerPeriod = 256)
    {
        harmonics = Math.Max(harmonics, 2);
        samplesPerPeriod = Math.Max(samplesPerPeriod, 4 * harmonics);
        if (Sampling.Check(time, values) is not null || !(fundamental > 0)) return new Distortion(double.NaN, double.NaN, [], 0);
        var (start, _, periods) = Sampling.WholePeriods(time, 1 / fundamental, from);
        if (periods < 1) return new Distortion(double.NaN, double.NaN, [], 0);
        int n = periods * samplesPerPeriod;
        var samples = new Complex[n];
        double dt = 1 / (fundamental * samplesPerPeriod);
        for (int i = 0; i < n; i++) samples[i] = Sampling.At(time, values, start + (i * dt));
        Fourier.Forward(samples, FourierOptions.NoScaling);
        var amplitudes = new double[harmonics];
        for (int k = 1; k <= harmonics; k++) amplitudes[k - 1] = 2 * samples[k * periods].Magnitude / n;
        double sum = 0;
        for (int k = 1; k < harmonics; k++) sum += amplitudes[k] * amplitudes[k];
        return new Distortion(amplitudes[0] > 0 ? Math.Sqrt(sum) / amplitudes[0] : double.NaN, amplitudes[0], amplitudes, periods);
    }
}
