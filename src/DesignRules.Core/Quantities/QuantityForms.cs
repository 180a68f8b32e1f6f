namespace DesignRules.Quantities;

/// <summary>Hint texts that tell people which forms of a value are accepted, for use in diagnostics.</summary>
public static class QuantityForms
{
    /// <summary>A short phrase naming the dimension and showing accepted forms, e.g. "a voltage such as 5 V, -12V or 250 mV".</summary>
    /// <param name="d">The dimension the caller expects.</param>
    /// <returns>The phrase, starting with an indefinite article, without a final full stop.</returns>
    public static string Example(Dimension d) => d switch
    {
        Dimension.Ratio => "a ratio such as 2, -10, 1%, ±0.5%, 50 ppm or 106 dB",
        Dimension.Voltage => "a voltage such as 5 V, -12V or 250 mV",
        Dimension.Current => "a current such as 20 mA, 1.5 A or 30 pA",
        Dimension.Resistance => "a resistance such as 4.7k, 4.7 kΩ, 4k7 or R47",
        Dimension.Capacitance => "a capacitance such as 10 nF, 100p or 1n5",
        Dimension.Inductance => "an inductance such as 10 mH, 4.7 uH or 2m2",
        Dimension.Frequency => "a frequency such as 1 kHz, 20Hz or 3 MHz",
        Dimension.Time => "a time such as 1 us, 2.5 ms or 10 s",
        Dimension.Power => "a power such as 125 mW, 0.25 W or 1W",
        Dimension.SlewRate => "a slew rate such as 8 V/us, 13 V/µs or 500 V/ms",
        Dimension.Temperature => "a temperature such as 25 °C, -40C or 85 °C",
        Dimension.TemperatureCoefficient => "a temperature coefficient such as 50 ppm/°C, ±25 ppm/K or 0.0039 /K",
        Dimension.VoltageNoiseDensity => "a noise density such as 18 nV/rtHz, 18 nV/√Hz or 4 nV/sqrt(Hz)",
        Dimension.VoltageDrift => "a voltage drift such as 5 µV/°C, 2 uV/C or -2 mV/°C",
        Dimension.CurrentNoiseDensity => "a current noise density such as 0.5 pA/rtHz, 4 fA/√Hz or 1 pA/sqrt(Hz)",
        _ => "a number with an optional SI prefix and unit",
    };

    /// <summary>The dimension's name with its indefinite article ("a voltage", "an inductance").</summary>
    internal static string Noun(Dimension d) => d switch
    {
        Dimension.Ratio => "a ratio",
        Dimension.Voltage => "a voltage",
        Dimension.Current => "a current",
        Dimension.Resistance => "a resistance",
        Dimension.Capacitance => "a capacitance",
        Dimension.Inductance => "an inductance",
        Dimension.Frequency => "a frequency",
        Dimension.Time => "a time",
        Dimension.Power => "a power",
        Dimension.SlewRate => "a slew rate",
        Dimension.Temperature => "a temperature",
        Dimension.TemperatureCoefficient => "a temperature coefficient",
        Dimension.VoltageNoiseDensity => "a noise density",
        Dimension.VoltageDrift => "a voltage drift",
        Dimension.CurrentNoiseDensity => "a current noise density",
        _ => "a quantity",
    };
}
