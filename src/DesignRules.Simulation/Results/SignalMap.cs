namespace DesignRules.Simulation.Results;

/// <summary>
/// Which column of a recorded sample holds which signal: node voltages (one per circuit node), branch currents of
/// voltage-defined elements, and amplifier output currents appended after the unknowns.
/// </summary>
internal sealed class SignalMap
{
    private readonly Dictionary<string, int> nodes = new(StringComparer.Ordinal);
    private readonly Dictionary<string, int> currents = new(StringComparer.Ordinal);
    private readonly Dictionary<string, int> amplifiers = new(StringComparer.Ordinal);

    public SignalMap(CompiledCircuit circuit)
    {
        var layout = circuit.Layout;
        foreach (var (name, index) in layout.Nodes) nodes[name] = index;
        foreach (var (id, index) in layout.Branches) currents[id] = index;
        for (int i = 0; i < circuit.Amplifiers.Length; i++)
        {
            currents[circuit.Amplifiers[i].Id] = layout.Size + i;
            amplifiers[circuit.Amplifiers[i].Id] = i;
        }

        Width = layout.Size + circuit.Amplifiers.Length;
        NodeNames = [.. layout.Nodes.Keys];
        CurrentIds = [.. currents.Keys];
        AmplifierIds = [.. circuit.Amplifiers.Select(a => a.Id)];
    }

    /// <summary>Values per sample.</summary>
    public int Width { get; }

    public IReadOnlyList<string> NodeNames { get; }

    public IReadOnlyList<string> CurrentIds { get; }

    public IReadOnlyList<string> AmplifierIds { get; }

    /// <summary>Column of a node voltage; −1 for the reference. Throws for an unknown node (a programming error).</summary>
    public int NodeColumn(string node)
    {
        if (CircuitLayout.IsReference(node)) return -1;
        return nodes.TryGetValue(node, out int column) ? column : throw new ArgumentException($"no node '{node}' in this circuit", nameof(node));
    }

    /// <summary>True when the circuit has this node (the reference counts).</summary>
    public bool HasNode(string node) => CircuitLayout.IsReference(node) || nodes.ContainsKey(node);

    /// <summary>Column of an element's reported current. Throws for an element that reports none.</summary>
    public int CurrentColumn(string id) =>
        currents.TryGetValue(id, out int column) ? column : throw new ArgumentException($"element '{id}' does not exist or reports no current (only sources, inductors, controlled sources and amplifiers do)", nameof(id));

    /// <summary>Index of an amplifier. Throws for an unknown id.</summary>
    public int AmplifierIndex(string id) =>
        amplifiers.TryGetValue(id, out int index) ? index : throw new ArgumentException($"no amplifier '{id}' in this circuit", nameof(id));

    /// <summary>Copies a solution and the amplifier output currents into a sample row.</summary>
    public static void Fill(CompiledCircuit circuit, double[] solution, Span<double> row, AmplifierSample[]? samples)
    {
        solution.AsSpan().CopyTo(row);
        int size = solution.Length;
        for (int i = 0; i < circuit.Amplifiers.Length; i++)
        {
            var sample = circuit.Amplifiers[i].Observe(solution);
            row[size + i] = sample.OutputCurrent;
            if (samples is not null) samples[i] = sample;
        }
    }
}
