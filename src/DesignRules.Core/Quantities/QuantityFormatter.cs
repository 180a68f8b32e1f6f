using System.Globalization;

namespace DesignRules.Quantities;

/// <summary>
/// Writes quantities for people: engineering notation (exponent a multiple of three, prefix f..T), a fixed
/// number of significant digits with trailing zeros trimmed, invariant culture. Rounding is done on the
/// decimal digits, so scaling to a display unit (V/µs, ppm/°C, nV/√Hz, %) adds no binary error.
/// </summary>
internal static class QuantityFormatter
{
    private const int LowestEngineeringExponent = -15;
    private const int HighestEngineeringExponent = 12;
    private static readonly string[] Prefixes = ["f", "p", "n", "µ", "m", "", "k", "M", "G", "T"];

    internal static string Format(Quantity q, int significantDigits)
    {
        int digits = Math.Clamp(significantDigits, 1, 17);
        double v = q.Value;
        return q.Dimension switch
        {
            Dimension.Ratio => Plain(v, digits, 0),
            Dimension.Temperature => Plain(v, digits, 0) + " °C",
            Dimension.SlewRate => Plain(v, digits, -6) + " V/µs",
            Dimension.TemperatureCoefficient => Plain(v, digits, 6) + " ppm/°C",
            Dimension.VoltageNoiseDensity => Plain(v, digits, 9) + " nV/√Hz",
            Dimension.VoltageDrift => Plain(v, digits, 6) + " µV/°C",
            Dimension.CurrentNoiseDensity => Plain(v, digits, 12) + " pA/√Hz",
            _ => Engineering(v, digits, UnitSymbol(q.Dimension)),
        };
    }

    internal static string FormatPercent(Quantity q, int significantDigits) =>
        q.Dimension == Dimension.Ratio
            ? Plain(q.Value, Math.Clamp(significantDigits, 1, 17), 2) + " %"
            : Format(q, significantDigits);

    private static string UnitSymbol(Dimension d) => d switch
    {
        Dimension.Voltage => "V",
        Dimension.Current => "A",
        Dimension.Resistance => "Ω",
        Dimension.Capacitance => "F",
        Dimension.Inductance => "H",
        Dimension.Frequency => "Hz",
        Dimension.Time => "s",
        Dimension.Power => "W",
        _ => "",
    };

    /// <summary>A plain decimal number of <paramref name="value"/> × 10^<paramref name="shift"/>.</summary>
    private static string Plain(double value, int significantDigits, int shift)
    {
        if (!double.IsFinite(value))
        {
            return value.ToString(CultureInfo.InvariantCulture);
        }
        var (negative, digits, exponent) = Round(value, significantDigits);
        return (negative ? "-" : "") + Positional(digits, exponent + shift);
    }

    private static string Engineering(double value, int significantDigits, string unit)
    {
        if (!double.IsFinite(value))
        {
            return (value.ToString(CultureInfo.InvariantCulture) + " " + unit).TrimEnd();
        }
        var (negative, digits, exponent) = Round(value, significantDigits);
        int engineering = Math.Clamp(
            (int)Math.Floor(exponent / 3.0) * 3, LowestEngineeringExponent, HighestEngineeringExponent);
        string prefix = Prefixes[(engineering - LowestEngineeringExponent) / 3];
        string number = (negative ? "-" : "") + Positional(digits, exponent - engineering);
        return (number + " " + prefix + unit).TrimEnd();
    }

    /// <summary>
    /// Rounds |value| to <paramref name="significantDigits"/> decimal digits: value = ±d.ddd × 10^exponent,
    /// with trailing zeros of the digit string removed ("0" and exponent 0 for zero).
    /// </summary>
    private static (bool Negative, string Digits, int Exponent) Round(double value, int significantDigits)
    {
        string scientific = Math.Abs(value).ToString(
            "E" + (significantDigits - 1).ToString(CultureInfo.InvariantCulture), CultureInfo.InvariantCulture);
        int e = scientific.IndexOf('E', StringComparison.Ordinal);
        string digits = scientific[..e].Replace(".", "", StringComparison.Ordinal).TrimEnd('0');
        if (digits.Length == 0)
        {
            return (false, "0", 0);
        }
        int exponent = int.Parse(scientific[(e + 1)..], NumberStyles.AllowLeadingSign, CultureInfo.InvariantCulture);
        return (value < 0, digits, exponent);
    }

    /// <summary>Places the decimal point in d.ddd × 10^exponent; very large or small exponents stay in e-notation.</summary>
    private static string Positional(string digits, int exponent)
    {
        if (digits == "0")
        {
            return "0";
        }
        if (exponent < -6 || exponent >= 15)
        {
            string tail = digits.Length > 1 ? "." + digits[1..] : "";
            return digits[0] + tail + "e" + exponent.ToString(CultureInfo.InvariantCulture);
        }
        if (exponent < 0)
        {
            return "0." + new string('0', -exponent - 1) + digits;
        }
        int wholeLength = exponent + 1;
        return digits.Length <= wholeLength
            ? digits + new string('0', wholeLength - digits.Length)
            : digits[..wholeLength] + "." + digits[wholeLength..];
    }
}
