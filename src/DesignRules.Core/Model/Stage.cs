using DesignRules.Blocks;
using DesignRules.Diagnostics;
using DesignRules.Quantities;

namespace DesignRules.Model;

/// <summary>A stage of a chain: a built-in block or an explicit netlist.</summary>
/// <param name="Id">The stage id.</param>
/// <param name="Requirements">What the stage must achieve.</param>
/// <param name="Span">Where the stage is written.</param>
public abstract record Stage(Located<string> Id, Requirements Requirements, SourceSpan Span);

/// <summary>A component value of a block with the family it is drawn from.</summary>
/// <param name="Name">The block's name for it, e.g. "rf".</param>
/// <param name="Value">The nominal value.</param>
/// <param name="ResistorFamily">Resistor family for a resistance, if any.</param>
/// <param name="CapacitorFamily">Capacitor family for a capacitance, if any.</param>
public sealed record ComponentValue(Located<string> Name, Located<Quantity> Value, ResistorFamily? ResistorFamily, CapacitorFamily? CapacitorFamily)
{
    /// <summary>The value's number in SI units (ohms, farads, volts).</summary>
    public double Si => Value.Value.Value;

    /// <summary>The value with its dimension.</summary>
    public Quantity Quantity => Value.Value;
}

/// <summary>An instance of a built-in topology.</summary>
/// <param name="Id">The stage id.</param>
/// <param name="Block">The block definition.</param>
/// <param name="BlockName">The block name as written.</param>
/// <param name="Amplifiers">Amplifier part per slot (u1, u2).</param>
/// <param name="Diodes">Diode part per slot (d1, d2).</param>
/// <param name="Values">Component values by name.</param>
/// <param name="Flags">Yes/no options by name (e.g. buffer).</param>
/// <param name="Requirements">What the stage must achieve.</param>
/// <param name="Span">Where the stage is written.</param>
public sealed record BlockStage(
    Located<string> Id,
    BlockDescriptor Block,
    Located<string> BlockName,
    IReadOnlyDictionary<string, AmplifierPart> Amplifiers,
    IReadOnlyDictionary<string, DiodePart> Diodes,
    IReadOnlyDictionary<string, ComponentValue> Values,
    IReadOnlyDictionary<string, Located<bool>> Flags,
    Requirements Requirements,
    SourceSpan Span) : Stage(Id, Requirements, Span)
{
    /// <summary>Where each slot's part is named in the design file (slot → span of the part id), for findings to point at.</summary>
    public IReadOnlyDictionary<string, SourceSpan> PartSpans { get; init; } = new Dictionary<string, SourceSpan>(StringComparer.Ordinal);
}

/// <summary>Kinds of element an explicit netlist may hold.</summary>
public enum ElementKind
{
    /// <summary>Resistor.</summary>
    Resistor,
    /// <summary>Capacitor.</summary>
    Capacitor,
    /// <summary>Inductor.</summary>
    Inductor,
    /// <summary>Diode (anode, cathode).</summary>
    Diode,
    /// <summary>Operational amplifier (plus, minus, output; powered from the supplies).</summary>
    Amplifier,
}

/// <summary>An element of an explicit netlist.</summary>
/// <param name="Id">The element id.</param>
/// <param name="Kind">What it is.</param>
/// <param name="Value">Its value (resistors, capacitors, inductors).</param>
/// <param name="Nodes">Its terminals: two nodes, or for an amplifier plus, minus, output.</param>
/// <param name="Amplifier">The amplifier part, for amplifiers.</param>
/// <param name="Diode">The diode part, for diodes.</param>
/// <param name="ResistorFamily">The resistor family, if given.</param>
/// <param name="CapacitorFamily">The capacitor family, if given.</param>
/// <param name="Span">Where it is written.</param>
public sealed record NetlistElement(
    Located<string> Id,
    ElementKind Kind,
    Located<Quantity>? Value,
    IReadOnlyList<Located<string>> Nodes,
    AmplifierPart? Amplifier,
    DiodePart? Diode,
    ResistorFamily? ResistorFamily,
    CapacitorFamily? CapacitorFamily,
    SourceSpan Span);

/// <summary>A stage given as an explicit circuit.</summary>
/// <param name="Id">The stage id.</param>
/// <param name="Input">The node the previous stage or the source feeds.</param>
/// <param name="Output">The node that feeds the next stage or the load.</param>
/// <param name="Elements">The elements.</param>
/// <param name="Requirements">What the stage must achieve.</param>
/// <param name="Span">Where the stage is written.</param>
public sealed record NetlistStage(
    Located<string> Id,
    Located<string> Input,
    Located<string> Output,
    IReadOnlyList<NetlistElement> Elements,
    Requirements Requirements,
    SourceSpan Span) : Stage(Id, Requirements, Span)
{
    /// <summary>The reference node every netlist may use; no other spelling of it is accepted.</summary>
    public const string Ground = "ground";

    /// <summary>The positive supply rail node.</summary>
    public const string PositiveRail = "vpos";

    /// <summary>The negative supply rail node.</summary>
    public const string NegativeRail = "vneg";
}
