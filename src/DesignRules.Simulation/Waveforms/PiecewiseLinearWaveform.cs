namespace DesignRules.Simulation.Waveforms;

/// <summary>One corner of a piecewise-linear waveform.</summary>
/// <param name="Time">Time in s.</param>
/// <param name="Value">Value at that time.</param>
public readonly record struct WaveformPoint(double Time, double Value);

/// <summary>
/// Straight lines between corners given in increasing time. Before the first corner the waveform holds the first
/// value, after the last corner the last value.
/// </summary>
/// <param name="Points">Corners in strictly increasing time (at least one).</param>
public sealed record PiecewiseLinearWaveform(IReadOnlyList<WaveformPoint> Points) : Waveform
{
    /// <inheritdoc />
    public override double ValueAt(double time)
    {
        var points = Points;
        if (time <= points[0].Time) return points[0].Value;
        if (time >= points[^1].Time) return points[^1].Value;
        int lo = 0, hi = points.Count - 1;
        while (hi - lo > 1)
        {
            int mid = (lo + hi) >>> 1;
            if (points[mid].Time <= time) lo = mid; else hi = mid;
        }

        var a = points[lo];
        var b = points[hi];
        return a.Value + ((b.Value - a.Value) * (time - a.Time) / (b.Time - a.Time));
    }

    internal override void CollectBreakpoints(double start, double stop, List<double> into, int limit)
    {
        foreach (var p in Points)
        {
            if (into.Count >= limit) return;
            if (p.Time >= start && p.Time <= stop) into.Add(p.Time);
        }
    }

    internal override string? Validate()
    {
        if (Points is null || Points.Count == 0) return "piecewise-linear waveform needs at least one point";
        for (int i = 0; i < Points.Count; i++)
        {
            if (!IsFinite(Points[i].Time) || !IsFinite(Points[i].Value)) return "piecewise-linear points must be finite";
            if (i > 0 && !(Points[i].Time > Points[i - 1].Time)) return "piecewise-linear times must increase strictly";
        }

        return null;
    }
}
