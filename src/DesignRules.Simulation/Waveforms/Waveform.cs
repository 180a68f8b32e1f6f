namespace DesignRules.Simulation.Waveforms;

/// <summary>
/// Time function of an independent source. A waveform evaluates its value at a time and lists its corners
/// (breakpoints) so the transient analysis can land on them. The small-signal stimulus of an AC sweep is not part of a
/// waveform: the <see cref="AcSweep"/> request names the source and its amplitude. The hierarchy is closed: use the
/// derived records of this library.
/// </summary>
public abstract record Waveform
{
    private protected Waveform()
    {
    }

    /// <summary>Value of the waveform at <paramref name="time"/> seconds.</summary>
    /// <param name="time">Time in s.</param>
    public abstract double ValueAt(double time);

    /// <summary>Quiescent value used by the DC operating point and DC sweep (the offset of a periodic waveform; the value at t = 0 otherwise).</summary>
    public virtual double DcValue => ValueAt(0);

    /// <summary>Times in [<paramref name="start"/>, <paramref name="stop"/>] at which the waveform or its slope jumps, sorted.</summary>
    /// <param name="start">Start of the window in s.</param>
    /// <param name="stop">End of the window in s.</param>
    /// <param name="limit">Most points returned.</param>
    public IReadOnlyList<double> Breakpoints(double start, double stop, int limit = 100_000)
    {
        var list = new List<double>();
        CollectBreakpoints(start, stop, list, limit);
        list.Sort();
        var distinct = new List<double>(list.Count);
        foreach (double t in list)
        {
            if (distinct.Count == 0 || t - distinct[^1] > 1e-15 * Math.Max(1, Math.Abs(t))) distinct.Add(t);
        }

        return distinct;
    }

    /// <summary>Appends the corners in [start, stop] to <paramref name="into"/> while it holds fewer than <paramref name="limit"/> entries.</summary>
    internal abstract void CollectBreakpoints(double start, double stop, List<double> into, int limit);

    /// <summary>Returns a description of the first unusable parameter, or null when the waveform is usable.</summary>
    internal abstract string? Validate();

    /// <summary>Appends the corners of a periodic shape: the given offsets within each period, from the first period touching <paramref name="start"/>.</summary>
    private protected static void CollectPeriodic(double start, double stop, double delay, double period, ReadOnlySpan<double> offsets, List<double> into, int limit)
    {
        if (delay > 0 && delay >= start && delay <= stop && into.Count < limit) into.Add(delay);
        if (!(period > 0) || stop < delay) return;
        double first = Math.Floor((Math.Max(start, delay) - delay) / period);
        for (double k = first; into.Count < limit; k++)
        {
            double periodStart = delay + (k * period);
            if (periodStart > stop) return;
            foreach (double offset in offsets)
            {
                double t = periodStart + offset;
                if (t >= start && t <= stop && into.Count < limit) into.Add(t);
            }
        }
    }

    private protected static bool IsFinite(double value) => double.IsFinite(value);
}
