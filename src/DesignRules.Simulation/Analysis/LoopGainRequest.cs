namespace DesignRules.Simulation.Analysis;

/// <summary>
/// A loop-gain request: at which frequencies, for which amplifiers, and at which operating point. The loop of each
/// amplifier is broken at its controlling (differential) input, so the result is the return ratio of that amplifier
/// with everything else in the circuit in place: its second pole, output resistance, every load, feedback and
/// inter-stage capacitance, and each diode's conductance and junction capacitance at the operating point.
/// </summary>
/// <param name="Frequencies">Frequencies in Hz (positive, ascending).</param>
public sealed record LoopGainRequest(IReadOnlyList<double> Frequencies)
{
    /// <summary>Amplifier ids to analyse; null for every amplifier of the circuit.</summary>
    public IReadOnlyList<string>? Amplifiers { get; init; }

    /// <summary>
    /// An independent source held at <see cref="BiasValue"/> for the operating point (e.g. the signal source at its
    /// positive peak, so that a rectifier's diode conducts and its loop is closed); null for the sources' quiescent values.
    /// </summary>
    public string? BiasSource { get; init; }

    /// <summary>Value of <see cref="BiasSource"/> in V or A.</summary>
    public double BiasValue { get; init; }

    /// <summary>Logarithmically spaced frequencies from <paramref name="start"/> to <paramref name="stop"/> Hz, both included.</summary>
    /// <param name="start">First frequency in Hz.</param>
    /// <param name="stop">Last frequency in Hz.</param>
    /// <param name="pointsPerDecade">Points per decade (at least 1).</param>
    public static LoopGainRequest Decades(double start, double stop, int pointsPerDecade) =>
        new(AcSweep.Decades(string.Empty, start, stop, pointsPerDecade).Frequencies);
}
