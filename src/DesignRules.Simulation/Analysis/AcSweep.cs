namespace DesignRules.Simulation.Analysis;

/// <summary>
/// An AC small-signal request: which independent source carries the stimulus, with what amplitude, and at which
/// frequencies. Every other source is quiet in the sweep (its small-signal value is zero), whatever its waveform.
/// </summary>
/// <param name="Source">Id of the independent voltage or current source that carries the stimulus.</param>
/// <param name="Frequencies">Frequencies in Hz (positive), in the order they are reported.</param>
public sealed record AcSweep(string Source, IReadOnlyList<double> Frequencies)
{
    /// <summary>Amplitude of the stimulus in V (voltage source) or A (current source), at zero phase; 1 by default, so that node voltages read as transfers.</summary>
    public double Amplitude { get; init; } = 1;

    /// <summary>Logarithmically spaced points from <paramref name="start"/> to <paramref name="stop"/> with <paramref name="pointsPerDecade"/> per decade (both ends included).</summary>
    /// <param name="source">Id of the source that carries the stimulus.</param>
    /// <param name="start">First frequency in Hz.</param>
    /// <param name="stop">Last frequency in Hz.</param>
    /// <param name="pointsPerDecade">Points per decade (at least 1).</param>
    public static AcSweep Decades(string source, double start, double stop, int pointsPerDecade)
    {
        if (!(start > 0) || !(stop >= start) || pointsPerDecade < 1) return new AcSweep(source, []);
        double decades = Math.Log10(stop / start);
        int count = Math.Min((int)Math.Ceiling((decades * pointsPerDecade) - 1e-9), 10_000_000) + 1;
        var list = new double[count];
        for (int i = 0; i < count; i++) list[i] = Math.Min(start * Math.Pow(10, (double)i / pointsPerDecade), stop);
        list[^1] = stop;
        return new AcSweep(source, list);
    }

    /// <summary>An explicit list of frequencies in Hz.</summary>
    /// <param name="source">Id of the source that carries the stimulus.</param>
    /// <param name="frequencies">Frequencies in Hz.</param>
    public static AcSweep List(string source, params double[] frequencies) => new(source, frequencies);
}
