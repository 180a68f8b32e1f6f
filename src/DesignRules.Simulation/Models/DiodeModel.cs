namespace DesignRules.Simulation.Models;

/// <summary>
/// Parameters of a junction diode following the Shockley law
/// I = Is·(exp(V/(n·V_T)) − 1), with V_T = k·T/e from the exact SI 2019 constants at the circuit temperature,
/// an optional ohmic series resistance (modelled with an internal node), an optional constant junction
/// capacitance, and an optional reverse breakdown I_bd = −Ibv·exp(−(V + BV)/(n·V_T)).
/// Defaults describe a typical small-signal silicon switching diode (typical values, no particular part).
/// </summary>
public sealed record DiodeModel
{
    /// <summary>A typical small-signal silicon switching diode (typical values).</summary>
    public static DiodeModel SmallSignal { get; } = new();

    /// <summary>Saturation current Is in A (typical 2.5 nA for a small-signal silicon diode).</summary>
    public double SaturationCurrent { get; init; } = 2.5e-9;

    /// <summary>Emission coefficient n (ideality factor), typically 1 to 2 (typical 1.75).</summary>
    public double EmissionCoefficient { get; init; } = 1.75;

    /// <summary>Ohmic series resistance in Ω; 0 for none (typical 0.6 Ω).</summary>
    public double SeriesResistance { get; init; } = 0.6;

    /// <summary>Constant junction capacitance in F; 0 for none (typical 2 pF).</summary>
    public double JunctionCapacitance { get; init; } = 2e-12;

    /// <summary>Reverse breakdown voltage BV in V (positive number), or null for no breakdown.</summary>
    public double? BreakdownVoltage { get; init; }

    /// <summary>Reverse current at V = −BV, in A (typical 1 µA).</summary>
    public double BreakdownCurrent { get; init; } = 1e-6;

    internal string? Validate()
    {
        if (!(SaturationCurrent > 0) || !double.IsFinite(SaturationCurrent)) return "diode saturation current must be positive";
        if (!(EmissionCoefficient > 0) || !double.IsFinite(EmissionCoefficient)) return "diode emission coefficient must be positive";
        if (!(SeriesResistance >= 0) || !double.IsFinite(SeriesResistance)) return "diode series resistance must be zero or positive";
        if (!(JunctionCapacitance >= 0) || !double.IsFinite(JunctionCapacitance)) return "diode junction capacitance must be zero or positive";
        if (BreakdownVoltage is { } bv && (!(bv > 0) || !double.IsFinite(bv))) return "diode breakdown voltage must be positive";
        if (!(BreakdownCurrent > 0) || !double.IsFinite(BreakdownCurrent)) return "diode breakdown current must be positive";
        return null;
    }
}
