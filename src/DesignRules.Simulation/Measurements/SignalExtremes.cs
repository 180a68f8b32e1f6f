namespace DesignRules.Simulation.Measurements;

/// <summary>Minimum and maximum of a signal and when they occur.</summary>
/// <param name="Minimum">Smallest value.</param>
/// <param name="TimeOfMinimum">Time of the smallest value, s.</param>
/// <param name="Maximum">Largest value.</param>
/// <param name="TimeOfMaximum">Time of the largest value, s.</param>
public sealed record SignalExtremes(double Minimum, double TimeOfMinimum, double Maximum, double TimeOfMaximum)
{
    /// <summary>Extremes of a series at or after <paramref name="from"/>.</summary>
    /// <param name="time">Time points, s.</param>
    /// <param name="values">Values.</param>
    /// <param name="from">Ignore points before this time (settling), s.</param>
    public static SignalExtremes Of(IReadOnlyList<double> time, IReadOnlyList<double> values, double from = 0)
    {
        ArgumentNullException.ThrowIfNull(time);
        ArgumentNullException.ThrowIfNull(values);
        double min = double.PositiveInfinity, max = double.NegativeInfinity, tMin = double.NaN, tMax = double.NaN;
        for (int i = 0; i < Math.Min(time.Count, values.Count); i++)
        {
            if (time[i] < from) continue;
            if (values[i] < min)
            {
                min = values[i];
                tMin = time[i];
            }

            if (values[i] > max)
            {
                max = values[i];
                tMax = time[i];
            }
        }

        return new SignalExtremes(min, tMin, max, tMax);
    }

    /// <summary>Extremes of a node voltage of a transient result.</summary>
    /// <param name="result">Transient result.</param>
    /// <param name="node">Node name.</param>
    /// <param name="from">Ignore points before this time, s.</param>
    public static SignalExtremes OfNode(TransientResult result, string node, double from = 0)
    {
        ArgumentNullException.ThrowIfNull(result);
        return Of(result.Time, result.Voltage(node), from);
    }
}
