using System.Numerics;

namespace DesignRules.Simulation.Results;

/// <summary>
/// Result of an AC small-signal sweep: complex node voltages and reported currents (phasors per unit of the sources'
/// AC magnitudes) at each frequency, linearised at the DC operating point.
/// </summary>
public sealed class AcResult
{
    private readonly SignalMap? map;
    private readonly SampleTable<Complex>? table;

    internal AcResult(SignalMap? map, SampleTable<Complex>? table, double[] frequencies, OperatingPointResult operatingPoint, SimulationFailure? failure)
    {
        this.map = map;
        this.table = table;
        Frequencies = frequencies;
        OperatingPoint = operatingPoint;
        Failure = failure;
    }

    /// <summary>Frequencies solved, Hz.</summary>
    public IReadOnlyList<double> Frequencies { get; }

    /// <summary>The operating point the circuit was linearised at.</summary>
    public OperatingPointResult OperatingPoint { get; }

    /// <summary>The problem that ended the sweep, or null.</summary>
    public SimulationFailure? Failure { get; }

    /// <summary>True when every frequency was solved.</summary>
    public bool Succeeded => Failure is null;

    /// <summary>Node voltage phasor at each frequency.</summary>
    /// <param name="node">Node name.</param>
    public Complex[] Voltage(string node) => table is null || map is null ? [] : table.Column(map.NodeColumn(node));

    /// <summary>Current phasor of an element at each frequency (sign conventions as in <see cref="Circuit"/>).</summary>
    /// <param name="id">Element id.</param>
    public Complex[] Current(string id) => table is null || map is null ? [] : table.Column(map.CurrentColumn(id));
}
