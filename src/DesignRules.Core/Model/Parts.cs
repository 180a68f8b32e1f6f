using DesignRules.Diagnostics;
using DesignRules.Quantities;

namespace DesignRules.Model;

/// <summary>A value with a typical and a maximum (guaranteed) figure, as data sheets give offsets and bias currents.</summary>
/// <param name="Typical">The typical figure.</param>
/// <param name="Maximum">The maximum figure.</param>
public sealed record TypicalAndMaximum(Located<Quantity> Typical, Located<Quantity> Maximum);

/// <summary>A figure for each rail, e.g. the headroom between the output swing and each supply.</summary>
/// <param name="Positive">Toward the positive rail.</param>
/// <param name="Negative">Toward the negative rail.</param>
public sealed record PerRail(Located<Quantity> Positive, Located<Quantity> Negative);

/// <summary>An operational amplifier class or part.</summary>
/// <param name="Id">The part id.</param>
/// <param name="Description">What class of part this is.</param>
/// <param name="Typical">True when the figures are class-typical rather than guaranteed.</param>
/// <param name="GainBandwidth">Gain-bandwidth product.</param>
/// <param name="SlewRising">Slew rate of a rising output.</param>
/// <param name="SlewFalling">Slew rate of a falling output.</param>
/// <param name="OpenLoopGain">DC open-loop gain as a ratio.</param>
/// <param name="SecondPole">Optional second pole frequency.</param>
/// <param name="OutputHeadroom">Output swing headroom to each rail.</param>
/// <param name="HeadroomLoad">The load resistance the headroom is specified at, if given.</param>
/// <param name="OutputResistance">Open-loop output resistance.</param>
/// <param name="OutputCurrent">Rated output current (short-circuit limit).</param>
/// <param name="InputRange">Headroom of the input common-mode range to each rail (negative reaches beyond the rail).</param>
/// <param name="OffsetVoltage">Input offset voltage.</param>
/// <param name="BiasCurrent">Input bias current.</param>
/// <param name="MinStableGain">Lowest noise gain at which the part is stable.</param>
/// <param name="SupplySpanMinimum">Lowest total supply span.</param>
/// <param name="SupplySpanMaximum">Highest total supply span.</param>
/// <param name="MaxDifferentialInput">Largest differential input voltage, if limited.</param>
/// <param name="NoiseDensity">Input voltage noise density, if given.</param>
/// <param name="OverloadRecovery">Overload recovery time, if given.</param>
/// <param name="Span">Where the part is defined.</param>
public sealed record AmplifierPart(
    Located<string> Id,
    string Description,
    bool Typical,
    Located<Quantity> GainBandwidth,
    Located<Quantity> SlewRising,
    Located<Quantity> SlewFalling,
    Located<Quantity> OpenLoopGain,
    Located<Quantity>? SecondPole,
    PerRail OutputHeadroom,
    Located<Quantity>? HeadroomLoad,
    Located<Quantity> OutputResistance,
    Located<Quantity> OutputCurrent,
    PerRail InputRange,
    TypicalAndMaximum OffsetVoltage,
    TypicalAndMaximum BiasCurrent,
    Located<Quantity> MinStableGain,
    Located<Quantity> SupplySpanMinimum,
    Located<Quantity> SupplySpanMaximum,
    Located<Quantity>? MaxDifferentialInput,
    Located<Quantity>? NoiseDensity,
    Located<Quantity>? OverloadRecovery,
    SourceSpan Span)
{
    /// <summary>
    /// Input offset current (the difference of the two inputs' bias currents), if the part states it; without it the
    /// offset budget takes the two bias currents as equal.
    /// </summary>
    public TypicalAndMaximum? OffsetCurrent { get; init; }

    /// <summary>
    /// Largest drift of the input offset voltage with temperature (V/K, written µV/°C), if the part states it; without
    /// it the offset is taken as constant over the design's temperature range, and the temperature analysis says so.
    /// </summary>
    public Located<Quantity>? OffsetDrift { get; init; }

    /// <summary>
    /// The temperature rise over which the input bias current doubles (JFET and CMOS inputs: about every 10 °C, common
    /// practice), if the part states it; without it the bias current is taken as constant with temperature.
    /// </summary>
    public Located<Quantity>? BiasDoubling { get; init; }

    /// <summary>The largest capacitance the part is specified to drive stably at its output, if the part states one.</summary>
    public Located<Quantity>? CapacitiveLoad { get; init; }
    /// <summary>Input current noise density at each input (taken as white), if given.</summary>
    public Located<Quantity>? CurrentNoise { get; init; }

    /// <summary>
    /// Optional derating of the slew rate with temperature, a fraction per kelvin (written /°C or ppm/°C): the slew rate at
    /// T is SR·(1 + d·(T − 25 °C)). Applied where a design states a temperature range; without it the slew rate is taken
    /// as constant.
    /// </summary>
    public Located<Quantity>? SlewDerating { get; init; }

    /// <summary>
    /// Optional derating of the gain-bandwidth product with temperature, a fraction per kelvin (written /°C or ppm/°C): the
    /// GBW at T is GBW·(1 + d·(T − 25 °C)). Applied where a design states a temperature range (bandwidth at the end where
    /// GBW is lowest, stability at the end where it is highest); without it the GBW is taken as constant.
    /// </summary>
    public Located<Quantity>? GbwDerating { get; init; }

    /// <summary>1/f corner of the input voltage noise (e_n(f)² = e_n²·(1 + f_c/f)), if given; without it the voltage noise is white.</summary>
    public Located<Quantity>? NoiseCorner { get; init; }
}

