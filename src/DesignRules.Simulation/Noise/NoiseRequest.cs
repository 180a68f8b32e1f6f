namespace DesignRules.Simulation.Noise;

/// <summary>How each noise source's transfer to the output is found.</summary>
public enum NoiseTransferMethod
{
    /// <summary>
    /// One solve of the transposed (adjoint) small-signal system per frequency gives the transfer from every node and
    /// branch to the output at once (the adjoint network method of Director and Rohrer, 1969).
    /// </summary>
    Adjoint,

    /// <summary>One solve of the small-signal system per noise source and frequency, each source injected alone (superposition).</summary>
    PerSource,
}

/// <summary>
/// A noise analysis request: the node whose noise voltage is wanted, the source whose gain to that node refers the
/// noise to the input, and the band the densities are integrated over. The circuit is linearised at its DC operating
/// point; every noise source is independent of every other, so their powers add.
/// </summary>
/// <param name="Output">Node whose noise voltage (against the reference) is computed.</param>
/// <param name="InputSource">Id of the independent source whose gain to <paramref name="Output"/> refers the noise to the input.</param>
/// <param name="Start">Lowest frequency of the band in Hz (positive).</param>
/// <param name="Stop">Highest frequency of the band in Hz (above <paramref name="Start"/>).</param>
public sealed record NoiseRequest(string Output, string InputSource, double Start, double Stop)
{
    /// <summary>
    /// Relative tolerance of the integrated noise power: the frequency grid is refined (halving the logarithmic step)
    /// until two successive estimates of the total differ by no more than this. Default 1e-4.
    /// </summary>
    public double Tolerance { get; init; } = 1e-4;

    /// <summary>Points per decade of the first grid (at least 2). Default 10.</summary>
    public int PointsPerDecade { get; init; } = 10;

    /// <summary>Most refinements of the grid (each doubles the points per decade; 0 to 10). Default 6.</summary>
    public int MaxRefinements { get; init; } = 6;

    /// <summary>
    /// DC value in V of the input source (a voltage source) at which the circuit is linearised, or null for its quiescent
    /// value. A rectifier is linearised at the level it passes, so its loop is closed through the conducting diode.
    /// </summary>
    public double? InputLevel { get; init; }

    /// <summary>How transfers are found; both give the same densities (a test keeps it so). Default <see cref="NoiseTransferMethod.Adjoint"/>.</summary>
    public NoiseTransferMethod Method { get; init; } = NoiseTransferMethod.Adjoint;

    internal string? Validate()
    {
        if (string.IsNullOrEmpty(Output) || string.IsNullOrEmpty(InputSource)) return "the noise output node and input source must be named";
        if (!(Start > 0) || !double.IsFinite(Start) || !(Stop > Start) || !double.IsFinite(Stop)) return "the noise band must be positive, finite and its top above its bottom";
        if (!(Tolerance > 0) || !(Tolerance < 1)) return "the noise integration tolerance must lie between 0 and 1";
        if (PointsPerDecade is < 2 or > 1000) return "the noise grid needs between 2 and 1000 points per decade";
        if (InputLevel is { } level && !double.IsFinite(level)) return "the noise input level must be finite";
        if (MaxRefinements is < 0 or > 10) return "the noise grid may be refined 0 to 10 times";
        return null;
    }
}
