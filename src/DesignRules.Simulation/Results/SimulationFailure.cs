using System.Globalization;
using System.Text;

namespace DesignRules.Simulation.Results;

/// <summary>
/// What kind of problem ended an analysis. The member names are for code only: people read the name and sentence that
/// <see cref="FailureWording"/> gives each kind.
/// </summary>
public enum FailureKind
{
    /// <summary>An element has an unusable value (zero or negative resistance, NaN, a duplicate id...).</summary>
    UnusableElement,

    /// <summary>A node has no DC return to the reference node (for example a node reached only through capacitors).</summary>
    NoDcReturn,

    /// <summary>A node voltage or branch current is left undetermined by the circuit equations (for example a loop of voltage sources).</summary>
    Undetermined,

    /// <summary>Newton–Raphson iteration did not settle within its bounds, even with the junction shunts and the source ramp.</summary>
    Unsettled,

    /// <summary>The transient time step had to shrink below the smallest step allowed.</summary>
    StepShrank,

    /// <summary>A bound on the number of steps or points was used up.</summary>
    BudgetSpent,

    /// <summary>The analysis request itself is unusable (unknown source, empty sweep, bad option).</summary>
    UnusableRequest,
}

/// <summary>
/// The words people read for each <see cref="FailureKind"/>: a short name and a sentence saying where to look. Mapped
/// one by one here, so that no enum member name ever reaches a message.
/// </summary>
public static class FailureWording
{
    /// <summary>The short name of a kind of failure, as printed in messages.</summary>
    /// <param name="kind">The kind of failure.</param>
    public static string Name(FailureKind kind) => kind switch
    {
        FailureKind.UnusableElement => "unusable element value",
        FailureKind.NoDcReturn => "node without a DC return",
        FailureKind.Undetermined => "undetermined voltage or current",
        FailureKind.Unsettled => "solution did not settle",
        FailureKind.StepShrank => "time step shrank away",
        FailureKind.BudgetSpent => "step budget used up",
        FailureKind.UnusableRequest => "unusable analysis request",
        _ => "unexplained failure",
    };

    /// <summary>What to look at for a kind of failure: one sentence, ending with a full stop.</summary>
    /// <param name="kind">The kind of failure.</param>
    public static string Advice(FailureKind kind) => kind switch
    {
        FailureKind.UnusableElement => "Correct the value of the element named; every value must be finite and, for a resistance, capacitance or inductance, positive.",
        FailureKind.NoDcReturn => "Give the node named a resistive path to ground or to a source, so that its resting voltage is fixed.",
        FailureKind.Undetermined => "Look for a node that nothing holds, or for sources, amplifier outputs or inductors joined in a closed loop.",
        FailureKind.Unsettled => "Look near the element or node named for a value several decades away from its neighbours (10M meant as 10m) or a diode with no resistance in series across a source.",
        FailureKind.StepShrank => "Look at what drives the node named: an edge much faster than the rest of the circuit, or a value several decades off, makes the signal change faster than any step can follow.",
        FailureKind.BudgetSpent => "The signal needs more steps than the bound allows; a test frequency far above the circuit's bandwidth or a very long hold time does this.",
        FailureKind.UnusableRequest => "The request the tool made of the engine cannot be run; this is a fault of the tool, please report it with the design.",
        _ => "Please report this with the design.",
    };
}

/// <summary>
/// A located problem that ended an analysis: what went wrong, and where (element, node, simulated time or sweep value).
/// Analyses return it as a value inside their result; they do not throw for problems of the circuit.
/// </summary>
/// <param name="Kind">Category of the problem.</param>
/// <param name="Reason">Plain-language explanation of the problem and what to change.</param>
public sealed record SimulationFailure(FailureKind Kind, string Reason)
{
    /// <summary>Id of the element concerned, when known.</summary>
    public string? ElementId { get; init; }

    /// <summary>Name of the node concerned, when known.</summary>
    public string? Node { get; init; }

    /// <summary>Simulated time in s at which the problem arose (transient only).</summary>
    public double? Time { get; init; }

    /// <summary>Sweep value (DC sweep source value, or AC frequency in Hz) at which the problem arose.</summary>
    public double? SweepValue { get; init; }

    /// <summary>One-line description with all known locations, in the words of <see cref="FailureWording"/>.</summary>
    public override string ToString()
    {
        var text = new StringBuilder();
        text.Append(FailureWording.Name(Kind)).Append(": ").Append(Reason);
        if (ElementId is not null) text.Append(" [element ").Append(ElementId).Append(']');
        if (Node is not null) text.Append(" [node ").Append(Node).Append(']');
        if (Time is { } t) text.Append(" [t = ").Append(EngineeringText.Format(t, "s")).Append(']');
        if (SweepValue is { } s) text.Append(" [at ").Append(s.ToString("G6", CultureInfo.InvariantCulture)).Append(']');
        return text.ToString();
    }
}
