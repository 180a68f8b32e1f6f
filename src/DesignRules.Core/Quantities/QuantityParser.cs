using System.Diagnostics.CodeAnalysis;
using System.Globalization;

namespace DesignRules.Quantities;

/// <summary>
/// Reads engineering notation (<c>4.7 kΩ</c>, <c>8 V/us</c>, <c>±0.5%</c>, <c>106 dB</c>) and IEC 60062 RKM codes
/// (<c>4k7</c>, <c>R47</c>) into SI values. Never throws: every problem is returned as a <see cref="QuantityError"/>.
/// </summary>
internal static class QuantityParser
{
    /// <summary>The hint for a value written with a spelt-out mega prefix.</summary>
    internal const string MegaHint = "write M for mega, as in 4.7M";

    /// <summary>Reads <paramref name="text"/> as a value of the <paramref name="expected"/> dimension.</summary>
    internal static bool TryParse(string? text, Dimension expected, out Quantity value, [NotNullWhen(false)] out QuantityError? error)
    {
        value = default;
        if (string.IsNullOrWhiteSpace(text))
        {
            error = new QuantityError(QuantityErrorKind.Empty, $"a value is required: expected {QuantityForms.Example(expected)}", null);
            return false;
        }

        string s = text.Trim();
        if (s.Length > Quantity.MaxTextLength)
        {
            error = new QuantityError(
                QuantityErrorKind.Malformed,
                $"the value is longer than {Quantity.MaxTextLength} characters: expected {QuantityForms.Example(expected)}",
                null);
            return false;
        }

        error = Read(s, expected, out value);
        return error is null;
    }

    private static QuantityError? Read(string s, Dimension expected, out Quantity value)
    {
        value = default;
        int i = 0;
        bool negative = false;
        switch (s[0])
        {
            case '+':
                i++;
                break;
            case '-' or '\u2212':
                negative = true;
                i++;
                break;
            case '±':
                if (expected is not (Dimension.Ratio or Dimension.TemperatureCoefficient))
                {
                    return Malformed(s, expected, "'±' is only for tolerances and other ratios");
                }
                i++;
                break;
        }
        i = SkipSpaces(s, i);

        if (NamesNonFinite(s, i))
        {
            return new QuantityError(QuantityErrorKind.NotFinite, $"'{s}' is not a finite number: expected {QuantityForms.Example(expected)}", null);
        }

        NumberText number;
        UnitSpellings.UnitForm? unit;
        Dimension found;
        if (TryReadRkm(s, i, out var rkm, out int end))
        {
            number = rkm;
            string suffix = s[SkipSpaces(s, end)..];
            if (suffix.Length == 0)
            {
                unit = null;
            }
            else if (!UnitSpellings.TryUnit(suffix, out unit) || unit.IsDecibel)
            {
                return Malformed(s, expected, "an RKM code may be followed only by a unit without prefix");
            }
            if (rkm.Mark == 'R' && unit is not null && unit.Dimension != Dimension.Resistance)
            {
                return Malformed(s, expected, "the RKM mark 'R' stands for ohms");
            }
            found = unit?.Dimension ?? (rkm.Mark == 'R' ? Dimension.Resistance : expected);
        }
        else if (TryReadNumber(s, i, out number, out end))
        {
            string suffix = s[SkipSpaces(s, end)..];
            if (suffix.StartsWith("meg", StringComparison.OrdinalIgnoreCase))
            {
                // Mega is the SI prefix M; a three-letter spelling of it is not one of our forms.
                return Malformed(s, expected, MegaHint);
            }
            if (!TryReadSuffix(suffix, out int prefixExponent, out unit))
            {
                return Malformed(s, expected, null);
            }
            number = number with { Exponent = number.Exponent + prefixExponent };
            found = unit?.Dimension ?? expected;
        }
        else
        {
            return Malformed(s, expected, null);
        }

        if (found != expected)
        {
            return new QuantityError(
                QuantityErrorKind.WrongDimension,
                $"'{s}' is {QuantityForms.Noun(found)} but {QuantityForms.Noun(expected)} is expected",
                found);
        }

        double x = number.ToDouble((long)(unit?.Exponent ?? 0));
        if (negative)
        {
            x = -x;
        }
        if (unit is { IsDecibel: true })
        {
            // Decibel voltage-ratio definition: ratio = 10^(dB / 20).
            x = Math.Pow(10.0, x / 20.0);
        }
        if (!double.IsFinite(x))
        {
            return new QuantityError(QuantityErrorKind.NotFinite, $"'{s}' is too large to be a number: expected {QuantityForms.Example(expected)}", null);
        }

        value = new Quantity(x + 0.0, expected); // + 0.0 turns -0 into 0
        return null;
    }

