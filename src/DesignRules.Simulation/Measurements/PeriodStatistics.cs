namespace DesignRules.Simulation.Measurements;

/// <summary>Average and RMS of a signal over the last whole number of periods.</summary>
/// <param name="Average">Mean value over the window.</param>
/// <param name="Rms">Root-mean-square value over the window.</param>
/// <param name="Periods">Whole periods used.</param>
/// <param name="Start">Window start, s.</param>
/// <param name="End">Window end, s.</param>
public sealed record PeriodStatistics(double Average, double Rms, int Periods, double Start, double End)
{
    /// <summary>Measures over the last whole periods ending at the last time point and starting no earlier than <paramref name="from"/>; NaN figures when less than one period is available.</summary>
    /// <param name="time">Time points, s.</param>
    /// <param name="values">Values.</param>
    /// <param name="period">Signal period, s.</param>
    /// <param name="from">Earliest time to use (after settling), s.</param>
    public static PeriodStatistics Measure(IReadOnlyList<double> time, IReadOnlyList<double> values, double period, double from = 0)
    {
        if (Sampling.Check(time, values) is not null || !(period > 0)) return new PeriodStatistics(double.NaN, double.NaN, 0, from, from);
        var (start, end, periods) = Sampling.WholePeriods(time, period, from);
        if (periods < 1) return new PeriodStatistics(double.NaN, double.NaN, 0, start, end);
        double span = end - start;
        double mean = Sampling.Integrate(time, values, start, end, v => v) / span;
        double meanSquare = Sampling.Integrate(time, values, start, end, v => v * v) / span;
        return new PeriodStatistics(mean, Math.Sqrt(Math.Max(meanSquare, 0)), periods, start, end);
    }
}
