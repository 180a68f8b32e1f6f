using System.Diagnostics.CodeAnalysis;

namespace DesignRules.Quantities;

/// <summary>A physical quantity: a value in SI base units and its dimension.</summary>
/// <param name="Value">The value in SI base units (volts, ohms, farads, V/s, 1 for ratios, 1/K for tempco, °C for temperature).</param>
/// <param name="Dimension">What the value measures.</param>
public readonly record struct Quantity(double Value, Dimension Dimension)
{
    /// <summary>The longest text accepted for one value; longer input is rejected as malformed.</summary>
    public const int MaxTextLength = 64;

    /// <summary>
    /// Reads a value written in engineering notation (<c>4.7k</c>, <c>4.7 kΩ</c>, <c>10nF</c>, <c>8 V/us</c>,
    /// <c>±0.5%</c>, <c>106 dB</c>) or as an IEC 60062 RKM code (<c>4k7</c>, <c>R47</c>). A bare number takes
    /// the <paramref name="expected"/> dimension. Never throws; problems come back as <paramref name="error"/>.
    /// </summary>
    /// <param name="text">The text to read, in the invariant culture.</param>
    /// <param name="expected">The dimension the caller wants.</param>
    /// <param name="value">The value read, or <c>default</c> when the text is not acceptable.</param>
    /// <param name="error">Why the text is not acceptable, or <see langword="null"/> on success.</param>
    /// <returns><see langword="true"/> when the text is a value of the expected dimension.</returns>
    public static bool TryParse(string? text, Dimension expected, out Quantity value, [NotNullWhen(false)] out QuantityError? error) =>
        QuantityParser.TryParse(text, expected, out value, out error);

    /// <summary>
    /// Formats the value for people in engineering notation with the invariant culture: <c>4.7 kΩ</c>,
    /// <c>10 nF</c>, <c>8 V/µs</c>, <c>50 ppm/°C</c>, <c>18 nV/√Hz</c>, <c>25 °C</c>; ratios are plain numbers.
    /// </summary>
    /// <param name="significantDigits">Significant digits to keep (clamped to 1..17); trailing zeros are trimmed.</param>
    /// <returns>The formatted text, which <see cref="TryParse"/> reads back.</returns>
    public string Format(int significantDigits = 3) => QuantityFormatter.Format(this, significantDigits);

    /// <summary>Formats a ratio as a percentage (<c>1 %</c>, <c>0.5 %</c>); other dimensions format as <see cref="Format"/> does.</summary>
    /// <param name="significantDigits">Significant digits to keep (clamped to 1..17); trailing zeros are trimmed.</param>
    /// <returns>The formatted text.</returns>
    public string FormatPercent(int significantDigits = 3) => QuantityFormatter.FormatPercent(this, significantDigits);

    /// <summary>The value formatted with three significant digits, as <see cref="Format"/> does.</summary>
    /// <returns>The formatted text.</returns>
    public override string ToString() => Format();
}
