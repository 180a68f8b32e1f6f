namespace DesignRules.Simulation.Elements;

/// <summary>
/// An ideal voltage-controlled voltage source: v(OutPlus) − v(OutMinus) = Gain·(v(ControlPlus) − v(ControlMinus)).
/// Its branch current flows from OutPlus through the source to OutMinus.
/// </summary>
internal sealed record ControlledVoltageSourceDefinition(string Id, string OutPlus, string OutMinus, string ControlPlus, string ControlMinus, double Gain)
    : ElementDefinition(Id)
{
    public override IEnumerable<string> Nodes => [OutPlus, OutMinus, ControlPlus, ControlMinus];

    public override IEnumerable<(string A, string B)> DcPaths => [(OutPlus, OutMinus)];

    public override bool ReportsCurrent => true;

    public override string? Validate() => double.IsFinite(Gain) ? null : "gain must be finite";

    public override Device Compile(CircuitLayout layout)
    {
        int op = layout.Node(OutPlus), on = layout.Node(OutMinus), cp = layout.Node(ControlPlus), cn = layout.Node(ControlMinus);
        return new ControlledVoltageSourceDevice(Id, op, on, cp, cn, layout.Branch(Id), Gain);
    }
}

/// <summary>Compiled voltage-controlled voltage source.</summary>
internal sealed class ControlledVoltageSourceDevice(string id, int outPlus, int outMinus, int controlPlus, int controlMinus, int branch, double gain) : Device(id)
{
    public override bool IsLinearInDc => true;

    public override void Load(LoadContext context)
    {
        context.Add(outPlus, branch, 1);
        context.Add(outMinus, branch, -1);
        context.Add(branch, outPlus, 1);
        context.Add(branch, outMinus, -1);
        context.Add(branch, controlPlus, -gain);
        context.Add(branch, controlMinus, gain);
    }

    public override void StoreCharges(LoadContext context)
    {
    }

    public override void LoadAc(AcLoadContext context)
    {
        context.Add(outPlus, branch, 1);
        context.Add(outMinus, branch, -1);
        context.Add(branch, outPlus, 1);
        context.Add(branch, outMinus, -1);
        context.Add(branch, controlPlus, -gain);
        context.Add(branch, controlMinus, gain);
    }
}
