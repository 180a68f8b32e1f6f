namespace DesignRules.Simulation.Noise;

/// <summary>One contributor to the output noise: an element's noise source, its density at the output and its share.</summary>
/// <param name="Element">Id of the element.</param>
/// <param name="Kind">What kind of noise.</param>
/// <param name="Rms">RMS noise voltage at the output over the band, V.</param>
/// <param name="Share">Fraction of the total output noise power (0..1).</param>
/// <param name="Density">Noise density at the output at each of <see cref="NoiseResult.Frequencies"/>, V/√Hz.</param>
public sealed record NoiseContribution(string Element, NoiseKind Kind, double Rms, double Share, IReadOnlyList<double> Density);

/// <summary>
/// Result of a noise analysis: densities at the output per contributor and in total on the final frequency grid, the
/// integrated RMS noise at the output and referred to the input, and how well the integral converged.
/// </summary>
public sealed class NoiseResult
{
    internal NoiseResult(SimulationFailure? failure)
    {
        Failure = failure;
    }

    /// <summary>The problem that ended the analysis, or null.</summary>
    public SimulationFailure? Failure { get; }

    /// <summary>True when the densities were found (see <see cref="Converged"/> for the integral).</summary>
    public bool Succeeded => Failure is null;

    /// <summary>Frequencies of the final grid, Hz, ascending, both band ends included.</summary>
    public IReadOnlyList<double> Frequencies { get; init; } = [];

    /// <summary>Total noise density at the output at each frequency, V/√Hz.</summary>
    public IReadOnlyList<double> OutputDensity { get; init; } = [];

    /// <summary>Magnitude of the gain from the input source to the output at each frequency.</summary>
    public IReadOnlyList<double> Gain { get; init; } = [];

    /// <summary>Every contributor, largest first (ties by element id, then kind).</summary>
    public IReadOnlyList<NoiseContribution> Contributors { get; init; } = [];

    /// <summary>RMS noise voltage at the output over the band, V.</summary>
    public double OutputRms { get; init; }

    /// <summary>The largest gain magnitude from the input source to the output in the band (the pass-band gain).</summary>
    public double PassbandGain { get; init; }

    /// <summary>
    /// RMS noise referred to the input: <see cref="OutputRms"/> divided by <see cref="PassbandGain"/>, V (infinite when
    /// the input does not reach the output).
    /// </summary>
    public double InputReferredRms => PassbandGain > 0 ? OutputRms / PassbandGain : double.PositiveInfinity;

    /// <summary>True when two successive refinements of the grid agreed within the request's tolerance.</summary>
    public bool Converged { get; init; }

    /// <summary>Relative change of the integrated noise power at the last refinement.</summary>
    public double RelativeChange { get; init; }

    /// <summary>Circuit temperature the thermal and shot noise were computed at, K.</summary>
    public double Temperature { get; init; }
}
