namespace DesignRules.Simulation.Elements;

/// <summary>An independent current source driving the waveform's current out of node From, through the source, into node To.</summary>
internal sealed record CurrentSourceDefinition(string Id, string From, string To, Waveform Waveform) : ElementDefinition(Id)
{
    public override IEnumerable<string> Nodes => [From, To];

    public override IEnumerable<(string A, string B)> DcPaths => [];

    public override string? Validate() => Waveform is null ? "waveform is missing" : Waveform.Validate();

    public override Device Compile(CircuitLayout layout) => new CurrentSourceDevice(Id, layout.Node(From), layout.Node(To), Waveform);
}

/// <summary>Compiled independent current source.</summary>
internal sealed class CurrentSourceDevice(string id, int from, int to, Waveform waveform) : Device(id)
{
    public override bool IsLinearInDc => true;

    public Waveform Waveform { get; } = waveform;

    public override void Load(LoadContext context)
    {
        double current = SourceValues.Value(context, Id, Waveform);
        context.AddRhs(from, -current);
        context.AddRhs(to, current);
    }

    public override void StoreCharges(LoadContext context)
    {
    }

    public override void LoadAc(AcLoadContext context)
    {
        var current = context.SourcePhasor(Id);
        context.AddRhs(from, -current);
        context.AddRhs(to, current);
    }
}
