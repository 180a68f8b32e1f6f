using System.Globalization;
using System.Text;

namespace DesignRules.Simulation;

/// <summary>What kind of problem ended an analysis.</summary>
public enum FailureKind
{
    /// <summary>An element has an unusable value (zero or negative resistance, NaN, a duplicate id...).</summary>
    InvalidElement,

    /// <summary>A node has no DC path to the reference node (for example a node reached only through capacitors).</summary>
    FloatingNode,

    /// <summary>The circuit equations are singular (for example a loop of voltage sources).</summary>
    SingularMatrix,

    /// <summary>Newton–Raphson iteration did not converge within its bounds, even with gmin and source stepping.</summary>
    NoConvergence,

    /// <summary>The transient time step had to be cut below the minimum step.</summary>
    TimeStepTooSmall,

    /// <summary>A bound on the number of steps or points was reached.</summary>
    StepLimitReached,

    /// <summary>The analysis request itself is unusable (unknown source, empty sweep, bad option).</summary>
    InvalidRequest,
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

    /// <summary>One-line description with all known locations.</summary>
    public override string ToString()
    {
        var text = new StringBuilder();
        text.Append(Kind.ToString()).Append(": ").Append(Reason);
        if (ElementId is not null) text.Append(" [element ").Append(ElementId).Append(']');
        if (Node is not null) text.Append(" [node ").Append(Node).Append(']');
        if (Time is { } t) text.Append(" [t = ").Append(t.ToString("G6", CultureInfo.InvariantCulture)).Append(" s]");
        if (SweepValue is { } s) text.Append(" [at ").Append(s.ToString("G6", CultureInfo.InvariantCulture)).Append(']');
        return text.ToString();
    }
}
