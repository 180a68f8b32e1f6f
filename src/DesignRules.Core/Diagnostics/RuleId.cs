using System.Text.RegularExpressions;

namespace DesignRules.Diagnostics;

/// <summary>
/// A rule id, <c>DR</c> and three digits, as a type of its own so that code names a rule by its constant in
/// <see cref="RuleIds"/> instead of spelling the id as text. It converts to its text wherever a string is expected
/// (reports, dictionaries keyed by id), never the other way round without <see cref="Parse"/>.
/// </summary>
/// <param name="Value">The id's text, e.g. <c>DR102</c>.</param>
public readonly partial record struct RuleId(string Value)
{
    /// <summary>The id's text, e.g. <c>DR102</c>.</summary>
    public string Value { get; } = IdForm().IsMatch(Value ?? string.Empty)
        ? Value!
        : throw new ArgumentException($"A rule id is DR and three digits, not '{Value}'.", nameof(Value));

    /// <summary>The id's number (102 for DR102); its hundred says its concern, see <see cref="RuleCategories"/>.</summary>
    public int Number => int.Parse(Value.AsSpan(2), System.Globalization.CultureInfo.InvariantCulture);

    /// <summary>True when <paramref name="text"/> has the form of a rule id (whether or not the catalogue has it).</summary>
    public static bool IsWellFormed(string? text) => text is not null && IdForm().IsMatch(text);

    /// <summary>Reads an id from text, e.g. from a waiver or a rule-set file; throws for text of another form.</summary>
    public static RuleId Parse(string text) => new(text);

    /// <summary>The id's text.</summary>
    public override string ToString() => Value;

    /// <summary>The id's text, so that an id goes wherever a string is expected.</summary>
    public static implicit operator string(RuleId id) => id.Value;

    [GeneratedRegex("^DR[0-9]{3}$", RegexOptions.CultureInvariant)]
    private static partial Regex IdForm();
}

/// <summary>
/// The concern each hundred of ids belongs to (the <c>category</c> of a catalogue entry): 1xx slew, 2xx saturation and
/// headroom, 3xx loading, 4xx tolerance, 5xx bandwidth and stability, 6xx stress and derating, 7xx value hygiene, 9xx
/// problems in the design files themselves. 8xx is not given out.
/// </summary>
public static class RuleCategories
{
    /// <summary>Each category with the first and last id number it may use, in id order.</summary>
    public static IReadOnlyList<(string Category, int First, int Last)> Ranges { get; } =
    [
        ("slew", 100, 199),
        ("saturation", 200, 299),
        ("loading", 300, 399),
        ("tolerance", 400, 499),
        ("bandwidth", 500, 599),
        ("stress", 600, 699),
        ("hygiene", 700, 799),
        ("design-file", 900, 999),
    ];

    /// <summary>The category whose range holds <paramref name="id"/>, or null for an id in no range.</summary>
    public static string? Of(RuleId id) =>
        Ranges.Where(r => id.Number >= r.First && id.Number <= r.Last).Select(r => r.Category).FirstOrDefault();
}
