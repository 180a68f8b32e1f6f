using DesignRules.Elaboration;
using DesignRules.Simulation;

namespace DesignRules.Figures;

/// <summary>
/// The bounds of the search for a periodic steady state: how close to settled a run must be, and how much may be
/// simulated before the search gives up and says so.
/// </summary>
/// <param name="RelativeTolerance">Largest drift still to come of any node's period average, as a fraction of the node's largest excursion.</param>
/// <param name="AbsoluteTolerance">Drift below this, V, counts as settled whatever the node's excursion.</param>
/// <param name="MaxRounds">Runs after the first (each a continuation from the extrapolated state of the one before).</param>
/// <param name="MaxPeriods">Signal periods simulated in all, over every run.</param>
internal sealed record SteadyStateLimits(double RelativeTolerance, double AbsoluteTolerance, int MaxRounds, int MaxPeriods)
{
    /// <summary>0.1 % of each node's excursion (at least 10 µV), at most 12 continuations and 400 periods.</summary>
    public static SteadyStateLimits Default { get; } = new(1e-3, 10e-6, 12, 400);
}

/// <summary>A transient run judged for settling, and the window of settled periods to measure over.</summary>
/// <param name="Result">The last run (it may start later than 0 when it continues an earlier one).</param>
/// <param name="Window">The measurement window of settled periods inside <paramref name="Result"/>.</param>
/// <param name="Settled">True when successive periods agree within the limits.</param>
/// <param name="Periods">Signal periods simulated in all.</param>
/// <param name="Drift">The largest drift still expected of a node's period average when the limit was hit, V.</param>
/// <param name="Node">The node with that drift.</param>
internal sealed record SettledTransient(TransientResult Result, TransientWindow Window, bool Settled, int Periods, double Drift, string? Node);

/// <summary>
/// Runs a periodic chain's transient until it reaches its periodic steady state, bounded by <see cref="SteadyStateLimits"/>.
/// A fixed number of periods is not enough: an averaging filter whose time constant is many periods long is still far
/// from its level after a few. After each run the period average of every node over the last three periods shows the
/// slow modes; where they still drift, the state at the last three period boundaries is extrapolated component by
/// component with Aitken's delta-squared process (the extrapolation method for periodic steady states of Skelboe,
/// IEEE Trans. Circuits and Systems, 1980) and the transient continues from there, in phase with the source. The run
/// counts as settled when the drift still to come of every node's period average (the geometric remainder
/// d·r/(1−r) of its last two period-to-period changes d with ratio r) is within the tolerance.
/// </summary>
internal static class PeriodicSteadyState
{
    public static SettledTransient Run(ElaboratedChain chain, SteadyStateLimits limits) => Run(chain, limits, null);

    /// <summary>
    /// As <see cref="Run(ElaboratedChain, SteadyStateLimits)"/>, but the first run starts from the last state of
    /// <paramref name="near"/>, the settled run of a circuit with the same unknowns and the same source (the nominal chain
    /// at the same band end, for a tolerance corner of it), instead of from the operating point. That state lies at a whole
    /// number of periods, so it is in phase with the source at t = 0, and it is the steady state of nearly the same
    /// physics: the run starts close to its own steady state and usually settles in its first run, where a cold start needs
    /// a continuation. The settling test and its bounds are the same, so the result is settled within the same tolerance
    /// (0.1 % of each watched node's excursion); it is not the same bits as a cold start. A state whose unknowns do not
    /// match (another layout) falls back to the cold start.
    /// </summary>
    public static SettledTransient RunFrom(ElaboratedChain chain, SteadyStateLimits limits, SettledTransient near)
    {
        var result = near.Result;
        if (!near.Settled || !result.Succeeded || result.Time.Count < 2)
        {
            return Run(chain, limits, null);
        }

        var warm = Run(chain, limits, result.StateAt(result.Time.Count - 1));

        // The state is only meaningful for the same unknowns in the same order; a run with other nodes (which a corner of
        // the same design never has) is redone from the operating point. So is a warm run that failed or did not settle:
        // the warm start may save work, never lose a corner that a cold start would have settled.
        bool usable = warm.Settled && warm.Result.Succeeded && warm.Result.Nodes.SequenceEqual(result.Nodes, StringComparer.Ordinal);
        return usable ? warm : Run(chain, limits, null);
    }

