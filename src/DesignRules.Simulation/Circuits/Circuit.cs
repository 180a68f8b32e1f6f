namespace DesignRules.Simulation.Circuits;

/// <summary>
/// A circuit under construction: named nodes and elements with unique ids. Nodes come into being when an element
/// names them; <see cref="Ground"/> ("ground") is the reference node. Values are SI doubles.
/// <para>Problems with element values (a zero resistance, a duplicate id, a pulse whose edges do not fit) are recorded
/// in <see cref="Problems"/> rather than thrown; every analysis of a circuit with problems returns a failure naming the
/// element. Null or empty ids and node names are programming errors and throw.</para>
/// </summary>
public sealed partial class Circuit
{
    private readonly List<ElementDefinition> elements = [];
    private readonly HashSet<string> ids = new(StringComparer.Ordinal);
    private readonly List<string> nodeNames = [];
    private readonly HashSet<string> knownNodes = new(StringComparer.Ordinal);
    private readonly List<SimulationFailure> problems = [];

    /// <summary>Circuit temperature in K (default 298.15 K = 25 °C); sets the diodes' thermal voltage.</summary>
    public double Temperature { get; set; } = PhysicalConstants.DefaultTemperature;

    /// <summary>Element ids in the order added.</summary>
    public IEnumerable<string> ElementIds => elements.Select(e => e.Id);

    /// <summary>Non-reference node names in order of first use.</summary>
    public IReadOnlyList<string> NodeNames => nodeNames;

    /// <summary>Problems found while adding elements (empty when the circuit is well formed).</summary>
    public IReadOnlyList<SimulationFailure> Problems => problems;

    /// <summary>Number of elements.</summary>
    public int ElementCount => elements.Count;

    internal IReadOnlyList<ElementDefinition> Elements => elements;

    /// <summary>The name of the reference node; every other name is an ordinary node.</summary>
    public const string Ground = "ground";

    /// <summary>True for the reference node <see cref="Ground"/>.</summary>
    /// <param name="node">Node name.</param>
    public static bool IsReference(string node) => CircuitLayout.IsReference(node);

    /// <summary>True when an element with this id exists.</summary>
    /// <param name="id">Element id.</param>
    public bool ContainsElement(string id) => ids.Contains(id);

    /// <summary>True when a non-reference node of this name exists.</summary>
    /// <param name="node">Node name.</param>
    public bool ContainsNode(string node) => knownNodes.Contains(node);

    /// <summary>Adds a resistor of <paramref name="resistance"/> Ω between two nodes.</summary>
    /// <param name="id">Unique element id.</param>
    /// <param name="a">First node.</param>
    /// <param name="b">Second node.</param>
    /// <param name="resistance">Resistance in Ω (positive).</param>
    public Circuit AddResistor(string id, string a, string b, double resistance) => Add(new ResistorDefinition(id, a, b, resistance));

    /// <summary>Adds a capacitor of <paramref name="capacitance"/> F between two nodes.</summary>
    /// <param name="id">Unique element id.</param>
    /// <param name="a">First node.</param>
    /// <param name="b">Second node.</param>
    /// <param name="capacitance">Capacitance in F (positive).</param>
    public Circuit AddCapacitor(string id, string a, string b, double capacitance) => Add(new CapacitorDefinition(id, a, b, capacitance));

    /// <summary>Adds an inductor of <paramref name="inductance"/> H; its current is reported flowing from <paramref name="a"/> to <paramref name="b"/>.</summary>
    /// <param name="id">Unique element id.</param>
    /// <param name="a">First node.</param>
    /// <param name="b">Second node.</param>
    /// <param name="inductance">Inductance in H (positive).</param>
    public Circuit AddInductor(string id, string a, string b, double inductance) => Add(new InductorDefinition(id, a, b, inductance));

    /// <summary>
    /// Adds an independent voltage source v(plus) − v(minus) = waveform. Its reported current flows from
    /// <paramref name="plus"/> through the source to <paramref name="minus"/> (negative when it delivers power).
    /// </summary>
    /// <param name="id">Unique element id.</param>
    /// <param name="plus">Positive terminal.</param>
    /// <param name="minus">Negative terminal.</param>
    /// <param name="waveform">Time function, AC magnitude and phase.</param>
    public Circuit AddVoltageSource(string id, string plus, string minus, Waveform waveform) => Add(new VoltageSourceDefinition(id, plus, minus, waveform));

    /// <summary>Adds a constant voltage source (see <see cref="AddVoltageSource(string, string, string, Waveform)"/>).</summary>
    /// <param name="id">Unique element id.</param>
    /// <param name="plus">Positive terminal.</param>
    /// <param name="minus">Negative terminal.</param>
    /// <param name="volts">Value in V.</param>
    public Circuit AddVoltageSource(string id, string plus, string minus, double volts) => AddVoltageSource(id, plus, minus, new DcWaveform(volts));

