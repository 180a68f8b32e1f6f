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

    /// <summary>
    /// Forward voltage at a forward current <paramref name="current"/> (A) and temperature (K): the Shockley law solved
    /// for the junction voltage, n·V_T·ln(1 + I/Is), plus the series-resistance drop I·Rs. The one closed form of the
    /// law every figure uses; the engine's device stamps the same law (with breakdown and the solver's junction shunt).
    /// </summary>
    /// <param name="current">Forward current, A.</param>
    /// <param name="temperature">Temperature, K.</param>
    public double ForwardVoltage(double current, double temperature) =>
        (EmissionCoefficient * PhysicalConstants.ThermalVoltage(temperature) * Math.Log(1 + (current / SaturationCurrent))) + (current * SeriesResistance);

    /// <summary>
    /// Forward current at a terminal voltage <paramref name="voltage"/> (anode − cathode, V) and temperature (K); 0 for
    /// v ≤ 0 (reverse current is not forward conduction). With series resistance the law is implicit in the current and is
    /// solved by bisection on [0, v/Rs] (its voltage is increasing in the current; at most 200 halvings).
    /// </summary>
    /// <param name="voltage">Terminal voltage, V.</param>
    /// <param name="temperature">Temperature, K.</param>
    public double ForwardCurrent(double voltage, double temperature)
    {
        if (!(voltage > 0))
        {
            return 0;
        }

        double nvt = EmissionCoefficient * PhysicalConstants.ThermalVoltage(temperature);
        if (!(SeriesResistance > 0))
        {
            return SaturationCurrent * double.ExpM1(Math.Min(voltage / nvt, 700));
        }

        double lo = 0, hi = voltage / SeriesResistance;
        for (int k = 0; k < 200 && hi - lo > 1e-15 * Math.Max(hi, 1e-12); k++)
        {
            double mid = 0.5 * (lo + hi);
            double vm = (nvt * Math.Log(1 + (mid / SaturationCurrent))) + (mid * SeriesResistance);
            if (vm > voltage) hi = mid; else lo = mid;
        }

        return 0.5 * (lo + hi);
    }

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
