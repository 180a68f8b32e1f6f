using System.Numerics;

namespace DesignRules.Simulation.Elements;

/// <summary>A linear capacitor between nodes A and B.</summary>
internal sealed record CapacitorDefinition(string Id, string A, string B, double Capacitance) : ElementDefinition(Id)
{
    public override IEnumerable<string> Nodes => [A, B];

    public override IEnumerable<(string A, string B)> DcPaths => [];

    public override string? Validate() => Capacitance > 0 && double.IsFinite(Capacitance) ? null : "capacitance must be positive and finite";

    public override Device Compile(CircuitLayout layout) =>
        new CapacitorDevice(Id, layout.Node(A), layout.Node(B), Capacitance, layout.IntegratedState(Id, Capacitance));
}

/// <summary>Compiled capacitor: charge q = C·(va − vb), current dq/dt from the integration formula.</summary>
internal sealed class CapacitorDevice(string id, int a, int b, double capacitance, int state) : Device(id)
{
    public override bool IsLinearInDc => true;

    public override void Load(LoadContext context)
    {
        double v = context.V(a) - context.V(b);
        double current = context.Derivative(state, capacitance * v);
        context.NonlinearBranch(a, b, current, context.Alpha * capacitance, v);
    }

    public override void StoreCharges(LoadContext context) => context.Derivative(state, capacitance * (context.V(a) - context.V(b)));

    public override void LoadAc(AcLoadContext context) => context.Admittance(a, b, new Complex(0, context.Omega * capacitance));
}
