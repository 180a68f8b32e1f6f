using DesignRules.Simulation;

namespace DesignRules.Elaboration;

/// <summary>Which end of a source's frequency band the chain is driven at.</summary>
public enum BandEnd
{
    /// <summary>The top of the band (the slew and bandwidth corner).</summary>
    Top,

    /// <summary>The bottom of the band (the ripple and coupling corner).</summary>
    Bottom,
}

/// <summary>Which input offset voltage every amplifier gets, unless overridden per amplifier.</summary>
public enum OffsetCorner
{
    /// <summary>0 V: the nominal circuit.</summary>
    Nominal,

    /// <summary>+ the part's maximum offset voltage.</summary>
    MaximumPositive,

    /// <summary>− the part's maximum offset voltage.</summary>
    MaximumNegative,
}

/// <summary>Which input bias current every amplifier gets, unless overridden per amplifier.</summary>
public enum BiasCorner
{
    /// <summary>The part's typical bias current, flowing into both inputs (no offset current).</summary>
    Typical,

    /// <summary>The part's maximum bias current, flowing into both inputs.</summary>
    Maximum,

    /// <summary>No bias current.</summary>
    None,
}

/// <summary>Bias currents of one amplifier, each flowing from its input node into the amplifier, A.</summary>
/// <param name="NonInverting">Into the + input.</param>
/// <param name="Inverting">Into the − input.</param>
public sealed record BiasCurrents(double NonInverting, double Inverting);

/// <summary>
/// Choices made when a design is turned into a circuit: test frequency and amplitude, temperature, and the variations a
/// tolerance analysis applies (component values, amplifier offsets and bias currents, diode saturation currents).
/// Keys of the per-element dictionaries are engine element ids: <c>stageId.name</c>, e.g. <c>rect.r4</c>, <c>rect.u1</c>,
/// <c>rect.d2</c> (a netlist element keeps its own id: <c>smoothing.r1</c>).
/// </summary>
public sealed record ElaborationOptions
{
    /// <summary>The default options: band top, full amplitude, nominal offsets, typical bias currents, 25 °C.</summary>
    public static ElaborationOptions Default { get; } = new();

    /// <summary>Band end the source is driven at when it gives a band rather than a frequency.</summary>
    public BandEnd BandEnd { get; init; } = BandEnd.Top;

    /// <summary>A test frequency in Hz that replaces the source's own (every component of a sum is scaled by the same ratio); null keeps the design's.</summary>
    public double? Frequency { get; init; }

    /// <summary>Factor applied to the source amplitude (to the level itself for a DC source); offsets are kept.</summary>
    public double AmplitudeScale { get; init; } = 1;

    /// <summary>Circuit temperature in K (sets the diodes' thermal voltage).</summary>
    public double Temperature { get; init; } = PhysicalConstants.DefaultTemperature;

    /// <summary>Offset voltage of every amplifier not named in <see cref="OffsetVoltages"/>.</summary>
    public OffsetCorner Offset { get; init; } = OffsetCorner.Nominal;

    /// <summary>Bias currents of every amplifier not named in <see cref="BiasCurrents"/>.</summary>
    public BiasCorner Bias { get; init; } = BiasCorner.Typical;

    /// <summary>Component values (SI units) that replace the design's, by element id (<c>rect.r4</c>, <c>smooth.c</c>, <c>sum.bias</c>).</summary>
    public IReadOnlyDictionary<string, double> Values { get; init; } = new Dictionary<string, double>(StringComparer.Ordinal);

    /// <summary>Input offset voltages in V by amplifier element id (<c>rect.u1</c>), in series with the + input.</summary>
    public IReadOnlyDictionary<string, double> OffsetVoltages { get; init; } = new Dictionary<string, double>(StringComparer.Ordinal);

    /// <summary>Bias currents by amplifier element id.</summary>
    public IReadOnlyDictionary<string, BiasCurrents> BiasCurrents { get; init; } = new Dictionary<string, BiasCurrents>(StringComparer.Ordinal);

    /// <summary>Factor applied to the saturation current of every diode (e.g. 0.5 and 2 for a forward-voltage spread).</summary>
    public double DiodeSaturationScale { get; init; } = 1;

    /// <summary>Further per-diode saturation-current factors by diode element id (<c>rect.d1</c>), applied on top of <see cref="DiodeSaturationScale"/>.</summary>
    public IReadOnlyDictionary<string, double> DiodeSaturationScales { get; init; } = new Dictionary<string, double>(StringComparer.Ordinal);

    /// <summary>
    /// False to build every amplifier without its output current limit, so that a transient shows the current the circuit
    /// demands of each output rather than the current a limited output delivers (default true: the part's limit applies).
    /// </summary>
    public bool OutputCurrentLimits { get; init; } = true;

    /// <summary>Periods allowed for start-up before the suggested measurement window (default 3).</summary>
    public int StartupPeriods { get; init; } = 3;

    /// <summary>Periods in the suggested measurement window (default 5).</summary>
    public int MeasuredPeriods { get; init; } = 5;

    /// <summary>Time points per period of the fastest source component that the largest transient step must allow (default 200).</summary>
    public int StepsPerPeriod { get; init; } = 200;
}
