using System.Globalization;
using DesignRules.Figures.Stability;

namespace DesignRules.Rules.Evaluation.Stability;

/// <summary>How the stability rules and pages say their figures to people.</summary>
internal static class StabilityWords
{
    /// <summary>The operating point a loop was judged at, in words.</summary>
    public static string OperatingPoint(this AmplifierLoop loop) =>
        loop.BiasValue is { } v ? "with the source held at " + Say.Volts(v) : "at the quiescent operating point";

    /// <summary>Capacitance for messages, engineering notation.</summary>
    public static string Farads(double c) => new Quantities.Quantity(c, Quantities.Dimension.Capacitance).Format();

    /// <summary>Degrees for messages: "38.2°".</summary>
    public static string Degrees(double degrees) => degrees.ToString("0.#", CultureInfo.InvariantCulture) + "°";
}
