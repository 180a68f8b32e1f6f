namespace DesignRules.Simulation.Analysis;

/// <summary>
/// Bounds and tolerances of every solver loop in the engine. Every iteration the engine runs is capped by one
/// of these values, so no analysis can hang.
/// </summary>
public sealed record SolverLimits
{
    /// <summary>Default limits, suitable for op-amp signal chains of tens of nodes.</summary>
    public static SolverLimits Default { get; } = new();

    /// <summary>Newton–Raphson iteration cap for one DC operating point (per shunt-ramp or source-ramp step).</summary>
    public int MaxDcIterations { get; init; } = 150;

    /// <summary>Newton–Raphson iteration cap for one transient time point; past it the step is cut.</summary>
    public int MaxTransientIterations { get; init; } = 25;

    /// <summary>Relative tolerance of the Newton convergence test on every unknown.</summary>
    public double RelativeTolerance { get; init; } = 1e-6;

    /// <summary>Absolute tolerance on node voltages and internal model states, in V.</summary>
    public double VoltageTolerance { get; init; } = 1e-9;

    /// <summary>Absolute tolerance on branch currents, in A.</summary>
    public double BranchCurrentTolerance { get; init; } = 1e-12;

    /// <summary>
    /// Conductance placed across every diode junction, in S. It keeps a reverse-biased junction from leaving a node
    /// undetermined; at 0.1 pA per volt it stays far below a small-signal junction's saturation conductance and the bias
    /// currents of the amplifier classes, so no figure depends on it.
    /// </summary>
    public double JunctionShunt { get; init; } = 1e-13;

    /// <summary>
    /// Number of steps in which temporary shunts from every node to ground are lowered, from 10 mS down to
    /// <see cref="JunctionShunt"/> (one decade a step by default), when plain Newton fails at the DC operating point;
    /// 0 skips the shunt ramp.
    /// </summary>
    public int ShuntRampSteps { get; init; } = 11;

    /// <summary>Number of equal steps in which all sources are raised from zero when the shunt ramp also fails (each may be halved up to <see cref="MaxStepHalvings"/> times).</summary>
    public int SourceRampSteps { get; init; } = 10;

    /// <summary>Cap on how many times a shunt-ramp or source-ramp step may be halved after a failed solve.</summary>
    public int MaxStepHalvings { get; init; } = 8;

    /// <summary>Maximum number of transient steps (accepted plus rejected) before the analysis stops with a failure.</summary>
    public int MaxTransientSteps { get; init; } = 200_000;

    /// <summary>Smallest time step, in s; a step that must be cut below it ends the transient with a time-step failure.</summary>
    public double MinTimeStep { get; init; } = 1e-15;

    /// <summary>Maximum number of waveform breakpoints the transient honours (further corners are ignored).</summary>
    public int MaxBreakpoints { get; init; } = 100_000;

    /// <summary>Maximum number of points of a DC or AC sweep.</summary>
    public int MaxSweepPoints { get; init; } = 100_000;

    /// <summary>Returns the first limit that is out of range, or null when all are usable.</summary>
    internal string? Validate()
    {
        if (MaxDcIterations < 2 || MaxTransientIterations < 2) return "Newton iteration caps must be at least 2";
        if (!(RelativeTolerance > 0) || !(VoltageTolerance > 0) || !(BranchCurrentTolerance > 0)) return "tolerances must be positive";
        if (!(JunctionShunt >= 0)) return "the junction shunt must be zero or positive";
        if (ShuntRampSteps < 0 || SourceRampSteps < 1 || MaxStepHalvings < 0) return "ramp step counts must not be negative, and the source ramp needs at least one step";
        if (MaxTransientSteps < 10 || !(MinTimeStep > 0)) return "transient step limits are out of range";
        if (MaxBreakpoints < 0 || MaxSweepPoints < 1) return "point limits are out of range";
        return null;
    }
}
