using DesignRules.Model;

namespace DesignRules.Blocks;

/// <summary>
/// Everything about one built-in block, in one place: its value names, yes/no options and part slots (the loader and the
/// JSON Schema ask these), its topology and ideal transfer (the elaborator asks <see cref="Build"/>), the equation the page
/// shows, the noise gain of each amplifier slot, the value across which its output is taken, and whether it rectifies,
/// takes a differential input or runs an amplifier open-loop by design (the rules ask these). Nobody else switches over
/// block names.
/// </summary>
/// <remarks>
/// The descriptors live in Core because the loader (<c>BlockStageReader</c>) and the design schema's test need each
/// block's names and slots, and Core references nothing of ours; Elaboration (which references Core and the engine) and
/// the rules and pages above it can all see Core. The topology is written against <see cref="IBlockCircuit"/>, an
/// interface Core declares and Elaboration's stage builder implements, so Core stays free of the engine.
/// </remarks>
public abstract class BlockDescriptor
{
    /// <summary>The block name used in design files.</summary>
    public abstract string Name { get; }

    /// <summary>One line on what it is (the page's description and the schema's).</summary>
    public abstract string Summary { get; }

    /// <summary>Component values that must be given.</summary>
    public virtual IReadOnlyList<string> RequiredValues => [];

    /// <summary>Component values that may be given.</summary>
    public virtual IReadOnlyList<string> OptionalValues => [];

    /// <summary>Yes/no options.</summary>
    public virtual IReadOnlyList<string> Flags => [];

    /// <summary>Amplifier slots (always filled).</summary>
    public virtual IReadOnlyList<string> AmplifierSlots => [];

    /// <summary>Amplifier slots filled only when the <c>buffer</c> option asks.</summary>
    public virtual IReadOnlyList<string> OptionalAmplifierSlots => [];

    /// <summary>Diode slots.</summary>
    public virtual IReadOnlyList<string> DiodeSlots => [];

    /// <summary>Every value name the block accepts.</summary>
    public IEnumerable<string> AllValues => RequiredValues.Concat(OptionalValues);

    /// <summary>
    /// True when the block's ideal transfer passes one or both half-cycles through a diode (a precision rectifier): the
    /// zero-crossing glitch and smallest-signal checks apply to it.
    /// </summary>
    public virtual bool Rectifies => false;

    /// <summary>True when the block, as the first stage, takes the two legs of a source with a common-mode level.</summary>
    public virtual bool TakesDifferentialInput => false;

    /// <summary>
    /// The value across which the stage's output is taken when no amplifier drives it (its output impedance is that
    /// resistor's), or null; where a fix for inter-stage loading is made.
    /// </summary>
    public virtual string? OutputValue => null;

    /// <summary>Adds the block's elements to <paramref name="circuit"/> and says which node is its output and its ideal transfer.</summary>
    /// <param name="circuit">The stage being built.</param>
    public abstract BlockOutput Build(IBlockCircuit circuit);

    /// <summary>The ideal transfer as an equation, with its value from the component values.</summary>
    /// <param name="values">The stage's component values.</param>
    public abstract string Equation(BlockValues values);

    /// <summary>
    /// The noise gain 1/β of the amplifier in <paramref name="slot"/> from the block's feedback network (textbook: 1 + Zf/Zg,
    /// where Zg is everything from the inverting input to signal sources and ground); null when it depends on frequency and
    /// must come from the circuit.
    /// </summary>
    /// <param name="slot">The amplifier slot.</param>
    /// <param name="values">The stage's component values.</param>
    public virtual double? NoiseGain(string slot, BlockValues values) => 1;

    /// <summary>The ideal second-order response of a filter block for the component values; null for a block that is no filter.</summary>
    /// <param name="values">The stage's component values.</param>
    public virtual FilterResponse? Filter(BlockValues values) => null;

    /// <summary>True when the loop of the amplifier in <paramref name="slot"/> opens by design for part of each cycle (a diode in the loop turns off).</summary>
    /// <param name="slot">The amplifier slot.</param>
    public virtual bool OpensLoopByDesign(string slot) => false;
}

