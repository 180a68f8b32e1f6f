namespace DesignRules.Simulation.Results;

/// <summary>
/// Result of a DC operating-point analysis: node voltages, reported branch currents and amplifier states, or the
/// located failure that prevented a solution.
/// </summary>
public sealed class OperatingPointResult
{
    private readonly SignalMap? map;
    private readonly double[] values;
    private readonly AmplifierSample[] amplifiers;

    internal OperatingPointResult(SignalMap? map, double[] values, AmplifierSample[] amplifiers, SimulationFailure? failure)
    {
        this.map = map;
        this.values = values;
        this.amplifiers = amplifiers;
        Failure = failure;
    }

    /// <summary>The problem that ended the analysis, or null on success.</summary>
    public SimulationFailure? Failure { get; }

    /// <summary>True when a solution was found.</summary>
    public bool Succeeded => Failure is null;

    /// <summary>Non-reference node names.</summary>
    public IReadOnlyList<string> Nodes => map?.NodeNames ?? [];

    /// <summary>Ids of the elements that report a current.</summary>
    public IReadOnlyList<string> CurrentIds => map?.CurrentIds ?? [];

    /// <summary>Voltage of a node in V (0 for the reference).</summary>
    /// <param name="node">Node name.</param>
    public double Voltage(string node)
    {
        int column = Map.NodeColumn(node);
        return column < 0 ? 0 : values[column];
    }

    /// <summary>Reported current of a source, inductor, controlled source or amplifier output, in A (sign conventions as in <see cref="Circuit"/>).</summary>
    /// <param name="id">Element id.</param>
    public double Current(string id) => values[Map.CurrentColumn(id)];

    /// <summary>State of an amplifier.</summary>
    /// <param name="id">Amplifier id.</param>
    public AmplifierOperatingPoint Amplifier(string id)
    {
        var s = amplifiers[Map.AmplifierIndex(id)];
        return new AmplifierOperatingPoint(id, s.OutputVoltage, s.OutputCurrent, s.DifferentialInput, s.AtSwingLimit, s.CurrentLimited, s.InputOutsideCommonModeRange);
    }

    private SignalMap Map => map is not null && Succeeded ? map : throw new InvalidOperationException("the operating point has no solution: " + Failure);
}