    /// <summary>The digits of a number as written and its power of ten, so that scaling stays exact.</summary>
    private readonly record struct NumberText(string Mantissa, long Exponent, char Mark = '\0')
    {
        private const long ExponentLimit = 100_000;

        public double ToDouble(long extraExponent)
        {
            long exponent = Math.Clamp(Exponent + extraExponent, -ExponentLimit, ExponentLimit);
            string text = Mantissa + "e" + exponent.ToString(CultureInfo.InvariantCulture);
            return double.TryParse(text, NumberStyles.Float, CultureInfo.InvariantCulture, out double x) ? x : double.NaN;
        }
    }

    /// <summary>An IEC 60062 RKM code: digits with a letter as decimal mark ("4k7", "R47", "1n5").</summary>
    private static bool TryReadRkm(string s, int start, out NumberText number, out int end)
    {
        number = default;
        int mark = ScanDigits(s, start);
        end = mark;
        if (mark + 1 >= s.Length || !char.IsAsciiDigit(s[mark + 1]) || UnitSpellings.RkmExponent(s[mark]) is not int exponent)
        {
            return false;
        }
        end = ScanDigits(s, mark + 1);
        string whole = mark > start ? s[start..mark] : "0";
        number = new NumberText(whole + "." + s[(mark + 1)..end], exponent, s[mark]);
        return true;
    }

    /// <summary>A decimal number with an optional exponent ("4.7", ".5", "1e3", "2.5E-3").</summary>
    private static bool TryReadNumber(string s, int start, out NumberText number, out int end)
    {
        number = default;
        int i = ScanDigits(s, start);
        string whole = s[start..i];
        string fraction = "";
        if (i < s.Length && s[i] == '.')
        {
            int fractionEnd = ScanDigits(s, i + 1);
            fraction = s[(i + 1)..fractionEnd];
            i = fractionEnd;
        }
        end = i;
        if (whole.Length == 0 && fraction.Length == 0)
        {
            return false;
        }

        long exponent = 0;
        if (i < s.Length && s[i] is 'e' or 'E')
        {
            int j = i + 1;
            bool exponentNegative = false;
            if (j < s.Length && s[j] is '+' or '-')
            {
                exponentNegative = s[j] == '-';
                j++;
            }
            int exponentEnd = ScanDigits(s, j);
            if (exponentEnd > j)
            {
                string digits = s[j..exponentEnd].TrimStart('0');
                exponent = digits.Length > 9 ? 1_000_000_000L : long.Parse(digits.Length == 0 ? "0" : digits, CultureInfo.InvariantCulture);
                exponent = exponentNegative ? -exponent : exponent;
                end = exponentEnd;
            }
        }

        number = new NumberText((whole.Length == 0 ? "0" : whole) + "." + (fraction.Length == 0 ? "0" : fraction), exponent);
        return true;
    }

    /// <summary>What follows the number: nothing, a unit, a prefix, or a prefix and a unit that takes one.</summary>
    private static bool TryReadSuffix(string suffix, out int prefixExponent, out UnitSpellings.UnitForm? unit)
    {
        prefixExponent = 0;
        unit = null;
        if (suffix.Length == 0 || UnitSpellings.TryUnit(suffix, out unit))
        {
            return true;
        }

        if (UnitSpellings.PrefixExponent(suffix[0]) is not int exponent)
        {
            return false;
        }

        prefixExponent = exponent;
        string rest = suffix[1..];
        return rest.Length == 0 || (UnitSpellings.TryUnit(rest, out unit) && unit.TakesPrefix);
    }

    private static bool NamesNonFinite(string s, int i) =>
        s.AsSpan(i).StartsWith("nan", StringComparison.OrdinalIgnoreCase)
        || s.AsSpan(i).StartsWith("inf", StringComparison.OrdinalIgnoreCase)
        || s.AsSpan(i).StartsWith("∞", StringComparison.Ordinal);

    private static int ScanDigits(string s, int i)
    {
        while (i < s.Length && char.IsAsciiDigit(s[i]))
        {
            i++;
        }
        return i;
    }

    private static int SkipSpaces(string s, int i)
    {
        while (i < s.Length && char.IsWhiteSpace(s[i]))
        {
            i++;
        }
        return i;
    }

    private static QuantityError Malformed(string s, Dimension expected, string? why) =>
        new(
            QuantityErrorKind.Malformed,
            why is null
                ? $"'{s}' is not understood: expected {QuantityForms.Example(expected)}"
                : $"'{s}' is not understood ({why}): expected {QuantityForms.Example(expected)}",
            null);
}
