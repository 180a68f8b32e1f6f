using DesignRules.Diagnostics;

namespace DesignRules.Rules;

/// <summary>
/// One result of a check: a rule (or a design-file problem) that fired, with its message, the YAML node whose
/// change would fix it, and the figures it used.
/// </summary>
/// <param name="RuleId">The rule id, <c>DR</c> and three digits.</param>
/// <param name="Title">The rule's title.</param>
/// <param name="Severity">The effective severity after configuration.</param>
/// <param name="Message">Measured figure, limit and margin, in words.</param>
/// <param name="Span">Where to change the design.</param>
/// <param name="HelpPage">The rule's help page, relative to the repository root of the tool.</param>
/// <param name="DesignId">The design the finding belongs to, if any.</param>
/// <param name="StageId">The stage the finding belongs to, if any.</param>
/// <param name="Waiver">The waiver's reason when a waiver covers this finding; null otherwise.</param>
/// <param name="Figures">Named figures the rule used, in SI units (for reports).</param>
public sealed record Finding(
    string RuleId,
    string Title,
    Severity Severity,
    string Message,
    SourceSpan Span,
    string HelpPage,
    string? DesignId,
    string? StageId,
    string? Waiver,
    IReadOnlyList<Figure> Figures)
{
    /// <summary>True when a waiver covers the finding; waived findings never fail a build.</summary>
    public bool IsWaived => Waiver is not null;
}

/// <summary>
/// A figure with its stable key (<see cref="FigureKey"/>), its value in SI units and, where a rule judged it, the limit and
/// the margin. The name and unit come from the key's kind.
/// </summary>
/// <param name="Key">What the figure is and where in the stage.</param>
/// <param name="Value">Its value in SI units.</param>
public sealed record Figure(FigureKey Key, double Value)
{
    /// <summary>The label people read, e.g. <c>slew demanded at rect.u1.out</c>.</summary>
    public string Name => Key.Label;

    /// <summary>The SI unit symbol; "%" marks a fraction shown as a percentage, "1" a plain ratio.</summary>
    public string Unit => Key.Kind.Unit;

    /// <summary>The limit a rule judged the figure against, in the same unit; null when no rule judged it.</summary>
    public double? Limit { get; init; }

    /// <summary>How far the figure is inside its limit, in the same unit (negative: the limit is exceeded); null without a limit.</summary>
    public double? Margin { get; init; }

    /// <summary>
    /// Where the design declares an operating range: the temperature (°C) at which this worst-case figure is taken, the
    /// end (or middle) of the range where it is worst; null when taken at 25 °C only.
    /// </summary>
    public double? Temperature { get; init; }

    /// <summary>The figure taken at <paramref name="celsius"/> (null: at 25 °C only, no range declared).</summary>
    public Figure AtTemperature(double? celsius) => this with { Temperature = celsius };

    /// <summary>The figure judged against an upper limit (it must not exceed <paramref name="limit"/>).</summary>
    public Figure AtMost(double limit) => this with { Limit = limit, Margin = limit - Value };

    /// <summary>The figure judged against a lower limit (it must reach at least <paramref name="limit"/>).</summary>
    public Figure AtLeast(double limit) => this with { Limit = limit, Margin = Value - limit };
}
