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

    /// <summary>The computed smallest change that makes the finding pass, where the rule computes one.</summary>
    public FixHint? Fix { get; init; }
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

/// <summary>What a fix hint asks to change.</summary>
public enum FixKind
{
    /// <summary>A replacement amplifier needs at least this slew rate (V/s).</summary>
    MinimumSlewRate,

    /// <summary>A replacement amplifier needs at least this output current rating (A).</summary>
    MinimumOutputCurrent,

    /// <summary>A replacement resistor family needs at least this power rating (W).</summary>
    MinimumPowerRating,

    /// <summary>The resistor family's tolerance must be at most this (a ratio).</summary>
    MaximumResistorTolerance,

    /// <summary>The largest source amplitude (V) the design handles as it stands.</summary>
    MaximumAmplitude,

    /// <summary>A YAML value replaced by the nearest value of the declared E-series (IEC 60063) that passes.</summary>
    PreferredValue,

    /// <summary>An isolation resistor of at least this resistance (Ω, E24) between an amplifier's output and its capacitive load.</summary>
    IsolationResistor,

    /// <summary>The capacitance an amplifier's output drives must be at most this (F); one YAML value where one capacitor makes it up.</summary>
    MaximumCapacitance,
    /// <summary>The highest signal frequency (Hz, the band top) the design handles as it stands.</summary>
    MaximumBandTop,
}

/// <summary>
/// The smallest change that makes a finding pass, computed by the tool (closed form where the relation is one, a bounded
/// search with the engine where it is not): a figure a replacement part needs, or a YAML value to write.
/// </summary>
/// <param name="Kind">What to change.</param>
/// <param name="Subject">The part, family, component or value it concerns (e.g. <c>u1</c>, <c>rin</c>).</param>
/// <param name="Value">The hinted figure in SI units.</param>
/// <param name="Unit">The SI unit symbol of <paramref name="Value"/>; "%" marks a ratio shown as a percentage.</param>
/// <param name="Text">The hint in words, as appended to the message.</param>
public sealed record FixHint(FixKind Kind, string Subject, double Value, string Unit, string Text)
{
    /// <summary>The YAML value to replace, where one replacement fixes the finding; null for a part figure.</summary>
    public DesignRules.Diagnostics.SourceSpan? ValueSpan { get; init; }

    /// <summary>The replacement text for <see cref="ValueSpan"/> (engineering notation, as a person writes it).</summary>
    public string? Replacement { get; init; }

    /// <summary>True when no part class in the design's visible parts libraries reaches the hinted figure (the text says so).</summary>
    public bool BeyondPartClasses { get; init; }

    /// <summary>
    /// Other changes that would each make the finding pass on their own (e.g. the largest amplitude the design handles as it
    /// stands, beside the slew rate a faster part needs); <see cref="Said"/> follows this hint's text with theirs.
    /// </summary>
    public IReadOnlyList<FixHint> Alternatives { get; init; } = [];

    /// <summary>This hint and every alternative, this one first.</summary>
    public IEnumerable<FixHint> All => Alternatives.Prepend(this);

    /// <summary>The hint and its alternatives in words, as appended to the message and shown on the page ("…. Alternatively, …").</summary>
    public string Said => string.Concat(Alternatives.Select(a => " Alternatively, " + a.Text).Prepend(Text.TrimEnd()));

    /// <summary>This hint with <paramref name="alternative"/> (and its own alternatives) offered beside it; null leaves it unchanged.</summary>
    public FixHint Or(FixHint? alternative) => alternative is null
        ? this
        : this with { Alternatives = [.. Alternatives, .. alternative.All] };

    /// <summary>The kind's stable name in reports, e.g. <c>minimum-slew-rate</c>.</summary>
    public string KindName => Kind switch
    {
        FixKind.MinimumSlewRate => "minimum-slew-rate",
        FixKind.MinimumOutputCurrent => "minimum-output-current",
        FixKind.MinimumPowerRating => "minimum-power-rating",
        FixKind.MaximumResistorTolerance => "maximum-resistor-tolerance",
        FixKind.MaximumAmplitude => "maximum-amplitude",
        FixKind.IsolationResistor => "isolation-resistor",
        FixKind.MaximumCapacitance => "maximum-capacitance",
        FixKind.MaximumBandTop => "maximum-band-top",
        _ => "preferred-value",
    };
}
