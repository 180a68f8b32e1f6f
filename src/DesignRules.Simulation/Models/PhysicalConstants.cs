namespace DesignRules.Simulation.Models;

/// <summary>
/// Exact physical constants of the 2019 revision of the SI and the thermal voltage derived from them.
/// </summary>
public static class PhysicalConstants
{
    /// <summary>Boltzmann constant k in J/K (exact since the 2019 SI revision).</summary>
    public const double Boltzmann = 1.380649e-23;

    /// <summary>Elementary charge e in C (exact since the 2019 SI revision).</summary>
    public const double ElementaryCharge = 1.602176634e-19;

    /// <summary>0 °C in kelvin.</summary>
    public const double ZeroCelsius = 273.15;

    /// <summary>
    /// Default circuit temperature: 25 °C = 298.15 K, the temperature at which parts files (the built-in one included)
    /// state their typical figures, so an analysis at the default temperature uses the figures as written.
    /// </summary>
    public const double DefaultTemperature = ZeroCelsius + 25;

    /// <summary>Thermal voltage V_T = k·T/e in volts at <paramref name="temperature"/> kelvin (≈ 25.693 mV at 298.15 K).</summary>
    /// <param name="temperature">Absolute temperature in K.</param>
    public static double ThermalVoltage(double temperature) => Boltzmann * temperature / ElementaryCharge;
}
