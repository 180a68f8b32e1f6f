namespace DesignRules.Simulation.Results;

/// <summary>
/// Result of a transient analysis: the accepted time points (variable spacing), node voltages and reported currents
/// over time, and per-amplifier traces of flags. When the run ends early, the result holds the points accepted so far
/// and the located <see cref="Failure"/>.
/// </summary>
public sealed class TransientResult
{
    private readonly SignalMap? map;
    private readonly SampleTable<double>? table;
    private readonly AmplifierTrace[] amplifiers;

    internal TransientResult(SignalMap? map, SampleTable<double>? table, double[] time, AmplifierTrace[] amplifiers, TransientStatistics statistics, SimulationFailure? failure)
    {
        this.map = map;
        this.table = table;
        this.amplifiers = amplifiers;
        Time = time;
        Statistics = statistics;
        Failure = failure;
    }

    /// <summary>Accepted time points, s (the first is the start time, 0 unless the run continued an earlier one).</summary>
    public IReadOnlyList<double> Time { get; }

    /// <summary>The problem that ended the run, or null when it reached the stop time.</summary>
    public SimulationFailure? Failure { get; }

    /// <summary>True when the run reached the stop time.</summary>
    public bool Succeeded => Failure is null;

    /// <summary>Step and iteration counts of the run.</summary>
    public TransientStatistics Statistics { get; }

    /// <summary>Non-reference node names.</summary>
    public IReadOnlyList<string> Nodes => map?.NodeNames ?? [];

    /// <summary>Ids of the amplifiers.</summary>
    public IReadOnlyList<string> AmplifierIds => map?.AmplifierIds ?? [];

    /// <summary>True when the circuit has this node.</summary>
    /// <param name="node">Node name.</param>
    public bool HasNode(string node) => map?.HasNode(node) ?? false;

    /// <summary>Node voltage at every time point, V.</summary>
    /// <param name="node">Node name.</param>
    public double[] Voltage(string node) => table is null || map is null ? [] : table.Column(map.NodeColumn(node));

    /// <summary>Reported current of an element at every time point, A.</summary>
    /// <param name="id">Element id.</param>
    public double[] Current(string id) => table is null || map is null ? [] : table.Column(map.CurrentColumn(id));

    /// <summary>
    /// The full solution vector at a recorded point, to continue the run from there (<see cref="TransientOptions.InitialState"/>);
    /// empty when nothing was recorded.
    /// </summary>
    /// <param name="point">Index into <see cref="Time"/>.</param>
    public double[] StateAt(int point)
    {
        if (table is null || map is null || point < 0 || point >= Time.Count) return [];
        int size = map.Width - map.AmplifierIds.Count;
        var state = new double[size];
        for (int i = 0; i < size; i++) state[i] = table[point, i];
        return state;
    }

    /// <summary>Flags and values recorded for an amplifier.</summary>
    /// <param name="id">Amplifier id.</param>
    public AmplifierTrace Amplifier(string id) => map is null ? throw new ArgumentException($"no amplifier '{id}'", nameof(id)) : amplifiers[map.AmplifierIndex(id)];
}

/// <summary>Counts describing how hard a transient run worked.</summary>
/// <param name="AcceptedSteps">Accepted time steps.</param>
/// <param name="RejectedSteps">Steps rejected by the truncation-error test.</param>
/// <param name="FailedSteps">Steps cut because Newton did not converge.</param>
/// <param name="NewtonIterations">Total Newton iterations.</param>
public sealed record TransientStatistics(int AcceptedSteps, int RejectedSteps, int FailedSteps, int NewtonIterations);
