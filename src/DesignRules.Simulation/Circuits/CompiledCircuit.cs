namespace DesignRules.Simulation.Circuits;

/// <summary>A circuit numbered and compiled into devices for one analysis run.</summary>
internal sealed class CompiledCircuit
{
    private CompiledCircuit(CircuitLayout layout, Device[] devices, double temperature)
    {
        Layout = layout;
        Devices = devices;
        Temperature = temperature;
        Amplifiers = devices.OfType<AmplifierDevice>().ToArray();
        Ordering = layout.Size > DenseLu<double>.DenseLimit ? Order(layout, devices) : null;
    }

    /// <summary>
    /// The renumbering that makes a large system a narrow band (null for a small one, solved dense): computed from the
    /// positions every device loads in DC, transient and AC, so one ordering serves every analysis.
    /// </summary>
    public BandOrdering? Ordering { get; }

    public CircuitLayout Layout { get; }

    public Device[] Devices { get; }

    public AmplifierDevice[] Amplifiers { get; }

    public double Temperature { get; }

    /// <summary>Compiles a circuit, or returns the first problem: an invalid element, an empty circuit or a floating node.</summary>
    public static (CompiledCircuit? Circuit, SimulationFailure? Failure) Compile(Circuit circuit)
    {
        if (circuit.Problems.Count > 0) return (null, circuit.Problems[0]);
        if (circuit.Elements.Count == 0 || circuit.NodeNames.Count == 0)
        {
            return (null, new SimulationFailure(FailureKind.UnusableElement, "the circuit has no elements or no node besides the reference"));
        }

        if (!(circuit.Temperature > 0) || !double.IsFinite(circuit.Temperature))
        {
            return (null, new SimulationFailure(FailureKind.UnusableElement, "circuit temperature must be a positive absolute temperature in K"));
        }

        if (FindFloatingNode(circuit) is { } floating) return (null, floating);
        var layout = new CircuitLayout();
        foreach (string node in circuit.NodeNames) layout.Node(node);
        var devices = new Device[circuit.Elements.Count];
        for (int i = 0; i < devices.Length; i++) devices[i] = circuit.Elements[i].Compile(layout);
        return (new CompiledCircuit(layout, devices, circuit.Temperature), null);
    }

    private static BandOrdering Order(CircuitLayout layout, Device[] devices)
    {
        var pattern = new HashSet<(int, int)>();
        var context = new LoadContext(layout.Size, layout.StateCount, null, pattern) { Mode = AnalysisMode.Dc };
        foreach (var device in devices) device.Load(context);
        context.Mode = AnalysisMode.Transient;
        context.Alpha = 1;
        foreach (var device in devices) device.Load(context);
        var ac = new AcLoadContext(layout.Size, null, pattern) { Omega = 1 };
        foreach (var device in devices) device.LoadAc(ac);
        foreach (var device in devices) device.Reset();
        for (int i = 0; i < layout.Size; i++) pattern.Add((i, i));
        return BandOrdering.Compute(layout.Size, pattern);
    }

    /// <summary>Finds a node with no DC path to the reference (union–find over the elements' DC paths).</summary>
    private static SimulationFailure? FindFloatingNode(Circuit circuit)
    {
        var index = new Dictionary<string, int>(StringComparer.Ordinal);
        int Index(string node) => CircuitLayout.IsReference(node) ? 0 : index.TryGetValue(node, out int i) ? i : index[node] = index.Count + 1;
        foreach (string node in circuit.NodeNames) Index(node);
        int[] parent = new int[index.Count + 1];
        for (int i = 0; i < parent.Length; i++) parent[i] = i;
        int Find(int i)
        {
            while (parent[i] != i)
            {
                parent[i] = parent[parent[i]];
                i = parent[i];
            }

            return i;
        }

        foreach (var element in circuit.Elements)
        {
            foreach (var (a, b) in element.DcPaths)
            {
                int ra = Find(Index(a)), rb = Find(Index(b));
                if (ra != rb) parent[ra] = rb;
            }
        }

        int ground = Find(0);
        foreach (string node in circuit.NodeNames)
        {
            if (Find(index[node]) == ground) continue;
            string? via = circuit.Elements.FirstOrDefault(e => e.Nodes.Contains(node, StringComparer.Ordinal))?.Id;
            return new SimulationFailure(
                FailureKind.NoDcReturn,
                $"node '{node}' has no DC path to ground (it is reached only through capacitors, current sources or amplifier inputs); add a resistor to ground or a DC return path")
            {
                Node = node,
                ElementId = via,
            };
        }

        return null;
    }
}
