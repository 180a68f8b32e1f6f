using System.Globalization;
using DesignRules.Quantities;

namespace DesignRules.Blocks;

/// <summary>How descriptors write numbers into their equations (invariant culture, a true minus sign).</summary>
internal static class EquationText
{
    public static string Number(double x) => x.ToString("0.####", CultureInfo.InvariantCulture).Replace("-", "−", StringComparison.Ordinal);

    public static string Signed(double x) => x < 0 ? "− " + Number(-x) : "+ " + Number(x);

    public static string Time(double seconds) => new Quantity(seconds, Dimension.Time).Format();

    public static string Frequency(double hertz) => new Quantity(hertz, Dimension.Frequency).Format();

    /// <summary>Two resistances in parallel; the first alone when the second is absent.</summary>
    public static double Parallel(double a, double? b) => b is null ? a : a * b.Value / (a + b.Value);
}