/// <summary>A diode class or part. Either a saturation current and emission coefficient or a forward-voltage point is given.</summary>
/// <param name="Id">The part id.</param>
/// <param name="Description">What class of part this is.</param>
/// <param name="Typical">True when the figures are class-typical.</param>
/// <param name="SaturationCurrent">Shockley saturation current, if given.</param>
/// <param name="Emission">Emission coefficient (default 1).</param>
/// <param name="ForwardVoltage">A forward voltage ...</param>
/// <param name="ForwardVoltageCurrent">... at this current, if given instead of the saturation current.</param>
/// <param name="SeriesResistance">Series resistance (default 0).</param>
/// <param name="ReverseVoltageRating">Rated reverse voltage.</param>
/// <param name="ForwardCurrentRating">Rated forward current.</param>
/// <param name="Capacitance">Junction capacitance, if given.</param>
/// <param name="BreakdownVoltage">Reverse breakdown voltage, if given.</param>
/// <param name="Span">Where the part is defined.</param>
public sealed record DiodePart(
    Located<string> Id,
    string Description,
    bool Typical,
    Located<Quantity>? SaturationCurrent,
    Located<Quantity> Emission,
    Located<Quantity>? ForwardVoltage,
    Located<Quantity>? ForwardVoltageCurrent,
    Located<Quantity> SeriesResistance,
    Located<Quantity> ReverseVoltageRating,
    Located<Quantity> ForwardCurrentRating,
    Located<Quantity>? Capacitance,
    Located<Quantity>? BreakdownVoltage,
    SourceSpan Span)
{
    /// <summary>
    /// The forward voltage's change with temperature at a fixed current (V/K, written mV/°C), if the part states it;
    /// without it a silicon junction's −2 mV/°C is taken (common practice).
    /// </summary>
    public Located<Quantity>? ForwardVoltageCoefficient { get; init; }
}

/// <summary>A family of resistors: tolerance, temperature coefficient and ratings.</summary>
/// <param name="Id">The family id.</param>
/// <param name="Description">What class of part this is.</param>
/// <param name="Tolerance">Tolerance as a ratio (0.01 for 1 %).</param>
/// <param name="Tempco">Temperature coefficient per kelvin.</param>
/// <param name="PowerRating">Rated power.</param>
/// <param name="VoltageRating">Rated working voltage, if given.</param>
/// <param name="Span">Where the family is defined.</param>
public sealed record ResistorFamily(
    Located<string> Id, string Description, Located<Quantity> Tolerance, Located<Quantity> Tempco,
    Located<Quantity> PowerRating, Located<Quantity>? VoltageRating, SourceSpan Span);

/// <summary>A family of capacitors: tolerance, temperature coefficient and voltage rating.</summary>
/// <param name="Id">The family id.</param>
/// <param name="Description">What class of part this is.</param>
/// <param name="Tolerance">Tolerance as a ratio.</param>
/// <param name="Tempco">Temperature coefficient per kelvin, if given.</param>
/// <param name="VoltageRating">Rated voltage, if given.</param>
/// <param name="Span">Where the family is defined.</param>
public sealed record CapacitorFamily(
    Located<string> Id, string Description, Located<Quantity> Tolerance, Located<Quantity>? Tempco,
    Located<Quantity>? VoltageRating, SourceSpan Span);

/// <summary>One parts file: its id, the libraries it uses, and its parts.</summary>
/// <param name="Id">The library id.</param>
/// <param name="Title">A human title.</param>
/// <param name="File">The file path.</param>
/// <param name="Uses">Paths of the libraries it builds on, as written.</param>
/// <param name="Amplifiers">Amplifier parts.</param>
/// <param name="Diodes">Diode parts.</param>
/// <param name="Resistors">Resistor families.</param>
/// <param name="Capacitors">Capacitor families.</param>
public sealed record PartsLibrary(
    Located<string> Id, string Title, string File, IReadOnlyList<Located<string>> Uses,
    IReadOnlyList<AmplifierPart> Amplifiers, IReadOnlyList<DiodePart> Diodes,
    IReadOnlyList<ResistorFamily> Resistors, IReadOnlyList<CapacitorFamily> Capacitors);
