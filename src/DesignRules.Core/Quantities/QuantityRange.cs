using System.Diagnostics.CodeAnalysis;

namespace DesignRules.Quantities;

/// <summary>A closed range of one dimension, written as two values joined by <c>..</c> (<c>20Hz..20kHz</c>).</summary>
/// <param name="Low">The low end.</param>
/// <param name="High">The high end, not below <paramref name="Low"/> when read by <see cref="TryParse"/>.</param>
public readonly record struct QuantityRange(Quantity Low, Quantity High)
{
    private const string Separator = "..";

    /// <summary>
    /// Reads a range such as <c>20Hz..20kHz</c> or <c>20 Hz .. 20 kHz</c>; each end is read as
    /// <see cref="Quantity.TryParse"/> reads a value, and the low end must not exceed the high end. Never throws.
    /// </summary>
    /// <param name="text">The text to read.</param>
    /// <param name="expected">The dimension both ends must have.</param>
    /// <param name="value">The range read, or <c>default</c> on failure.</param>
    /// <param name="error">Why the text is not acceptable, or <see langword="null"/> on success.</param>
    /// <returns><see langword="true"/> when the text is a valid range of the expected dimension.</returns>
    public static bool TryParse(string? text, Dimension expected, out QuantityRange value, [NotNullWhen(false)] out QuantityError? error)
    {
        value = default;
        string example = QuantityForms.Example(expected);
        if (string.IsNullOrWhiteSpace(text))
        {
            error = new QuantityError(QuantityErrorKind.Empty, $"a range is required: expected two values joined by '..', each {example}", null);
            return false;
        }

        string s = text.Trim();
        int separator = s.IndexOf(Separator, StringComparison.Ordinal);
        if (s.Length > 2 * Quantity.MaxTextLength || separator < 0)
        {
            string quoted = s.Length > Quantity.MaxTextLength ? "the text" : $"'{s}'";
            error = new QuantityError(QuantityErrorKind.Malformed, $"{quoted} is not a range: expected two values joined by '..', each {example}", null);
            return false;
        }

        if (!ReadEnd(s[..separator], "low", expected, out var low, out error)
            || !ReadEnd(s[(separator + Separator.Length)..], "high", expected, out var high, out error))
        {
            return false;
        }

        if (low.Value > high.Value)
        {
            error = new QuantityError(
                QuantityErrorKind.BadRange,
                $"'{s}' runs backwards: the low end {low.Format()} is above the high end {high.Format()}",
                null);
            return false;
        }

        value = new QuantityRange(low, high);
        return true;
    }

    /// <summary>Formats the range as <c>20 Hz .. 20 kHz</c>, each end as <see cref="Quantity.Format"/> does.</summary>
    /// <param name="significantDigits">Significant digits of each end.</param>
    /// <returns>The formatted text, which <see cref="TryParse"/> reads back.</returns>
    public string Format(int significantDigits = 3) =>
        Low.Format(significantDigits) + " " + Separator + " " + High.Format(significantDigits);

    /// <summary>The range formatted as <see cref="Format"/> does with three significant digits.</summary>
    /// <returns>The formatted text.</returns>
    public override string ToString() => Format();

    private static bool ReadEnd(string text, string end, Dimension expected, out Quantity value, [NotNullWhen(false)] out QuantityError? error)
    {
        if (Quantity.TryParse(text, expected, out value, out error))
        {
            return true;
        }
        error = error with { Message = $"the {end} end of the range: {error.Message}" };
        return false;
    }
}
