using DesignRules.Blocks;
using DesignRules.Diagnostics;
using DesignRules.Model;
using DesignRules.Simulation;

namespace DesignRules.Elaboration;

/// <summary>What every stage of one chain shares while it is built: the circuit, the options, the rails and the bookkeeping.</summary>
internal sealed class ChainContext(Circuit circuit, ElaborationOptions options, SupplyRails rails)
{
    public Circuit Circuit { get; } = circuit;

    public ElaborationOptions Options { get; } = options;

    public SupplyRails Rails { get; } = rails;

    public List<ElaborationProblem> Problems { get; } = [];

    public Dictionary<string, SourceSpan> ElementSpans { get; } = new(StringComparer.Ordinal);

    public Dictionary<string, SourceSpan> NodeSpans { get; } = new(StringComparer.Ordinal);

    /// <summary>Override keys that named an element of the chain.</summary>
    public HashSet<string> UsedOverrides { get; } = new(StringComparer.Ordinal);

    public void Problem(string message, SourceSpan span, string? elementId = null) => Problems.Add(new ElaborationProblem(message, span, elementId));

    public void Locate(string elementId, SourceSpan span) => ElementSpans.TryAdd(elementId, span);

    public void LocateNode(string node, SourceSpan span)
    {
        if (!Circuit.IsReference(node)) NodeSpans.TryAdd(node, span);
    }
}

/// <summary>
/// Adds the elements of one stage to the chain's circuit with ids and local node names prefixed by the stage id, applying
/// the options' overrides, and collects the stage's probe.
/// </summary>
internal sealed class StageBuilder : IBlockCircuit
{
    private readonly ChainContext chain;
    private readonly List<AmplifierProbe> amplifiers = [];
    private readonly List<DiodeProbe> diodes = [];
    private readonly List<ComponentProbe> components = [];
    private readonly List<string> junctions = [];

    public StageBuilder(ChainContext chain, Stage stage, string input, string referenceInput, double commonMode)
    {
        this.chain = chain;
        Stage = stage;
        Id = stage.Id.Value;
        Input = input;
        ReferenceInput = referenceInput;
        CommonMode = commonMode;
    }

    public Stage Stage { get; }

    public string Id { get; }

    /// <summary>The node feeding the stage.</summary>
    public string Input { get; }

    /// <summary>The node of the inverting signal input of a differentially fed stage, <see cref="Circuit.Ground"/> otherwise.</summary>
    public string ReferenceInput { get; }

    /// <summary>The common-mode level of a differentially fed stage, V (0 otherwise).</summary>
    public double CommonMode { get; }

    public ElaborationOptions Options => chain.Options;

    /// <inheritdoc/>
    public string Ground => Circuit.Ground;

    private BlockStage? Block => Stage as BlockStage;

    /// <summary>A node local to the stage: <c>stageId.name</c>.</summary>
    public string Node(string name)
    {
        string node = $"{Id}.{name}";
        chain.LocateNode(node, Stage.Span);
        return node;
    }

    /// <summary>True when the block has this value (required or given optional).</summary>
    public bool Has(string name) => Block?.Values.ContainsKey(name) ?? false;

    /// <summary>True when the block's yes/no option is set.</summary>
    public bool Flag(string name) => Block?.Flags.TryGetValue(name, out var flag) == true && flag.Value;

    /// <summary>A block value after overrides (SI units); NaN with a problem when it is missing.</summary>
    public double Value(string name)
    {
        string key = $"{Id}.{name}";
        if (Options.Values.TryGetValue(key, out double overridden))
        {
            chain.UsedOverrides.Add(key);
            return overridden;
        }

        if (Block is not null && Block.Values.TryGetValue(name, out var value)) return value.Si;
        chain.Problem($"stage '{Id}' has no value '{name}'", Stage.Span, key);
        return double.NaN;
    }

    /// <summary>Adds a resistor named by a block value between two nodes.</summary>
    public void Resistor(string name, string a, string b) => Passive(name, ElementKind.Resistor, a, b);

    /// <summary>Adds a capacitor named by a block value between two nodes.</summary>
    public void Capacitor(string name, string a, string b) => Passive(name, ElementKind.Capacitor, a, b);

    /// <summary>Adds one of several resistors sharing a block value, as its own element (its own override key and tolerance).</summary>
    public void Resistor(string value, string element, string a, string b) => Passive(value, element, ElementKind.Resistor, a, b);

    /// <summary>Adds one of several capacitors sharing a block value, as its own element.</summary>
    public void Capacitor(string value, string element, string a, string b) => Passive(value, element, ElementKind.Capacitor, a, b);

    private void Passive(string name, ElementKind kind, string a, string b) => Passive(name, name, kind, a, b);

    private void Passive(string valueName, string element, ElementKind kind, string a, string b)
    {
        var value = Block?.Values.GetValueOrDefault(valueName);
        Passive(element, kind, a, b, value?.Si ?? double.NaN, value?.ResistorFamily, value?.CapacitorFamily, value?.Value.Span ?? Stage.Span);
    }