    private static SettledTransient Run(ElaboratedChain chain, SteadyStateLimits limits, double[]? initial)
    {
        var window = chain.Window;
        var first = Simulate.Transient(chain.Circuit, initial is null ? window.ToOptions() : window.ToOptions() with { InitialState = initial });
        if (chain.Period is not { } period || !(period > 0) || !first.Succeeded)
        {
            return new SettledTransient(first, window, true, 0, 0, null);
        }

        int measured = Math.Max(1, (int)Math.Round((window.StopTime - window.MeasureFrom) / period));
        int startup = Math.Max(2, (int)Math.Round(window.MeasureFrom / period));
        var result = first;
        double stop = window.StopTime;
        int periods = startup + measured;
        for (int round = 0; ; round++)
        {
            var (drift, node) = RemainingDrift(result, Watched(chain), period, stop, limits);
            if (drift is null && initial is not null)
            {
                (drift, node) = WindowSpread(result, Watched(chain), period, measured, stop, limits);
            }

            var settledWindow = new TransientWindow(stop - (measured * period), stop, window.MaxStep);
            if (drift is null)
            {
                return new SettledTransient(result, settledWindow, true, periods, 0, null);
            }

            // A continuation needs start-up periods for the fast modes the extrapolation disturbs, then the measured ones.
            if (round >= limits.MaxRounds || periods + startup + measured > limits.MaxPeriods)
            {
                return new SettledTransient(result, settledWindow, false, periods, drift.Value, node);
            }

            var state = Extrapolate(result, period, stop);
            double start = stop;
            stop = start + ((startup + measured) * period);
            var next = Simulate.Transient(chain.Circuit, new TransientOptions
            {
                StartTime = start,
                StopTime = stop,
                MaxStep = window.MaxStep,
                InitialState = state,
            });
            periods += startup + measured;
            if (!next.Succeeded)
            {
                return new SettledTransient(next, settledWindow with { MeasureFrom = start, StopTime = stop }, true, periods, 0, null);
            }

            result = next;
        }
    }

    /// <summary>
    /// The nodes whose settling decides: every stage's output (what the next stage and the rules see; a slow mode inside a
    /// stage shows there). Amplifier outputs that run to a rail between conduction intervals are left out: their period
    /// average moves with the exact instant of each recovery, a jitter of the time steps rather than a drift.
    /// </summary>
    private static List<string> Watched(ElaboratedChain chain) =>
        [.. chain.Stages.Select(s => s.OutputNode).Where(n => !Circuit.IsReference(n)).Distinct(StringComparer.Ordinal)];

    /// <summary>
    /// The largest drift still to come of a node's period average, when it exceeds the tolerance; null when every node
    /// has settled.
    /// </summary>
    private static (double? Drift, string? Node) RemainingDrift(TransientResult result, IReadOnlyList<string> watched, double period, double stop, SteadyStateLimits limits)
    {
        // A steady state may repeat every period or, where a stage tops up on alternate cycles (a slow peak detector),
        // every second one: the averages over pairs of periods then agree while single periods alternate.
        (double? Drift, string? Node) first = (null, null);
        foreach (int multiple in new[] { 1, 2 })
        {
            double span = multiple * period;
            if (stop - (3 * span) < result.Time[0] - (period * 1e-9))
            {
                break;
            }

            var found = DriftOver(result, watched, span, stop, limits);
            if (found.Drift is null)
            {
                return (null, null);
            }

            if (multiple == 1)
            {
                first = found;
            }
        }

        return first;
    }

    /// <summary>
    /// For a run started from another run's steady state: the largest difference between the average of any measured
    /// period and the last one, when it exceeds the tolerance; null when every watched node's measured periods agree.
    /// A warm start settles a slow mode only part of the way in its first run, and the remainder test alone lets the early
    /// measured periods lie further off than the tolerance (the figures are measured over all of them); a cold start's
    /// first run is never accepted that way in practice, and its bits stay as they were. Pairs of periods as in
    /// <see cref="RemainingDrift"/> for a steady state that repeats every second period, sliding by one period so that
    /// the pairs cover the whole window.
    /// </summary>
    private static (double? Drift, string? Node) WindowSpread(TransientResult result, IReadOnlyList<string> watched, double period, int measured, double stop, SteadyStateLimits limits)
    {
        (double? Drift, string? Node) first = (null, null);
        foreach (int multiple in new[] { 1, 2 })
        {
            // Every run of `multiple` periods inside the measured window (sliding by one period) against the last one.
            int shifts = measured - multiple;
            if (shifts < 1)
            {
                break;
            }

            double span = multiple * period;
            double worst = 0;
            string? worstNode = null;
            var time = result.Time;
            foreach (var node in watched.Where(result.HasNode))
            {
                var v = result.Voltage(node);
                double last = MeasurementWindow.Average(time, v, stop - span, stop);
                double tolerance = Math.Max(limits.RelativeTolerance * Excursion(time, v, stop - span, stop), limits.AbsoluteTolerance);
                for (int k = 1; k <= shifts; k++)
                {
                    double end = stop - (k * period);
                    double spread = Math.Abs(MeasurementWindow.Average(time, v, end - span, end) - last);
                    if (spread > tolerance && spread - tolerance > worst)
                    {
                        worst = spread - tolerance;
                        worstNode = node;
                    }
                }
            }

            if (worstNode is null)
            {
                return (null, null);
            }

            if (multiple == 1)
            {
                first = (worst, worstNode);
            }
        }

        return first;
    }

