namespace DesignRules.Simulation.Results;

/// <summary>
/// Result of a DC sweep: one operating point per value of the swept source. When a point fails, the result holds the
/// points solved before it and the located <see cref="Failure"/>.
/// </summary>
public sealed class DcSweepResult
{
    private readonly SignalMap? map;
    private readonly SampleTable<double>? table;

    internal DcSweepResult(string sourceId, SignalMap? map, SampleTable<double>? table, double[] values, SimulationFailure? failure)
    {
        SourceId = sourceId;
        this.map = map;
        this.table = table;
        Values = values;
        Failure = failure;
    }

    /// <summary>Id of the swept source.</summary>
    public string SourceId { get; }

    /// <summary>Source values solved (in order), in V or A.</summary>
    public IReadOnlyList<double> Values { get; }

    /// <summary>The problem that ended the sweep, or null when every value was solved.</summary>
    public SimulationFailure? Failure { get; }

    /// <summary>True when every value was solved.</summary>
    public bool Succeeded => Failure is null;

    /// <summary>Node voltage at every solved value, V.</summary>
    /// <param name="node">Node name.</param>
    public double[] Voltage(string node) => table is null || map is null ? [] : table.Column(map.NodeColumn(node));

    /// <summary>True when the swept circuit has this node (the reference counts).</summary>
    /// <param name="node">Node name.</param>
    public bool HasNode(string node) => map is not null && map.HasNode(node);

    /// <summary>Reported current of an element at every solved value, A.</summary>
    /// <param name="id">Element id.</param>
    public double[] Current(string id) => table is null || map is null ? [] : table.Column(map.CurrentColumn(id));
}
