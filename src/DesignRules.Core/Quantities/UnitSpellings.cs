using System.Diagnostics.CodeAnalysis;

namespace DesignRules.Quantities;

/// <summary>
/// The accepted spellings of units and SI prefixes (SI Brochure, 9th edition; IEC 60062 RKM marks).
/// Unit spellings are case-sensitive except for "ohm"/"ohms".
/// </summary>
internal static class UnitSpellings
{
    /// <summary>A unit spelling: its dimension, its power of ten relative to SI, whether an SI prefix may precede it.</summary>
    internal sealed record UnitForm(Dimension Dimension, int Exponent, bool TakesPrefix, bool IsDecibel = false);

    private static readonly UnitForm Ohm = new(Dimension.Resistance, 0, TakesPrefix: true);

    private static readonly Dictionary<string, UnitForm> Units = BuildUnits();

    private static Dictionary<string, UnitForm> BuildUnits()
    {
        var units = new Dictionary<string, UnitForm>(StringComparer.Ordinal)
        {
            ["V"] = new(Dimension.Voltage, 0, true),
            ["A"] = new(Dimension.Current, 0, true),
            ["\u03A9"] = Ohm, // Greek capital omega
            ["\u2126"] = Ohm, // ohm sign
            ["R"] = Ohm,
            ["F"] = new(Dimension.Capacitance, 0, true),
            ["H"] = new(Dimension.Inductance, 0, true),
            ["Hz"] = new(Dimension.Frequency, 0, true),
            ["s"] = new(Dimension.Time, 0, true),
            ["sec"] = new(Dimension.Time, 0, true),
            ["W"] = new(Dimension.Power, 0, true),
            ["V/s"] = new(Dimension.SlewRate, 0, true),
            ["V/ms"] = new(Dimension.SlewRate, 3, true),
            ["V/us"] = new(Dimension.SlewRate, 6, true),
            ["V/\u00B5s"] = new(Dimension.SlewRate, 6, true),
            ["V/\u03BCs"] = new(Dimension.SlewRate, 6, true),
            ["V/ns"] = new(Dimension.SlewRate, 9, true),
            ["V/√Hz"] = new(Dimension.VoltageNoiseDensity, 0, true),
            ["V/rtHz"] = new(Dimension.VoltageNoiseDensity, 0, true),
            ["V/sqrt(Hz)"] = new(Dimension.VoltageNoiseDensity, 0, true),
            ["A/√Hz"] = new(Dimension.CurrentNoiseDensity, 0, true),
            ["A/rtHz"] = new(Dimension.CurrentNoiseDensity, 0, true),
            ["A/sqrt(Hz)"] = new(Dimension.CurrentNoiseDensity, 0, true),
            ["%"] = new(Dimension.Ratio, -2, false),
            ["ppm"] = new(Dimension.Ratio, -6, false),
            ["dB"] = new(Dimension.Ratio, 0, false, IsDecibel: true),
        };
        foreach (string celsius in new[] { "°C", "C", "℃" })
        {
            units[celsius] = new(Dimension.Temperature, 0, false);
            units["ppm/" + celsius] = new(Dimension.TemperatureCoefficient, -6, false);
            units["/" + celsius] = new(Dimension.TemperatureCoefficient, 0, true);
            units["V/" + celsius] = new(Dimension.VoltageDrift, 0, true);
        }

        units["V/K"] = new(Dimension.VoltageDrift, 0, true);
        units["ppm/K"] = new(Dimension.TemperatureCoefficient, -6, false);
        units["/K"] = new(Dimension.TemperatureCoefficient, 0, true);
        return units;
    }

    internal static bool TryUnit(string text, [NotNullWhen(true)] out UnitForm? unit)
    {
        if (Units.TryGetValue(text, out unit))
        {
            return true;
        }
        if (text.Equals("ohm", StringComparison.OrdinalIgnoreCase) || text.Equals("ohms", StringComparison.OrdinalIgnoreCase))
        {
            unit = Ohm;
            return true;
        }
        return false;
    }

    internal static int? PrefixExponent(char c) => c switch
    {
        'f' => -15,
        'p' => -12,
        'n' => -9,
        'u' or '\u00B5' or '\u03BC' => -6,
        'm' => -3,
        'k' or 'K' => 3,
        'M' => 6,
        'G' => 9,
        'T' => 12,
        _ => null,
    };

    internal static int? RkmExponent(char c) => c == 'R' ? 0 : c == 'f' ? null : PrefixExponent(c);
}
