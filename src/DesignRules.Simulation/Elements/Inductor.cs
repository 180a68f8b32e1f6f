using System.Numerics;

namespace DesignRules.Simulation.Elements;

/// <summary>A linear inductor between nodes A and B; its branch current flows from A through the inductor to B.</summary>
internal sealed record InductorDefinition(string Id, string A, string B, double Inductance) : ElementDefinition(Id)
{
    public override IEnumerable<string> Nodes => [A, B];

    public override IEnumerable<(string A, string B)> DcPaths => [(A, B)];

    public override bool ReportsCurrent => true;

    public override string? Validate() => Inductance > 0 && double.IsFinite(Inductance) ? null : "inductance must be positive and finite";

    public override Device Compile(CircuitLayout layout)
    {
        int a = layout.Node(A), b = layout.Node(B);
        return new InductorDevice(Id, a, b, layout.Branch(Id), Inductance, layout.IntegratedState(Id, Inductance, isCurrent: true));
    }
}

/// <summary>Compiled inductor: flux Φ = L·i, branch equation va − vb = dΦ/dt.</summary>
internal sealed class InductorDevice(string id, int a, int b, int branch, double inductance, int state) : Device(id)
{
    public override bool IsLinearInDc => true;

    public override void Load(LoadContext context)
    {
        context.Add(a, branch, 1);
        context.Add(b, branch, -1);
        context.Add(branch, a, 1);
        context.Add(branch, b, -1);
        double current = context.X[branch];
        double derivative = context.Derivative(state, inductance * current);
        context.Add(branch, branch, -context.Alpha * inductance);
        context.AddRhs(branch, derivative - (context.Alpha * inductance * current));
    }

    public override void StoreCharges(LoadContext context) => context.Derivative(state, inductance * context.X[branch]);

    public override void LoadAc(AcLoadContext context)
    {
        context.Add(a, branch, 1);
        context.Add(b, branch, -1);
        context.Add(branch, a, 1);
        context.Add(branch, b, -1);
        context.Add(branch, branch, new Complex(0, -context.Omega * inductance));
    }
}