/// <summary>The output node of a built block and its ideal transfer (see the elaborator's <c>IdealTransfer</c>).</summary>
/// <param name="Node">The stage output node.</param>
/// <param name="Kind">What kind of transfer it is.</param>
/// <param name="SlopePositive">Output change per volt of input for inputs at or above 0 V.</param>
/// <param name="SlopeNegative">Output change per volt of input for inputs below 0 V.</param>
/// <param name="Offset">Output for 0 V input, V.</param>
/// <param name="TimeConstant">The time constant of a block with memory (a hold or average), s.</param>
public sealed record BlockOutput(string Node, TransferKind Kind, double SlopePositive, double SlopeNegative, double Offset, double? TimeConstant = null)
{
    /// <summary>A linear gain: out = offset + gain·in.</summary>
    public static BlockOutput Linear(string node, double gain, double offset = 0) => new(node, TransferKind.Gain, gain, gain, offset);
}

/// <summary>The component values of a block stage as plain SI numbers (NaN for a value not given).</summary>
public sealed class BlockValues(Func<string, double?> lookup)
{
    /// <summary>The values of a loaded block stage.</summary>
    public static BlockValues Of(BlockStage stage) => new(name => stage.Values.TryGetValue(name, out var v) ? v.Value.Value.Value : null);

    /// <summary>The value in SI units, NaN when not given.</summary>
    public double this[string name] => lookup(name) ?? double.NaN;

    /// <summary>True when the value is given.</summary>
    public bool Has(string name) => lookup(name) is not null;

    /// <summary>The value, or null when not given.</summary>
    public double? Optional(string name) => lookup(name);
}

/// <summary>
/// The stage being built, as a block's topology sees it: nodes local to the stage, elements named by the block's values
/// and slots. Implemented by the elaborator, so that descriptors describe circuits without depending on the engine.
/// </summary>
public interface IBlockCircuit
{
    /// <summary>The reference node.</summary>
    string Ground { get; }

    /// <summary>The node feeding the stage.</summary>
    string Input { get; }

    /// <summary>The node of the inverting signal input of a differentially fed stage, <see cref="Ground"/> otherwise.</summary>
    string ReferenceInput { get; }

    /// <summary>The common-mode level of a differentially fed stage, V (0 otherwise).</summary>
    double CommonMode { get; }

    /// <summary>A node local to the stage.</summary>
    string Node(string name);

    /// <summary>True when the block has this value.</summary>
    bool Has(string name);

    /// <summary>True when the block's yes/no option is set.</summary>
    bool Flag(string name);

    /// <summary>A block value after the analysis's overrides, SI units.</summary>
    double Value(string name);

    /// <summary>Adds the resistor named by a block value.</summary>
    void Resistor(string name, string a, string b);

    /// <summary>Adds the capacitor named by a block value.</summary>
    void Capacitor(string name, string a, string b);

    /// <summary>Adds one of several resistors that share a block value (an equal-component form), as its own part <paramref name="element"/>.</summary>
    void Resistor(string value, string element, string a, string b);

    /// <summary>Adds one of several capacitors that share a block value, as its own part <paramref name="element"/>.</summary>
    void Capacitor(string value, string element, string a, string b);

    /// <summary>Adds the amplifier of a slot.</summary>
    void Amplifier(string slot, string plus, string minus, string output);

    /// <summary>Adds the diode of a slot.</summary>
    void Diode(string slot, string anode, string cathode);

    /// <summary>Adds a DC voltage source local to the stage (a bias level).</summary>
    void Source(string name, string plus, string minus, double volts);

    /// <summary>Marks a node held at virtual ground by feedback.</summary>
    void SummingJunction(string node);
}

/// <summary>The built-in blocks.</summary>
public static class BlockCatalog
{
    /// <summary>Every built-in block, by name.</summary>
    public static IReadOnlyDictionary<string, BlockDescriptor> All { get; } = new BlockDescriptor[]
    {
        new InvertingBlock(), new NonInvertingBlock(), new FollowerBlock(), new DifferenceBlock(), new SummingBlock(),
        new HalfWaveInvertingBlock(), new HalfWaveFollowerBlock(), new AbsoluteValueBlock(), new PeakDetectorBlock(), new AveragingFilterBlock(),
        new SallenKeyLowPassBlock(), new SallenKeyLowPassEqualBlock(), new SallenKeyHighPassBlock(), new SallenKeyHighPassEqualBlock(),
        new MultipleFeedbackBandPassBlock(), new MultipleFeedbackLowPassBlock(),
    }.ToDictionary(b => b.Name, StringComparer.Ordinal);
}
