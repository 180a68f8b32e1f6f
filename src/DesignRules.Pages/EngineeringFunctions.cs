using System.Globalization;
using DesignRules.Quantities;
using Scriban.Runtime;

namespace DesignRules.Pages;

/// <summary>Functions the templates call: engineering notation, percent, and Markdown table-cell escaping.</summary>
internal static class EngineeringFunctions
{
    // The functions imported once per process: importing them reads the class by reflection, and each import's methods get
    // reflection invoke stubs of their own, which a warm process (the evaluation server) compiled again on every run once
    // the garbage collector had dropped the previous run's. The imported functions hold no state; each render copies them
    // into globals of its own, so nothing a template assigns reaches another render.
    private static readonly ScriptObject Functions = Import();

    public static ScriptObject Create()
    {
        var globals = new ScriptObject();
        globals.Import(Functions);
        return globals;
    }

    private static ScriptObject Import()
    {
        var functions = new ScriptObject();
        functions.Import(typeof(TemplateFunctions), filter: null, renamer: member => member.Name.ToLowerInvariant());
        return functions;
    }

    /// <summary>
    /// Formats a value with its SI unit symbol in engineering notation, e.g. <c>eng 14.2e6 "V/s"</c> → "14.2 V/µs";
    /// an optional third argument sets the significant digits (default 3).
    /// </summary>
    public static string Engineering(object? value, string? unit, int digits = 3)
    {
        digits = Math.Clamp(digits, 1, 15);
        var number = ToDouble(value);
        Dimension? dimension = unit switch
        {
            "V" => Dimension.Voltage,
            "A" => Dimension.Current,
            "Ω" or "ohm" => Dimension.Resistance,
            "F" => Dimension.Capacitance,
            "H" => Dimension.Inductance,
            "Hz" => Dimension.Frequency,
            "s" => Dimension.Time,
            "W" => Dimension.Power,
            "V/s" => Dimension.SlewRate,
            "1" or "" or null => Dimension.Ratio,
            "1/K" => Dimension.TemperatureCoefficient,
            "V/K" => Dimension.VoltageDrift,
            "°C" => Dimension.Temperature,
            _ => null,
        };
        if (unit == "%")
        {
            return new Quantity(number, Dimension.Ratio).FormatPercent(digits);
        }

        return dimension is { } d
            ? new Quantity(number, d).Format(digits)
            : number.ToString("G" + digits.ToString(CultureInfo.InvariantCulture), CultureInfo.InvariantCulture) + " " + unit;
    }

    /// <summary>Escapes text for a Markdown table cell: inline escaping covers pipes and line breaks too.</summary>
    public static MarkdownText Cell(object? value) =>
        value as MarkdownText ?? new MarkdownText(MarkdownEscape.Inline(Convert.ToString(value, CultureInfo.InvariantCulture)));

    private static double ToDouble(object? value) => value switch
    {
        null => double.NaN,
        double d => d,
        float f => f,
        int i => i,
        long l => l,
        decimal m => (double)m,
        _ => double.TryParse(Convert.ToString(value, CultureInfo.InvariantCulture), NumberStyles.Float, CultureInfo.InvariantCulture, out var x) ? x : double.NaN,
    };
}

/// <summary>The functions as the templates call them: <c>eng</c>, <c>percent</c>, <c>cell</c>, <c>code</c>, <c>url</c>.</summary>
internal static class TemplateFunctions
{
    /// <summary><c>eng value unit [digits]</c>: engineering notation.</summary>
    public static string Eng(object? value, string? unit, int digits = 3) => EngineeringFunctions.Engineering(value, unit, digits);

    /// <summary><c>percent ratio</c>: a fraction as a percentage.</summary>
    public static string Percent(object? value) => EngineeringFunctions.Engineering(value, "%");

    /// <summary><c>cell text</c>: text made safe for a Markdown table cell.</summary>
    public static MarkdownText Cell(object? value) => EngineeringFunctions.Cell(value);

    /// <summary><c>code text</c>: a code span holding the text literally, whatever backticks or pipes it has.</summary>
    public static MarkdownText Code(object? value) =>
        new(MarkdownEscape.Code(value is MarkdownText m ? m.Text : Convert.ToString(value, CultureInfo.InvariantCulture)));

    /// <summary><c>url target</c>: a link or image target that cannot end early.</summary>
    public static MarkdownText Url(object? value) =>
        value as MarkdownText ?? new MarkdownText(MarkdownEscape.Url(Convert.ToString(value, CultureInfo.InvariantCulture)));
}
