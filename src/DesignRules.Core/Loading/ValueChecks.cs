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
