namespace DesignRules.Simulation.Analysis;

/// <summary>
/// Numbering of the unknowns of one compiled circuit: circuit nodes first, then element-internal nodes, branch
/// currents and model states; plus the charge-like states that the time integration tracks.
/// The reference node has index −1 and is never an unknown.
/// </summary>
internal sealed class CircuitLayout
{
    private readonly Dictionary<string, int> nodes = new(StringComparer.Ordinal);
    private readonly List<string> names = [];
    private readonly List<UnknownKind> kinds = [];
    private readonly List<string?> owners = [];
    private readonly Dictionary<string, int> branches = new(StringComparer.Ordinal);
    private readonly List<double> stateScales = [];
    private readonly List<string> stateOwners = [];
    private readonly List<bool> stateIsCurrent = [];

    /// <summary>Number of unknowns.</summary>
    public int Size => names.Count;

    /// <summary>Number of integrated (charge-like) states.</summary>
    public int StateCount => stateScales.Count;

    /// <summary>Circuit node names and their unknown index (reference excluded).</summary>
    public IReadOnlyDictionary<string, int> Nodes => nodes;

    /// <summary>Branch-current unknowns by element id.</summary>
    public IReadOnlyDictionary<string, int> Branches => branches;

    /// <summary>Human-readable name of each unknown.</summary>
    public IReadOnlyList<string> Names => names;

    /// <summary>Kind of each unknown.</summary>
    public IReadOnlyList<UnknownKind> Kinds => kinds;

    /// <summary>Element that owns each unknown (null for circuit nodes).</summary>
    public IReadOnlyList<string?> Owners => owners;

    /// <summary>Normalising scale of each state: dividing the state by it gives volts or amperes.</summary>
    public IReadOnlyList<double> StateScales => stateScales;

    /// <summary>True for states whose normalised value is a current (inductor flux / L) rather than a voltage.</summary>
    public IReadOnlyList<bool> StateIsCurrent => stateIsCurrent;

    /// <summary>Owning element of each state.</summary>
    public IReadOnlyList<string> StateOwners => stateOwners;

    /// <summary>True for the reference node <see cref="Circuit.Ground"/>.</summary>
    public static bool IsReference(string name) => string.Equals(name, Circuit.Ground, StringComparison.Ordinal);

    /// <summary>Index of a circuit node, creating it on first use; −1 for the reference.</summary>
    public int Node(string name)
    {
        if (IsReference(name)) return -1;
        if (nodes.TryGetValue(name, out int index)) return index;
        index = Add(name, UnknownKind.NodeVoltage, null);
        nodes.Add(name, index);
        return index;
    }

    /// <summary>Adds an element-internal node.</summary>
    public int InternalNode(string owner, string label) => Add(owner + "#" + label, UnknownKind.NodeVoltage, owner);

    /// <summary>Adds the branch-current unknown of an element (one per element).</summary>
    public int Branch(string owner)
    {
        int index = Add(owner + "#i", UnknownKind.BranchCurrent, owner);
        branches.Add(owner, index);
        return index;
    }

    /// <summary>Adds a model-state unknown.</summary>
    public int ModelState(string owner, string label) => Add(owner + "#" + label, UnknownKind.ModelState, owner);

    /// <summary>Allocates an integrated state whose value divided by <paramref name="scale"/> is in V or A.</summary>
    public int IntegratedState(string owner, double scale, bool isCurrent = false)
    {
        stateIsCurrent.Add(isCurrent);
        stateScales.Add(scale);
        stateOwners.Add(owner);
        return stateScales.Count - 1;
    }

    private int Add(string name, UnknownKind kind, string? owner)
    {
        names.Add(name);
        kinds.Add(kind);
        owners.Add(owner);
        return names.Count - 1;
    }
}
