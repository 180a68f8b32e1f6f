using System.Globalization;

namespace DesignRules.Simulation.Results;

/// <summary>Engineering notation for the few figures the engine writes into its own failure texts (12.5 µs, 1 fs).</summary>
internal static class EngineeringText
{
    private static readonly string[] Prefixes = ["f", "p", "n", "µ", "m", "", "k", "M", "G"];

    /// <summary>The value with three significant digits and an SI prefix between femto and giga.</summary>
    public static string Format(double value, string unit)
    {
        if (!double.IsFinite(value)) return value.ToString(CultureInfo.InvariantCulture) + " " + unit;
        if (value == 0) return "0 " + unit;
        int group = (int)Math.Floor(Math.Log10(Math.Abs(value)) / 3);
        group = Math.Clamp(group, -5, 3);
        double scaled = value / Math.Pow(10, 3 * group);
        if (Math.Abs(Math.Round(scaled, 2 - (int)Math.Floor(Math.Log10(Math.Abs(scaled))))) >= 1000 && group < 3)
        {
            // 999.7 rounds to 1000 at three digits: write it as 1 of the next prefix.
            group++;
            scaled /= 1000;
        }

        string digits = scaled.ToString("G3", CultureInfo.InvariantCulture);
        return digits + " " + Prefixes[group + 5] + unit;
    }
}