    /// <summary>Adds a resistor, capacitor or inductor with an explicit nominal value (overrides still apply).</summary>
    public void Passive(string name, ElementKind kind, string a, string b, double nominal, ResistorFamily? resistorFamily, CapacitorFamily? capacitorFamily, SourceSpan span)
    {
        string id = $"{Id}.{name}";
        double value = nominal;
        if (Options.Values.TryGetValue(id, out double overridden))
        {
            chain.UsedOverrides.Add(id);
            value = overridden;
        }

        chain.Locate(id, span);
        switch (kind)
        {
            case ElementKind.Resistor: chain.Circuit.AddResistor(id, a, b, value); break;
            case ElementKind.Capacitor: chain.Circuit.AddCapacitor(id, a, b, value); break;
            case ElementKind.Inductor: chain.Circuit.AddInductor(id, a, b, value); break;
            default: throw new ArgumentOutOfRangeException(nameof(kind), kind, "not a passive element");
        }

        components.Add(new ComponentProbe(name, id, kind, a, b, value, nominal, resistorFamily, capacitorFamily, span));
    }

    /// <summary>Adds an independent DC voltage source local to the stage (e.g. a bias level), located at the stage.</summary>
    public void Source(string name, string plus, string minus, double volts) => Source(name, plus, minus, volts, Stage.Span);

    /// <summary>Adds an independent DC voltage source local to the stage (e.g. a bias level).</summary>
    public void Source(string name, string plus, string minus, double volts, SourceSpan span)
    {
        string id = $"{Id}.{name}";
        chain.Locate(id, span);
        chain.Circuit.AddVoltageSource(id, plus, minus, volts);
    }

    /// <summary>Adds the amplifier of a block slot.</summary>
    public void Amplifier(string slot, string plus, string minus, string output)
    {
        if (Block?.Amplifiers.TryGetValue(slot, out var part) == true)
        {
            Amplifier(slot, part, plus, minus, output, PartSpan(slot));
        }
        else
        {
            chain.Problem($"stage '{Id}' has no amplifier part for slot '{slot}'", Stage.Span, $"{Id}.{slot}");
        }
    }

    /// <summary>Adds an amplifier of a given part, powered from the chain's rails, with the options' offset and bias currents.</summary>
    public void Amplifier(string slot, AmplifierPart part, string plus, string minus, string output, SourceSpan span)
    {
        string id = $"{Id}.{slot}";
        double offset = Options.OffsetVoltages.TryGetValue(id, out double vos) ? Use(id, vos) : PartModels.OffsetVoltage(part, Options.Offset);
        var bias = Options.BiasCurrents.TryGetValue(id, out var ib) ? Use(id, ib) : PartModels.BiasCurrents(part, Options.Bias);
        var model = PartModels.Amplifier(part, offset, bias);
        if (!Options.OutputCurrentLimits)
        {
            model = model with { OutputCurrentLimit = null };
        }

        chain.Locate(id, span);
        chain.Circuit.AddAmplifier(id, plus, minus, output, model, chain.Rails);
        amplifiers.Add(new AmplifierProbe(slot, id, plus, minus, output, part, model, chain.Rails));
    }

    /// <summary>Adds the diode of a block slot.</summary>
    public void Diode(string slot, string anode, string cathode)
    {
        if (Block?.Diodes.TryGetValue(slot, out var part) == true)
        {
            Diode(slot, part, anode, cathode, PartSpan(slot));
        }
        else
        {
            chain.Problem($"stage '{Id}' has no diode part for slot '{slot}'", Stage.Span, $"{Id}.{slot}");
        }
    }

    /// <summary>Adds a diode of a given part with the options' saturation-current scale.</summary>
    public void Diode(string slot, DiodePart part, string anode, string cathode, SourceSpan span)
    {
        string id = $"{Id}.{slot}";
        double scale = Options.DiodeSaturationScale * (Options.DiodeSaturationScales.TryGetValue(id, out double own) ? Use(id, own) : 1);
        chain.Locate(id, span);
        if (!PartModels.TryDiode(part, Options.Temperature, scale, out var model, out string problem))
        {
            chain.Problem(problem, part.Span, id);
            return;
        }

        chain.Circuit.AddDiode(id, anode, cathode, model);
        diodes.Add(new DiodeProbe(slot, id, anode, cathode, part, model));
    }

    /// <summary>Records a problem of this stage.</summary>
    public void ReportProblem(string message, SourceSpan span, string? elementId) => chain.Problem(message, span, elementId);

    /// <summary>Marks a node held at virtual ground by feedback.</summary>
    public void SummingJunction(string node) => junctions.Add(node);

    /// <summary>The probe of a finished block stage: its output node and ideal transfer as the block's descriptor gives them.</summary>
    public StageProbe Finish(BlockOutput output) =>
        Finish(output.Node, new IdealTransfer(output.Kind, output.SlopePositive, output.SlopeNegative, output.Offset), output.TimeConstant);

    /// <summary>The probe of the finished stage.</summary>
    public StageProbe Finish(string output, IdealTransfer transfer, double? timeConstant = null) =>
        new(Id, Stage, Input, ReferenceInput, output, amplifiers.ToArray(), diodes.ToArray(), components.ToArray(), junctions.ToArray(), transfer, timeConstant);

    /// <summary>Where the part of a block slot is named (the stage when the loader recorded no span).</summary>
    private SourceSpan PartSpan(string slot) => Block?.PartSpans.GetValueOrDefault(slot) ?? Stage.Span;

    private T Use<T>(string key, T value)
    {
        chain.UsedOverrides.Add(key);
        return value;
    }
}
