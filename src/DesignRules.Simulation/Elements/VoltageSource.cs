namespace DesignRules.Simulation.Elements;

/// <summary>
/// An independent voltage source v(Plus) − v(Minus) = waveform. Its branch current is the current flowing from the
/// Plus node through the source to the Minus node (so a source delivering power reports a negative current).
/// </summary>
internal sealed record VoltageSourceDefinition(string Id, string Plus, string Minus, Waveform Waveform) : ElementDefinition(Id)
{
    public override IEnumerable<string> Nodes => [Plus, Minus];

    public override IEnumerable<(string A, string B)> DcPaths => [(Plus, Minus)];

    public override bool ReportsCurrent => true;

    public override string? Validate() => Waveform is null ? "waveform is missing" : Waveform.Validate();

    public override Device Compile(CircuitLayout layout)
    {
        int plus = layout.Node(Plus), minus = layout.Node(Minus);
        return new VoltageSourceDevice(Id, plus, minus, layout.Branch(Id), Waveform);
    }
}

/// <summary>Compiled independent voltage source.</summary>
internal sealed class VoltageSourceDevice(string id, int plus, int minus, int branch, Waveform waveform) : Device(id)
{
    public override bool IsLinearInDc => true;

    public Waveform Waveform { get; } = waveform;

    public override void Load(LoadContext context)
    {
        context.Add(plus, branch, 1);
        context.Add(minus, branch, -1);
        context.Add(branch, plus, 1);
        context.Add(branch, minus, -1);
        context.AddRhs(branch, SourceValues.Value(context, Id, Waveform));
    }

    public override void StoreCharges(LoadContext context)
    {
    }

    public override void LoadAc(AcLoadContext context)
    {
        context.Add(plus, branch, 1);
        context.Add(minus, branch, -1);
        context.Add(branch, plus, 1);
        context.Add(branch, minus, -1);
        context.AddRhs(branch, context.SourcePhasor(Id));
    }
}

/// <summary>How independent sources pick their value in each analysis.</summary>
internal static class SourceValues
{
    /// <summary>DC analyses use the waveform's quiescent value, the transient its value at the present time; a swept source uses the sweep value.</summary>
    public static double Value(LoadContext context, string id, Waveform waveform)
    {
        double value = context.OverrideSource is { } swept && string.Equals(swept, id, StringComparison.Ordinal)
            ? context.OverrideValue
            : context.Mode == AnalysisMode.Transient || context.UseTimeValues ? waveform.ValueAt(context.Time) : waveform.DcValue;
        return value * context.SourceScale;
    }
}
