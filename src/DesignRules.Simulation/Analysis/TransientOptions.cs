namespace DesignRules.Simulation.Analysis;

/// <summary>Time-integration formula of the transient analysis.</summary>
public enum IntegrationMethod
{
    /// <summary>Second-order backward differentiation (Gear-2): L-stable, damps stiff modes (the default).</summary>
    Gear2,

    /// <summary>Trapezoidal rule: second order, no numerical damping (may ring on stiff, switching circuits).</summary>
    Trapezoidal,
}

/// <summary>
/// Options of a transient analysis. Every run starts from the DC operating point with the sources at their t = 0
/// values; the first step and the step after every source corner use backward Euler. Steps are chosen by the local
/// truncation error of every integrated state (capacitor charge, inductor flux, amplifier states) and never exceed
/// <see cref="MaxStep"/>, which the caller ties to the signal period (for example period/200).
/// </summary>
public sealed record TransientOptions
{
    /// <summary>End time in s.</summary>
    public required double StopTime { get; init; }

    /// <summary>
    /// Time the run starts at, s (default 0). With <see cref="InitialState"/> the run continues an earlier one from that
    /// state; without it the run starts from the operating point with the sources at their values at this time.
    /// </summary>
    public double StartTime { get; init; }

    /// <summary>
    /// The solution vector to start from (from <see cref="TransientResult.StateAt"/> of an earlier run of the same
    /// circuit); null starts from the operating point. A vector of the wrong length is ignored.
    /// </summary>
    public IReadOnlyList<double>? InitialState { get; init; }

    /// <summary>Largest step in s; null gives StopTime/200.</summary>
    public double? MaxStep { get; init; }

    /// <summary>First step and step after a breakpoint, in s; null gives MaxStep/20.</summary>
    public double? InitialStep { get; init; }

    /// <summary>Integration formula.</summary>
    public IntegrationMethod Method { get; init; } = IntegrationMethod.Gear2;

    /// <summary>Relative tolerance of the local truncation error (per step, relative to each state's magnitude).</summary>
    public double LteRelativeTolerance { get; init; } = 1e-4;

    /// <summary>Absolute truncation-error tolerance of voltage-like states, in V.</summary>
    public double LteVoltageTolerance { get; init; } = 1e-5;

    /// <summary>Absolute truncation-error tolerance of current-like states (inductors), in A.</summary>
    public double LteCurrentTolerance { get; init; } = 1e-8;

    internal double EffectiveMaxStep => MaxStep ?? ((StopTime - StartTime) / 200);

    internal double EffectiveInitialStep => Math.Min(InitialStep ?? (EffectiveMaxStep / 20), EffectiveMaxStep);

    internal string? Validate()
    {
        if (!(StopTime > 0) || !double.IsFinite(StopTime)) return "transient stop time must be positive";
        if (!(StartTime >= 0) || !(StartTime < StopTime)) return "transient start time must be zero or positive and before the stop time";
        if (!(EffectiveMaxStep > 0) || !double.IsFinite(EffectiveMaxStep)) return "transient maximum step must be positive";
        if (!(EffectiveInitialStep > 0)) return "transient initial step must be positive";
        if (!(LteRelativeTolerance > 0) || !(LteVoltageTolerance > 0) || !(LteCurrentTolerance > 0)) return "truncation-error tolerances must be positive";
        return null;
    }
}
