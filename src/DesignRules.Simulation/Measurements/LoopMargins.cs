using System.Numerics;

namespace DesignRules.Simulation.Measurements;

/// <summary>What a loop gain shows about whether its margins can be read.</summary>
public enum LoopState
{
    /// <summary>|T| falls through 1 within the sweep: crossover and phase margin are read there.</summary>
    Closed,

    /// <summary>|T| stays below 1 over the whole sweep: at this operating point the loop is open (a diode off, an output at a rail).</summary>
    Open,

    /// <summary>|T| stays above 1 up to the top of the sweep: the crossover lies beyond it.</summary>
    BeyondSweep,

    /// <summary>T is negative real at DC with |T| above 1: the loop regenerates (positive feedback) and latches.</summary>
    Regenerative,
}

/// <summary>
/// Stability margins read from a loop gain T(jω) (Bode's definitions): the crossover fc where |T| = 1, the phase margin
/// 180° + ∠T(fc) with the phase unwrapped from low frequency, the gain margin 1/|T| where the phase reaches −180°, and the
/// closed-loop peaking max|T/(1+T)| over its low-frequency value. Where |T| crosses 1 more than once, the crossing with
/// the smallest phase margin is kept; likewise the smallest gain margin.
/// </summary>
/// <param name="State">Whether the margins could be read.</param>
/// <param name="LowFrequencyGain">|T| at the first frequency.</param>
/// <param name="Crossover">Crossover frequency fc in Hz, when <see cref="LoopState.Closed"/>.</param>
/// <param name="PhaseMargin">Phase margin in degrees, when closed.</param>
/// <param name="GainMargin">Gain margin as a ratio (above 1 is stable), or null when the phase never reaches −180° in the sweep.</param>
/// <param name="PhaseCrossover">Frequency of the gain margin, Hz, or null.</param>
/// <param name="Peaking">Closed-loop peaking max|T/(1+T)| / |T/(1+T)| at the first frequency (1: none).</param>
/// <param name="PeakingFrequency">Frequency of the peak, Hz.</param>
/// <param name="StartPhase">∠T at the first frequency in degrees, continued from DC (it may lie outside (−180°, 180°] when
/// poles below the sweep have already turned it); the phase of the sweep is unwrapped from it.</param>
public sealed record LoopMargins(
    LoopState State, double LowFrequencyGain, double? Crossover, double? PhaseMargin, double? GainMargin, double? PhaseCrossover, double Peaking, double PeakingFrequency,
    double StartPhase)
{
    /// <summary>Steps of the bisection that places a crossing between two sweep points (each halves a log-frequency interval).</summary>
    private const int RefineSteps = 40;

    /// <summary>Decades walked below the first frequency at most, looking for the frequency where ∠T stops turning.</summary>
    private const int MaxDecadesBelow = 12;

    /// <summary>A decade over which ∠T turns by less than this (degrees) counts as below every pole and zero of T.</summary>
    private const double SettledTurn = 0.5;

    /// <summary>
    /// Reads the margins from T sampled at ascending <paramref name="frequencies"/>; <paramref name="exact"/> (when given)
    /// evaluates T at any frequency, so that each crossing is placed by bisection rather than interpolation.
    /// </summary>
    /// <param name="frequencies">Ascending frequencies, Hz.</param>
    /// <param name="gain">T at each frequency.</param>
    /// <param name="exact">T at any frequency, or null to interpolate between the samples.</param>
    public static LoopMargins Of(IReadOnlyList<double> frequencies, IReadOnlyList<Complex> gain, Func<double, Complex>? exact = null)
    {
        ArgumentNullException.ThrowIfNull(frequencies);
        ArgumentNullException.ThrowIfNull(gain);
        int n = Math.Min(frequencies.Count, gain.Count);
        if (n == 0) return new LoopMargins(LoopState.Open, 0, null, null, null, null, 1, 0, 0);

        // Whether the feedback is negative or positive is the sign of T at DC, not at the first frequency of the sweep: a
        // loop with poles below the sweep (a diode's small-signal resistance into a large hold capacitor, behind an
        // amplifier's own dominant pole) reaches the first frequency already turned by more than 90°, negative in its
        // real part and yet a negative-feedback loop with a crossover to judge.
        var (startPhase, regenerative) = FromDc(frequencies[0], gain[0], exact);
        var phase = Unwrapped(gain, n, startPhase);
        double[] mag = new double[n];
        for (int i = 0; i < n; i++) mag[i] = gain[i].Magnitude;

        var (peaking, peakingAt) = Peak(frequencies, gain, n);
        if (regenerative)
        {
            return new LoopMargins(LoopState.Regenerative, mag[0], null, null, null, null, peaking, peakingAt, startPhase);
        }

        Func<double, Complex> evaluate = exact ?? (f => Interpolate(frequencies, gain, n, f));
        double? crossover = null, margin = null;
        for (int i = 0; i + 1 < n; i++)
        {
            if ((mag[i] - 1) * (mag[i + 1] - 1) > 0 || mag[i] == mag[i + 1]) continue;
            double fc = Bisect(frequencies[i], frequencies[i + 1], f => Math.Log(evaluate(f).Magnitude), mag[i] > 1);
            double p = PhaseNear(evaluate(fc), Lerp(frequencies[i], frequencies[i + 1], phase[i], phase[i + 1], fc));
            double pm = 180 + p;
            if (margin is null || pm < margin)
            {
                margin = pm;
                crossover = fc;
            }
        }

        double? gainMargin = null, phaseCrossover = null;
        for (int i = 0; i + 1 < n; i++)
        {
            // Each level −180° − k·360° the unwrapped phase passes through is a phase crossover.
            double a = Math.Floor((phase[i] + 180) / 360), b = Math.Floor((phase[i + 1] + 180) / 360);
            if (a == b) continue;
            double level = (360 * Math.Max(a, b)) - 180;
            double lo = phase[i], hi = phase[i + 1];
            double fp = Bisect(frequencies[i], frequencies[i + 1], f => PhaseNear(evaluate(f), Lerp(frequencies[i], frequencies[i + 1], lo, hi, f)) - level, lo > level);
            double gm = 1 / evaluate(fp).Magnitude;
            if (gainMargin is null || gm < gainMargin)
            {
                gainMargin = gm;
                phaseCrossover = fp;
            }
        }

        var state = margin is not null ? LoopState.Closed : mag.Take(n).All(m => m < 1) ? LoopState.Open : LoopState.BeyondSweep;
        return new LoopMargins(state, mag[0], crossover, margin, gainMargin, phaseCrossover, peaking, peakingAt, startPhase);
    }

    /// <summary>The phase of <paramref name="gain"/> (this loop's samples) in degrees, unwrapped from <see cref="StartPhase"/>.</summary>
    public double[] PhaseOf(IReadOnlyList<Complex> gain)
    {
        ArgumentNullException.ThrowIfNull(gain);
        return Unwrapped(gain, gain.Count, StartPhase);
    }

    // Phase of each sample in degrees, unwrapped from startPhase (the first sample's phase continued from DC).
    private static double[] Unwrapped(IReadOnlyList<Complex> gain, int count, double startPhase)
    {
        var phase = new double[count];
        for (int i = 0; i < count; i++)
        {
            double p = gain[i].Phase * 180 / Math.PI;
            // A point where the equations were singular (NaN) is carried over, not allowed to poison the unwrapping after it.
            phase[i] = i == 0 ? (double.IsFinite(p) ? PhaseNear(gain[0], startPhase) : p)
                : !double.IsFinite(phase[i - 1]) ? p : PhaseNear(gain[i], phase[i - 1]);
        }

        return phase;
    }

    // ∠T at the first frequency continued from DC, and whether T is negative real there with |T| > 1. Walks down decade by
    // decade from the first frequency, keeping the phase continuous, until a decade turns it by less than SettledTurn
    // (below every pole and zero: the DC limit) or T cannot be evaluated; then reads the sign there and carries the
    // phase back up. Without an evaluator the first sample stands for DC, as before.
    private static (double StartPhase, bool Regenerative) FromDc(double firstFrequency, Complex first, Func<double, Complex>? exact)
    {
        double firstPhase = first.Phase * 180 / Math.PI;
        if (exact is null || !double.IsFinite(firstPhase) || !(firstFrequency > 0))
        {
            return (firstPhase, first.Real < 0 && first.Magnitude > 1);
        }

        // The phases below the first frequency, continued downward from the first sample's principal value.
        var below = new List<(Complex T, double Phase)>(MaxDecadesBelow) { (first, firstPhase) };
        double f = firstFrequency;
        for (int k = 0; k < MaxDecadesBelow; k++)
        {
            f /= 10;
            var t = exact(f);
            if (!double.IsFinite(t.Real) || !double.IsFinite(t.Imaginary) || t == Complex.Zero) break;
            double p = PhaseNear(t, below[^1].Phase);
            double turn = Math.Abs(p - below[^1].Phase);
            below.Add((t, p));
            if (turn < SettledTurn) break;
        }

        // Read the bottom in its principal value: the DC limit of T is real, so its phase is 0° or 180° there; the phase
        // of the first sample is the bottom's carried back up through the same decades.
        var bottom = below[^1];
        double shift = (bottom.T.Phase * 180 / Math.PI) - bottom.Phase;
        return (firstPhase + shift, bottom.T.Real < 0 && bottom.T.Magnitude > 1);
    }

    // The phase of t in degrees, shifted by whole turns to lie within half a turn of the expected value.
    private static double PhaseNear(Complex t, double expected)
    {
        double p = t.Phase * 180 / Math.PI;
        return p + (360 * Math.Round((expected - p) / 360));
    }

    // Bisection in log-frequency for the sign change of g; positiveFirst says the sign g has at the low end.
    private static double Bisect(double lo, double hi, Func<double, double> g, bool positiveFirst)
    {
        double a = Math.Log(lo), b = Math.Log(hi);
        for (int k = 0; k < RefineSteps; k++)
        {
            double m = 0.5 * (a + b);
            double v = g(Math.Exp(m));
            if (!double.IsFinite(v)) break;
            if ((v > 0) == positiveFirst) a = m;
            else b = m;
        }

        return Math.Exp(0.5 * (a + b));
    }

    private static double Lerp(double f0, double f1, double y0, double y1, double f)
    {
        double w = (Math.Log(f) - Math.Log(f0)) / (Math.Log(f1) - Math.Log(f0));
        return y0 + (w * (y1 - y0));
    }

    // Linear interpolation of log|T| and unwrapped phase in log-frequency.
    private static Complex Interpolate(IReadOnlyList<double> frequencies, IReadOnlyList<Complex> gain, int n, double f)
    {
        int i = 0;
        while (i + 2 < n && frequencies[i + 1] < f) i++;
        if (n == 1) return gain[0];
        double m = Math.Exp(Lerp(frequencies[i], frequencies[i + 1], Math.Log(gain[i].Magnitude), Math.Log(gain[i + 1].Magnitude), f));
        double p0 = gain[i].Phase, p1 = p0 + (PhaseNear(gain[i + 1], p0 * 180 / Math.PI) * Math.PI / 180) - p0;
        return Complex.FromPolarCoordinates(m, Lerp(frequencies[i], frequencies[i + 1], p0, p1, f));
    }

    private static (double Peaking, double At) Peak(IReadOnlyList<double> frequencies, IReadOnlyList<Complex> gain, int n)
    {
        static double Closed(Complex t) => t == -Complex.One ? double.PositiveInfinity : (t / (1 + t)).Magnitude;
        double reference = Closed(gain[0]);
        if (!(reference > 0) || !double.IsFinite(reference)) return (1, frequencies[0]);
        double best = reference, at = frequencies[0];
        for (int i = 1; i < n; i++)
        {
            double c = Closed(gain[i]);
            if (c > best)
            {
                best = c;
                at = frequencies[i];
            }
        }

        return (best / reference, at);
    }
}
