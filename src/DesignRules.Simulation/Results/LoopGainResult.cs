using System.Numerics;

namespace DesignRules.Simulation.Results;

/// <summary>The loop gain T(jω) of one amplifier over the requested frequencies, with its stability margins.</summary>
/// <param name="Amplifier">Amplifier id.</param>
/// <param name="Gain">T at each frequency of the result (positive real at low frequency for a negative-feedback loop).</param>
/// <param name="Margins">Crossover, phase margin, gain margin and closed-loop peaking read from T.</param>
public sealed record LoopGain(string Amplifier, IReadOnlyList<Complex> Gain, LoopMargins Margins);

/// <summary>
/// Result of a loop-gain analysis: for each amplifier its return ratio T(jω) (Bode; the loop broken at the amplifier's
/// controlling input, the exact MNA form of breaking a loop at a controlled source), linearised at one operating point.
/// </summary>
public sealed class LoopGainResult
{
    internal LoopGainResult(double[] frequencies, IReadOnlyList<LoopGain> loops, OperatingPointResult operatingPoint, SimulationFailure? failure)
    {
        Frequencies = frequencies;
        Loops = loops;
        OperatingPoint = operatingPoint;
        Failure = failure;
    }

    /// <summary>Frequencies, Hz.</summary>
    public IReadOnlyList<double> Frequencies { get; }

    /// <summary>One loop per amplifier analysed, in the order of the circuit.</summary>
    public IReadOnlyList<LoopGain> Loops { get; }

    /// <summary>The operating point the loops were linearised at.</summary>
    public OperatingPointResult OperatingPoint { get; }

    /// <summary>The problem that ended the analysis, or null.</summary>
    public SimulationFailure? Failure { get; }

    /// <summary>True when every loop was computed.</summary>
    public bool Succeeded => Failure is null;

    /// <summary>The loop of an amplifier, or null when it was not analysed.</summary>
    /// <param name="amplifierId">Amplifier id.</param>
    public LoopGain? Loop(string amplifierId) => Loops.FirstOrDefault(l => string.Equals(l.Amplifier, amplifierId, StringComparison.Ordinal));
}
