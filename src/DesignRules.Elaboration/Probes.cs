using DesignRules.Diagnostics;
using DesignRules.Model;
using DesignRules.Simulation;

namespace DesignRules.Elaboration;

/// <summary>Where to look in the circuit for one stage: its nodes, amplifiers, diodes, passive components and ideal transfer.</summary>
/// <param name="StageId">The stage id; every element id and local node name of the stage begins with it and a dot.</param>
/// <param name="Stage">The stage as loaded.</param>
/// <param name="InputNode">The node the stage is fed from (the previous stage's output, or the source's output).</param>
/// <param name="ReferenceInputNode">
/// For a stage fed differentially (a difference stage first in a chain whose source has a common-mode level), the node of
/// the inverting signal input; <see cref="Circuit.Ground"/> otherwise.
/// </param>
/// <param name="OutputNode">The node that feeds the next stage or the load.</param>
/// <param name="Amplifiers">Every amplifier of the stage.</param>
/// <param name="Diodes">Every diode of the stage.</param>
/// <param name="Components">Every resistor, capacitor and inductor of the stage.</param>
/// <param name="SummingJunctions">Nodes held at virtual ground (or virtual reference) by feedback while the loop is closed.</param>
/// <param name="Transfer">The ideal transfer computed from the component values.</param>
/// <param name="TimeConstant">The slowest designed time constant (r·c of a filter, rdis·chold of a peak detector), s; null when none.</param>
public sealed record StageProbe(
    string StageId,
    Stage Stage,
    string InputNode,
    string ReferenceInputNode,
    string OutputNode,
    IReadOnlyList<AmplifierProbe> Amplifiers,
    IReadOnlyList<DiodeProbe> Diodes,
    IReadOnlyList<ComponentProbe> Components,
    IReadOnlyList<string> SummingJunctions,
    IdealTransfer Transfer,
    double? TimeConstant);

/// <summary>One amplifier of a stage.</summary>
/// <param name="Slot">The slot or netlist element id (u1, u2).</param>
/// <param name="ElementId">The engine element id (stage.u1); its <see cref="TransientResult.Amplifier(string)"/> trace carries the flags.</param>
/// <param name="NonInvertingNode">Node of the + input.</param>
/// <param name="InvertingNode">Node of the − input.</param>
/// <param name="OutputNode">Node of the output pin.</param>
/// <param name="Part">The part it was made from.</param>
/// <param name="Model">The engine model used (with the chosen offset and bias currents).</param>
/// <param name="Rails">The rails it is powered from.</param>
public sealed record AmplifierProbe(
    string Slot, string ElementId, string NonInvertingNode, string InvertingNode, string OutputNode, AmplifierPart Part, AmplifierModel Model, SupplyRails Rails);

/// <summary>One diode of a stage.</summary>
/// <param name="Slot">The slot or netlist element id (d1, d2).</param>
/// <param name="ElementId">The engine element id (stage.d1).</param>
/// <param name="Anode">Anode node.</param>
/// <param name="Cathode">Cathode node.</param>
/// <param name="Part">The part it was made from.</param>
/// <param name="Model">The engine model used.</param>
public sealed record DiodeProbe(string Slot, string ElementId, string Anode, string Cathode, DiodePart Part, DiodeModel Model);

/// <summary>One resistor, capacitor or inductor of a stage.</summary>
/// <param name="Name">The block's value name (rf, chold) or the netlist element id.</param>
/// <param name="ElementId">The engine element id (stage.rf); also the key of a value override.</param>
/// <param name="Kind">Resistor, capacitor or inductor.</param>
/// <param name="NodeA">First node.</param>
/// <param name="NodeB">Second node.</param>
/// <param name="Value">The value used in the circuit (after any override), SI units.</param>
/// <param name="NominalValue">The value written in the design, SI units.</param>
/// <param name="ResistorFamily">The resistor family, if any.</param>
/// <param name="CapacitorFamily">The capacitor family, if any.</param>
/// <param name="Span">Where the value is written.</param>
public sealed record ComponentProbe(
    string Name, string ElementId, ElementKind Kind, string NodeA, string NodeB, double Value, double NominalValue,
    ResistorFamily? ResistorFamily, CapacitorFamily? CapacitorFamily, SourceSpan Span);
