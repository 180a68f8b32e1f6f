namespace DesignRules.Simulation.Measurements;

/// <summary>
/// How a node answers a step: the levels before and after, the overshoot beyond the final level (as a fraction of the
/// change) and the settling time into a band around the final level.
/// </summary>
/// <param name="Initial">Level just before the step, V.</param>
/// <param name="Final">Level at the end of the record, V.</param>
/// <param name="Overshoot">Largest excursion beyond the final level, in the direction of the change, over |Final − Initial| (0 when none).</param>
/// <param name="PeakTime">Time of that excursion after the step, s.</param>
/// <param name="SettlingTime">Time after the step from which the node stays within the band, s; null when it never does in the record.</param>
/// <param name="Band">The settling band as a fraction of |Final − Initial|.</param>
public sealed record StepResponse(double Initial, double Final, double Overshoot, double PeakTime, double? SettlingTime, double Band)
{
    /// <summary>The change, Final − Initial, V.</summary>
    public double Change => Final - Initial;

    /// <summary>Measures the answer of <paramref name="values"/> to a step at <paramref name="stepTime"/>.</summary>
    /// <param name="time">Time points, s (ascending).</param>
    /// <param name="values">Node voltage at each time point.</param>
    /// <param name="stepTime">When the step starts, s.</param>
    /// <param name="band">Settling band as a fraction of the change (e.g. 0.01 for 1 %).</param>
    public static StepResponse Measure(IReadOnlyList<double> time, IReadOnlyList<double> values, double stepTime, double band)
    {
        ArgumentNullException.ThrowIfNull(time);
        ArgumentNullException.ThrowIfNull(values);
        int n = Math.Min(time.Count, values.Count);
        if (n == 0) return new StepResponse(0, 0, 0, 0, null, band);
        int before = 0;
        while (before + 1 < n && time[before + 1] <= stepTime) before++;
        double initial = values[before], final = values[n - 1];
        double change = final - initial;
        double sign = change >= 0 ? 1 : -1, size = Math.Abs(change);
        double overshoot = 0, peakTime = 0;
        double? settled = stepTime;
        for (int i = before; i < n; i++)
        {
            double beyond = sign * (values[i] - final);
            if (size > 0 && beyond / size > overshoot)
            {
                overshoot = beyond / size;
                peakTime = time[i] - stepTime;
            }

            if (Math.Abs(values[i] - final) > band * size)
            {
                settled = i + 1 < n ? time[i + 1] : null;
            }
        }

        return new StepResponse(initial, final, overshoot, peakTime, settled is { } s ? Math.Max(0, s - stepTime) : null, band);
    }
}