    private static (double? Drift, string? Node) DriftOver(TransientResult result, IReadOnlyList<string> watched, double span, double stop, SteadyStateLimits limits)
    {
        var time = result.Time;
        if (time.Count < 2)
        {
            return (null, null);
        }

        double worst = 0;
        string? worstNode = null;
        foreach (var node in watched.Where(result.HasNode))
        {
            var v = result.Voltage(node);
            double a0 = MeasurementWindow.Average(time, v, stop - (3 * span), stop - (2 * span));
            double a1 = MeasurementWindow.Average(time, v, stop - (2 * span), stop - span);
            double a2 = MeasurementWindow.Average(time, v, stop - span, stop);
            double scale = Excursion(time, v, stop - span, stop);
            double tolerance = Math.Max(limits.RelativeTolerance * scale, limits.AbsoluteTolerance);
            double d1 = a1 - a0, d2 = a2 - a1;
            double ratio = Math.Abs(d1) > 0 ? d2 / d1 : 0;

            // The remainder of a geometric decay with this ratio; a ratio outside (0, 1) is no decay at all, and then
            // the last change must itself be within the tolerance (a tenth of it, to leave room for what follows).
            double remaining = ratio is > 0 and < 1 ? Math.Abs(d2) * ratio / (1 - ratio) : 10 * Math.Abs(d2);
            if (remaining > tolerance && remaining - tolerance > worst)
            {
                worst = remaining - tolerance;
                worstNode = node;
            }
        }

        return worstNode is null ? (null, null) : (worst, worstNode);
    }

    /// <summary>
    /// The state at the end of the run, moved towards the steady state: each component whose values at the last three
    /// period boundaries form a decaying geometric sequence is replaced by the limit of that sequence (Aitken's process).
    /// </summary>
    private static double[] Extrapolate(TransientResult result, double period, double stop)
    {
        int last = result.Time.Count - 1;
        var s2 = result.StateAt(last);
        var s1 = StateAtTime(result, stop - period);
        var s0 = StateAtTime(result, stop - (2 * period));
        for (int i = 0; i < s2.Length; i++)
        {
            double d1 = s1[i] - s0[i], d2 = s2[i] - s1[i];
            double scale = Math.Max(Math.Max(Math.Abs(s0[i]), Math.Abs(s2[i])), 1e-3);
            if (Math.Abs(d2) < 1e-7 * scale || Math.Abs(d1) < 1e-7 * scale)
            {
                continue;
            }

            double ratio = d2 / d1;
            if (ratio is > 0 and < 0.999)
            {
                s2[i] += d2 * ratio / (1 - ratio);
            }
        }

        return s2;
    }

    private static double[] StateAtTime(TransientResult result, double t)
    {
        var time = result.Time;
        int hi = 1;
        while (hi < time.Count - 1 && time[hi] < t) hi++;
        int lo = hi - 1;
        var a = result.StateAt(lo);
        var b = result.StateAt(hi);
        double span = time[hi] - time[lo];
        double w = span > 0 ? Math.Clamp((t - time[lo]) / span, 0, 1) : 0;
        for (int i = 0; i < a.Length; i++) a[i] += (b[i] - a[i]) * w;
        return a;
    }

    private static double Excursion(IReadOnlyList<double> time, double[] v, double start, double end)
    {
        double peak = 0;
        for (int i = 0; i < time.Count; i++)
        {
            if (time[i] >= start && time[i] <= end) peak = Math.Max(peak, Math.Abs(v[i]));
        }

        return peak;
    }
}
