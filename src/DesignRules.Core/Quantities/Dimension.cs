namespace DesignRules.Quantities;

/// <summary>The physical dimension of a <see cref="Quantity"/>; values are always held in SI base units.</summary>
public enum Dimension
{
    /// <summary>A pure number or ratio (percent, ppm, dB are forms of it).</summary>
    Ratio,
    /// <summary>Volt.</summary>
    Voltage,
    /// <summary>Ampere.</summary>
    Current,
    /// <summary>Ohm.</summary>
    Resistance,
    /// <summary>Farad.</summary>
    Capacitance,
    /// <summary>Henry.</summary>
    Inductance,
    /// <summary>Hertz.</summary>
    Frequency,
    /// <summary>Second.</summary>
    Time,
    /// <summary>Watt.</summary>
    Power,
    /// <summary>Volt per second (written V/µs by people).</summary>
    SlewRate,
    /// <summary>Degree Celsius.</summary>
    Temperature,
    /// <summary>Per kelvin (written ppm/°C by people).</summary>
    TemperatureCoefficient,
    /// <summary>Volt per root hertz (written nV/√Hz by people).</summary>
    VoltageNoiseDensity,
    /// <summary>Volt per kelvin: a voltage's drift with temperature (written µV/°C by people).</summary>
    VoltageDrift,
    /// <summary>Ampere per root hertz (written pA/√Hz by people).</summary>
    CurrentNoiseDensity,
}
