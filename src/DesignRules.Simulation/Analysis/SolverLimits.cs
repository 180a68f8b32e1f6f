namespace DesignRules.Simulation;

/// <summary>
/// Bounds and tolerances of every solver loop in the engine. Every iteration the engine runs is capped by one
/// of these values, so no analysis can hang.
/// </summary>
public sealed record SolverLimits
{
    /// <summary>Default limits, suitable for op-amp signal chains of tens of nodes.</summary>
    public static SolverLimits Default { get; } = new();

    /// <summary>Newton–Raphson iteration cap for one DC operating point (per gmin or source step).</summary>
    public int MaxDcIterations { get; init; } = 150;

    /// <summary>Newton–Raphson iteration cap for one transient time point; past it the step is cut.</summary>
    public int MaxTransientIterations { get; init; } = 25;

    /// <summary>Relative tolerance of the Newton convergence test on every unknown.</summary>
    public double RelativeTolerance { get; init; } = 1e-6;

    /// <summary>Absolute tolerance on node voltages and internal model states, in V.</summary>
    public double VoltageTolerance { get; init; } = 1e-9;

    /// <summary>Absolute tolerance on branch currents, in A.</summary>
    public double CurrentTolerance { get; init; } = 1e-12;

    /// <summary>Minimum conductance placed across every diode junction, in S (keeps a reverse-biased junction from leaving a node undetermined).</summary>
    public double Gmin { get; init; } = 1e-12;

    /// <summary>Number of decades of gmin stepping tried when plain Newton fails at the DC operating point (starting at 1e-2 S node-to-ground shunts).</summary>
    public int GminSteps { get; init; } = 10;

    /// <summary>Number of equal source-ramp steps tried when gmin stepping also fails (each may be halved up to <see cref="MaxStepHalvings"/> times).</summary>
    public int SourceSteps { get; init; } = 10;

    /// <summary>Cap on how many times a gmin or source step may be halved after a failed solve.</summary>
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
        if (!(RelativeTolerance > 0) || !(VoltageTolerance > 0) || !(CurrentTolerance > 0)) return "tolerances must be positive";
        if (!(Gmin >= 0)) return "gmin must be zero or positive";
        if (GminSteps < 0 || SourceSteps < 1 || MaxStepHalvings < 0) return "step counts must not be negative";
        if (MaxTransientSteps < 10 || !(MinTimeStep > 0)) return "transient step limits are out of range";
        if (MaxBreakpoints < 0 || MaxSweepPoints < 1) return "point limits are out of range";
        return null;
    }
}
