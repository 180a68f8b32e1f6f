using System.Diagnostics.CodeAnalysis;

namespace DesignRules.Quantities;

/// <summary>
/// An IEC 60063 series of preferred numbers: the mantissas (1 ≤ m &lt; 10) repeated in every decade.
/// E6, E12 and E24 are the standard's historical two-figure tables; E48, E96 and E192 are three-figure
/// values round(10^(i/n), 2), with the standard's one exception (E192 has 9.20 where the formula gives 9.19).
/// </summary>
public sealed record ESeries
{
    private readonly int[] _hundredths; // each mantissa × 100, exact integers

    private ESeries(string name, int[] hundredths)
    {
        Name = name;
        _hundredths = hundredths;
        Mantissas = Array.AsReadOnly(hundredths.Select(h => h / 100.0).ToArray());
    }

    /// <summary>The series name, e.g. "E24".</summary>
    public string Name { get; }

    /// <summary>The values of one decade, ascending, each at least 1 and below 10.</summary>
    public IReadOnlyList<double> Mantissas { get; }

    /// <summary>Six values per decade (IEC 60063).</summary>
    public static ESeries E6 { get; } = new("E6", [100, 150, 220, 330, 470, 680]);

    /// <summary>Twelve values per decade (IEC 60063).</summary>
    public static ESeries E12 { get; } = new("E12", [100, 120, 150, 180, 220, 270, 330, 390, 470, 560, 680, 820]);

    /// <summary>Twenty-four values per decade (IEC 60063), the historical table rather than the pure formula.</summary>
    public static ESeries E24 { get; } = new("E24",
    [
        100, 110, 120, 130, 150, 160, 180, 200, 220, 240, 270, 300,
        330, 360, 390, 430, 470, 510, 560, 620, 680, 750, 820, 910,
    ]);

    /// <summary>Forty-eight values per decade (IEC 60063).</summary>
    public static ESeries E48 { get; } = FromFormula("E48", 48);

    /// <summary>Ninety-six values per decade (IEC 60063).</summary>
    public static ESeries E96 { get; } = FromFormula("E96", 96);

    /// <summary>One hundred ninety-two values per decade (IEC 60063), with 9.20 in place of the formula's 9.19.</summary>
    public static ESeries E192 { get; } = FromFormula("E192", 192);

    private static readonly ESeries[] All = [E6, E12, E24, E48, E96, E192];

    /// <summary>Finds a series by name ("E6" .. "E192", case-insensitive).</summary>
    /// <param name="name">The series name.</param>
    /// <param name="s">The series, or <see langword="null"/> when the name is not one of the six.</param>
    /// <returns><see langword="true"/> when the name is known.</returns>
    public static bool TryGet(string name, [NotNullWhen(true)] out ESeries? s)
    {
        s = All.FirstOrDefault(e => string.Equals(e.Name, name?.Trim(), StringComparison.OrdinalIgnoreCase));
        return s is not null;
    }

    /// <summary>Whether a positive value is a member of the series in some decade.</summary>
    /// <param name="value">The value, e.g. 4700 (Ω).</param>
    /// <param name="relativeTolerance">How far from a series value (relative) still counts as on it.</param>
    /// <returns><see langword="true"/> when value / 10^floor(log10(value)) matches a mantissa.</returns>
    public bool Contains(double value, double relativeTolerance = 1e-6)
    {
        if (!double.IsFinite(value) || value <= 0)
        {
            return false;
        }
        double m = Mantissa(value, out _);
        return _hundredths.Any(h => Math.Abs(m - h / 100.0) <= relativeTolerance * (h / 100.0))
            || Math.Abs(m - 10.0) <= relativeTolerance * 10.0; // just below the next decade's 1.0
    }

    /// <summary>The series value closest to <paramref name="value"/> by ratio (nearest on a log scale).</summary>
    /// <param name="value">The value to round; negative values round by magnitude and keep their sign.</param>
    /// <returns>The nearest series value; 0 and NaN are returned unchanged, infinities too.</returns>
    public double Nearest(double value)
    {
        if (!double.IsFinite(value) || value == 0)
        {
            return value;
        }
        if (value < 0)
        {
            return -Nearest(-value);
        }

        double m = Mantissa(value, out int decade);
        int best = _hundredths[0];
        int bestDecade = decade;
        double bestDistance = double.PositiveInfinity;
        // Candidates: every mantissa of this decade, the first of the next, the last of the one before.
        foreach (var (h, d) in _hundredths.Select(h => (h, decade)).Append((_hundredths[0], decade + 1)).Append((_hundredths[^1], decade - 1)))
        {
            double candidate = h / 100.0 * Math.Pow(10, d - decade);
            double distance = Math.Abs(Math.Log(m / candidate));
            if (distance < bestDistance)
            {
                (best, bestDecade, bestDistance) = (h, d, distance);
            }
        }
        return Scale(best, bestDecade - 2);
    }

    /// <summary>The series name, e.g. "E24".</summary>
    /// <returns><see cref="Name"/>.</returns>
    public override string ToString() => Name;

    /// <summary>value = mantissa × 10^decade with 1 ≤ mantissa &lt; 10 (guarded against log10 rounding).</summary>
    private static double Mantissa(double value, out int decade)
    {
        decade = (int)Math.Floor(Math.Log10(value));
        double m = value / Math.Pow(10, decade);
        if (m < 1)
        {
            decade--;
            m *= 10;
        }
        else if (m >= 10)
        {
            decade++;
            m /= 10;
        }
        return m;
    }

    /// <summary>units × 10^exponent, correctly rounded by dividing by an exact power of ten when the exponent is negative.</summary>
    private static double Scale(int units, int exponent) =>
        exponent >= 0 ? units * Math.Pow(10, exponent) : units / Math.Pow(10, -exponent);

    private static ESeries FromFormula(string name, int perDecade)
    {
        var hundredths = new int[perDecade];
        for (int i = 0; i < perDecade; i++)
        {
            hundredths[i] = (int)Math.Round(100 * Math.Pow(10, (double)i / perDecade), MidpointRounding.AwayFromZero);
        }
        if (perDecade == 192)
        {
            int exception = Array.IndexOf(hundredths, 919);
            if (exception >= 0)
            {
                hundredths[exception] = 920; // IEC 60063: E192 keeps 9.20
            }
        }
        return new ESeries(name, hundredths);
    }
}
