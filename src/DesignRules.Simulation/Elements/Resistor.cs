namespace DesignRules.Simulation.Elements;

/// <summary>A linear resistor between nodes A and B.</summary>
internal sealed record ResistorDefinition(string Id, string A, string B, double Resistance) : ElementDefinition(Id)
{
    public override IEnumerable<string> Nodes => [A, B];

    public override IEnumerable<(string A, string B)> DcPaths => [(A, B)];

    public override string? Validate() => Resistance > 0 && double.IsFinite(Resistance) ? null : "resistance must be positive and finite";

    public override Device Compile(CircuitLayout layout) => new ResistorDevice(Id, layout.Node(A), layout.Node(B), 1 / Resistance);
}

/// <summary>Compiled resistor: conductance G = 1/R.</summary>
internal sealed class ResistorDevice(string id, int a, int b, double conductance) : Device(id)
{
    public override bool IsLinearInDc => true;

    /// <summary>Unknown index of node A (−1 for the reference).</summary>
    public int A => a;

    /// <summary>Unknown index of node B (−1 for the reference).</summary>
    public int B => b;

    /// <summary>G = 1/R; a tolerance run changes it in place instead of compiling the circuit again.</summary>
    public double Conductance
    {
        get => conductance;
        set => conductance = value;
    }

    public override void Load(LoadContext context) => context.Conductance(a, b, conductance);

    public override void StoreCharges(LoadContext context)
    {
    }

    public override void LoadAc(AcLoadContext context) => context.Admittance(a, b, conductance);
}