    /// <summary>Adds an independent current source pushing the waveform's current out of node <paramref name="from"/>, through the source, into node <paramref name="to"/>.</summary>
    /// <param name="id">Unique element id.</param>
    /// <param name="from">Node the current is taken from.</param>
    /// <param name="to">Node the current is delivered to.</param>
    /// <param name="waveform">Time function, AC magnitude and phase.</param>
    public Circuit AddCurrentSource(string id, string from, string to, Waveform waveform) => Add(new CurrentSourceDefinition(id, from, to, waveform));

    /// <summary>Adds a constant current source (see <see cref="AddCurrentSource(string, string, string, Waveform)"/>).</summary>
    /// <param name="id">Unique element id.</param>
    /// <param name="from">Node the current is taken from.</param>
    /// <param name="to">Node the current is delivered to.</param>
    /// <param name="amperes">Value in A.</param>
    public Circuit AddCurrentSource(string id, string from, string to, double amperes) => AddCurrentSource(id, from, to, new DcWaveform(amperes));

    /// <summary>Adds a junction diode conducting from <paramref name="anode"/> to <paramref name="cathode"/>.</summary>
    /// <param name="id">Unique element id.</param>
    /// <param name="anode">Anode node.</param>
    /// <param name="cathode">Cathode node.</param>
    /// <param name="model">Diode parameters (default: <see cref="DiodeModel.SmallSignal"/>).</param>
    public Circuit AddDiode(string id, string anode, string cathode, DiodeModel? model = null) => Add(new DiodeDefinition(id, anode, cathode, model ?? DiodeModel.SmallSignal));

    /// <summary>
    /// Adds an ideal voltage-controlled voltage source v(outPlus) − v(outMinus) = gain·(v(controlPlus) − v(controlMinus)),
    /// for example an ideal buffer. Its reported current flows from <paramref name="outPlus"/> through the source to <paramref name="outMinus"/>.
    /// </summary>
    /// <param name="id">Unique element id.</param>
    /// <param name="outPlus">Positive output terminal.</param>
    /// <param name="outMinus">Negative output terminal.</param>
    /// <param name="controlPlus">Positive control terminal.</param>
    /// <param name="controlMinus">Negative control terminal.</param>
    /// <param name="gain">Voltage gain.</param>
    public Circuit AddVoltageControlledVoltageSource(string id, string outPlus, string outMinus, string controlPlus, string controlMinus, double gain) =>
        Add(new ControlledVoltageSourceDefinition(id, outPlus, outMinus, controlPlus, controlMinus, gain));

    /// <summary>
    /// Adds a behavioural amplifier (see <see cref="AmplifierModel"/>) powered from fixed rails. Its reported current is
    /// the current its output pin delivers into <paramref name="output"/>.
    /// </summary>
    /// <param name="id">Unique element id.</param>
    /// <param name="nonInverting">Non-inverting input node.</param>
    /// <param name="inverting">Inverting input node.</param>
    /// <param name="output">Output node.</param>
    /// <param name="model">Amplifier parameters.</param>
    /// <param name="rails">Supply rails.</param>
    public Circuit AddAmplifier(string id, string nonInverting, string inverting, string output, AmplifierModel model, SupplyRails rails) =>
        Add(new AmplifierDefinition(id, nonInverting, inverting, output, model, rails));

    /// <summary>
    /// A copy with the named resistors' and capacitors' values replaced (Ω, F), every other element unchanged: a tolerance
    /// corner or a Monte Carlo sample of a linear analysis without building the circuit again from its design.
    /// </summary>
    /// <param name="values">New value by element id; ids of other kinds or unknown ids are ignored.</param>
    public Circuit WithValues(IReadOnlyDictionary<string, double> values)
    {
        ArgumentNullException.ThrowIfNull(values);
        var copy = new Circuit { Temperature = Temperature };
        foreach (var element in elements)
        {
            copy.Add(element switch
            {
                ResistorDefinition r when values.TryGetValue(r.Id, out var ohms) => r with { Resistance = ohms },
                CapacitorDefinition c when values.TryGetValue(c.Id, out var farads) => c with { Capacitance = farads },
                _ => element,
            });
        }

        return copy;
    }

    private Circuit Add(ElementDefinition element)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(element.Id);
        foreach (string node in element.Nodes) ArgumentException.ThrowIfNullOrWhiteSpace(node);
        if (!ids.Add(element.Id))
        {
            problems.Add(new SimulationFailure(FailureKind.UnusableElement, "an element with this id already exists") { ElementId = element.Id });
            return this;
        }

        if (element.Validate() is { } problem)
        {
            problems.Add(new SimulationFailure(FailureKind.UnusableElement, problem) { ElementId = element.Id });
        }

        foreach (string node in element.Nodes)
        {
            if (!IsReference(node) && knownNodes.Add(node)) nodeNames.Add(node);
        }

        elements.Add(element);
        return this;
    }
}
