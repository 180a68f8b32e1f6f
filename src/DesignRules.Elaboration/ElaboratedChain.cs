using DesignRules.Diagnostics;
using DesignRules.Model;
using DesignRules.Simulation;

namespace DesignRules.Elaboration;

/// <summary>A problem found while turning a design into a circuit, located at the YAML text to change.</summary>
/// <param name="Message">What is wrong and what to change.</param>
/// <param name="Span">Where in the design (or parts) file.</param>
/// <param name="ElementId">The engine element concerned, if any.</param>
public sealed record ElaborationProblem(string Message, SourceSpan Span, string? ElementId);

/// <summary>
/// A suggested transient run: start-up periods first, then the periods to measure over.
/// </summary>
/// <param name="MeasureFrom">Start of the measurement window (end of start-up), s.</param>
/// <param name="StopTime">End of the run, s.</param>
/// <param name="MaxStep">Largest time step, s (a period of the fastest source component over the steps-per-period option).</param>
public sealed record TransientWindow(double MeasureFrom, double StopTime, double MaxStep)
{
    /// <summary>Engine options for this window.</summary>
    public TransientOptions ToOptions() => new() { StopTime = StopTime, MaxStep = MaxStep };
}

/// <summary>
/// A whole signal chain as one engine circuit, with everything needed to analyse it and find its nodes.
/// <para>Element ids and nodes: supplies <c>supply.pos</c>/<c>supply.neg</c> on nodes <c>vpos</c>/<c>vneg</c>; the signal
/// source <c>source</c> (the only source that carries an AC magnitude, 1 V) with its emf on <c>source.emf</c> and, after its
/// impedance <c>source.rs</c>, its output on <c>source.out</c> (<c>source.emf</c> itself when the impedance is 0); a difference
/// stage first in a chain whose source has a common-mode level is fed from <c>source.p</c> and <c>source.n</c> (cm ± v/2, each behind
/// half the source impedance, made by <c>source.cm</c>, <c>source.pos</c> and <c>source.neg</c>); the load <c>load.r</c> and <c>load.c</c> from the chain output to
/// <c>load.ret</c> (the returns-to level, driven by <c>load.vret</c>) or to ground; each stage's elements and local nodes
/// prefixed by its id.</para>
/// </summary>
public sealed record ElaboratedChain
{
    /// <summary>The design elaborated.</summary>
    public required Design Design { get; init; }

    /// <summary>The circuit (its own <see cref="Circuit.Problems"/> are also listed in <see cref="Problems"/>).</summary>
    public required Circuit Circuit { get; init; }

    /// <summary>The options used.</summary>
    public required ElaborationOptions Options { get; init; }

    /// <summary>Id of the independent signal source (sweep it for DC transfers; its AC magnitude is 1 V).</summary>
    public required string SourceId { get; init; }

    /// <summary>The node of the source emf (before the source impedance), the ideal input signal.</summary>
    public required string SourceEmfNode { get; init; }

    /// <summary>The node the first stage is fed from (after the source impedance).</summary>
    public required string SourceOutputNode { get; init; }

    /// <summary>The engine waveform of the signal source.</summary>
    public required Simulation.Waveforms.Waveform SourceWaveform { get; init; }

    /// <summary>Stages in signal order.</summary>
    public required IReadOnlyList<StageProbe> Stages { get; init; }

    /// <summary>The chain output node (the last stage's output, which the load is connected to).</summary>
    public required string OutputNode { get; init; }

    /// <summary>The supply rails the amplifiers are powered from.</summary>
    public required SupplyRails Rails { get; init; }

    /// <summary>The test frequency in Hz (the lowest component of a sum); null for a DC source.</summary>
    public required double? TestFrequency { get; init; }

    /// <summary>The period of <see cref="TestFrequency"/>, s; null for a DC source.</summary>
    public required double? Period { get; init; }

    /// <summary>A suggested transient run.</summary>
    public required TransientWindow Window { get; init; }

    /// <summary>Problems found; an analysis of a chain with problems fails.</summary>
    public required IReadOnlyList<ElaborationProblem> Problems { get; init; }

    /// <summary>True when the chain was built without problems.</summary>
    public bool Succeeded => Problems.Count == 0;

    internal IReadOnlyDictionary<string, SourceSpan> ElementSpans { get; init; } = new Dictionary<string, SourceSpan>();

    internal IReadOnlyDictionary<string, SourceSpan> NodeSpans { get; init; } = new Dictionary<string, SourceSpan>();

    /// <summary>Where the source's fastest frequency is written: the value that sets a transient's step count.</summary>
    internal SourceSpan? StepSpan { get; init; }

    /// <summary>The stage with this id, or null.</summary>
    /// <param name="stageId">Stage id.</param>
    public StageProbe? Stage(string stageId) => Stages.FirstOrDefault(s => s.StageId == stageId);

    /// <summary>
    /// Where in the design files an engine element or node comes from (the component value, the stage, the source or the
    /// load), falling back to the design id; use it to locate a <see cref="SimulationFailure"/>.
    /// </summary>
    /// <param name="elementIdOrNode">An element id or node name.</param>
    public SourceSpan Locate(string? elementIdOrNode) =>
        elementIdOrNode is not null && ElementSpans.TryGetValue(elementIdOrNode, out var e) ? e
        : elementIdOrNode is not null && NodeSpans.TryGetValue(elementIdOrNode, out var n) ? n
        : Design.Id.Span;

    /// <summary>Where the problem of a failed analysis comes from (its element, else its node, else the design).</summary>
    /// <param name="failure">The engine's failure.</param>
    public SourceSpan Locate(SimulationFailure failure)
    {
        ArgumentNullException.ThrowIfNull(failure);

        // A transient that ran out of steps, or whose step shrank to nothing, with no element to blame was set off by the
        // ratio of its run to its step: point at the fastest source frequency, the value that sets the step.
        if (failure.Kind is FailureKind.BudgetSpent or FailureKind.StepShrank && failure.ElementId is null && failure.Node is null && StepSpan is { } step)
        {
            return step;
        }

        return failure.ElementId is not null && ElementSpans.ContainsKey(failure.ElementId) ? Locate(failure.ElementId) : Locate(failure.Node);
    }
}
