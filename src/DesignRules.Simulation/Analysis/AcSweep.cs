namespace DesignRules.Simulation;

/// <summary>Frequencies of an AC small-signal sweep, in Hz.</summary>
/// <param name="Frequencies">Frequencies in Hz (positive), in the order they are reported.</param>
public sealed record AcSweep(IReadOnlyList<double> Frequencies)
{
    /// <summary>Logarithmically spaced points from <paramref name="start"/> to <paramref name="stop"/> with <paramref name="pointsPerDecade"/> per decade (both ends included).</summary>
    /// <param name="start">First frequency in Hz.</param>
    /// <param name="stop">Last frequency in Hz.</param>
    /// <param name="pointsPerDecade">Points per decade (at least 1).</param>
    public static AcSweep Decades(double start, double stop, int pointsPerDecade)
    {
        if (!(start > 0) || !(stop >= start) || pointsPerDecade < 1) return new AcSweep([]);
        double decades = Math.Log10(stop / start);
        int count = Math.Min((int)Math.Ceiling((decades * pointsPerDecade) - 1e-9), 10_000_000) + 1;
        var list = new double[count];
        for (int i = 0; i < count; i++) list[i] = Math.Min(start * Math.Pow(10, (double)i / pointsPerDecade), stop);
        list[^1] = stop;
        return new AcSweep(list);
    }

    /// <summary>An explicit list of frequencies in Hz.</summary>
    /// <param name="frequencies">Frequencies in Hz.</param>
    public static AcSweep List(params double[] frequencies) => new(frequencies);
}
