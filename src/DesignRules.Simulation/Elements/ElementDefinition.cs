namespace DesignRules.Simulation.Elements;

/// <summary>
/// An element as added to a <see cref="Circuit"/>: its id, the nodes it touches, which of them it connects at DC,
/// and how to compile it into a <see cref="Device"/> for one analysis run.
/// </summary>
/// <param name="Id">Element id, unique in the circuit.</param>
internal abstract record ElementDefinition(string Id)
{
    /// <summary>Circuit nodes the element touches.</summary>
    public abstract IEnumerable<string> Nodes { get; }

    /// <summary>Pairs of nodes joined by a DC path through the element (<see cref="Circuit.Ground"/> stands for the reference).</summary>
    public abstract IEnumerable<(string A, string B)> DcPaths { get; }

    /// <summary>True for elements whose branch current the results report (sources, inductors, controlled sources, amplifiers).</summary>
    public virtual bool ReportsCurrent => false;

    /// <summary>Returns a description of the first unusable parameter, or null.</summary>
    public abstract string? Validate();

    /// <summary>Allocates unknowns and creates the device.</summary>
    public abstract Device Compile(CircuitLayout layout);
}
