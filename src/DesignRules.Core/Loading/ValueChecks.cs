using DesignRules.Quantities;

namespace DesignRules.Loading;

/// <summary>Range checks for values read from files; each returns null when the value is fine, else why it is not.</summary>
internal static class ValueChecks
{
    public static string? Positive(Quantity q) => q.Value > 0 ? null : "it must be greater than zero";

    public static string? NotNegative(Quantity q) => q.Value >= 0 ? null : "it must not be negative";

    public static string? Tolerance(Quantity q) => q.Value is >= 0 and < 1 ? null : "a tolerance must be at least 0 % and below 100 %";

    public static string? Fraction(Quantity q) => q.Value is > 0 and <= 1 ? null : "it must be above 0 % and at most 100 %";

    public static string? OpenFraction(Quantity q) => q.Value is > 0 and < 1 ? null : "it must be between 0 % and 100 %, both excluded";

    public static string? AtLeastOne(Quantity q) => q.Value >= 1 ? null : "it must be at least 1";

    public static string? Emission(Quantity q) => q.Value is >= 0.5 and <= 4 ? null : "an emission coefficient lies between 0.5 and 4";

    public static string? Temperature(Quantity q) => q.Value is >= -273.15 and <= 1000 ? null : "it must lie between −273.15 °C and 1000 °C";

    /// <summary>A positive value within a plausible range (component values).</summary>
    public static Func<Quantity, string?> PositiveWithin(double low, double high, string what) =>
        q => q.Value <= 0 ? "it must be greater than zero" : q.Value >= low && q.Value <= high ? null : what;

    /// <summary>Guards against values so large or small that they can only be typos (e.g. 10 GF).</summary>
    public static Func<Quantity, string?> Within(double low, double high, string what) =>
        q => Math.Abs(q.Value) >= low && Math.Abs(q.Value) <= high ? null : what;
}

/// <summary>
/// The one plausible range of every quantity of a dimension, applied wherever such a quantity appears (a value, either
/// end of a range, a part's figure, a requirement) before the key's own check: beyond it a value can only be a typo,
/// and it would drive the analyses into overflow ("Infinity W") or a solver failure far from the value that caused it.
/// Zero passes here; keys that need a positive value say so themselves. The README's limits table lists these.
/// </summary>
public static class PlausibleRange
{
    private static readonly Dictionary<Dimension, (double Smallest, double Largest)> Ranges = new()
    {
        [Dimension.Ratio] = (1e-12, 1e10),
        [Dimension.Voltage] = (1e-12, 1e5),
        [Dimension.Current] = (1e-21, 1e3),
        [Dimension.Resistance] = (1e-3, 1e12),
        [Dimension.Capacitance] = (1e-15, 10),
        [Dimension.Inductance] = (1e-12, 1e3),
        [Dimension.Frequency] = (1e-3, 1e10),
        [Dimension.Time] = (1e-15, 1e4),
        [Dimension.Power] = (1e-9, 1e4),
        [Dimension.SlewRate] = (1e-3, 1e12),
        [Dimension.TemperatureCoefficient] = (1e-12, 1),
        [Dimension.VoltageNoiseDensity] = (1e-15, 1e-3),
        [Dimension.VoltageDrift] = (1e-12, 1),
        [Dimension.CurrentNoiseDensity] = (1e-18, 1e-3),
    };

    /// <summary>The smallest non-zero and the largest magnitude accepted for a dimension (temperatures have their key's own range).</summary>
    public static (double Smallest, double Largest) Of(Dimension dimension) =>
        Ranges.TryGetValue(dimension, out var range) ? range : (double.Epsilon, double.MaxValue);

    /// <summary>Null when the value lies in its dimension's plausible range (or is zero), else why not.</summary>
    public static string? Check(Quantity q)
    {
        var (smallest, largest) = Of(q.Dimension);
        var size = Math.Abs(q.Value);
        if (double.IsFinite(q.Value) && (size == 0 || (size >= smallest && size <= largest)))
        {
            return null;
        }

        return $"every {Name(q.Dimension)} must lie between {new Quantity(smallest, q.Dimension).Format()} and {new Quantity(largest, q.Dimension).Format()} in size (or be 0 where zero is allowed)";
    }

    private static string Name(Dimension dimension) => dimension switch
    {
        Dimension.Ratio => "ratio",
        Dimension.SlewRate => "slew rate",
        Dimension.TemperatureCoefficient => "temperature coefficient",
        Dimension.VoltageNoiseDensity => "noise density",
        Dimension.VoltageDrift => "voltage drift",
        Dimension.CurrentNoiseDensity => "current noise density",
        _ => dimension.ToString().ToLowerInvariant(),
    };
}
