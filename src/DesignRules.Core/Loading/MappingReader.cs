using System.Globalization;
using System.Text.RegularExpressions;
using DesignRules.Diagnostics;
using DesignRules.Model;
using DesignRules.Quantities;
using DesignRules.Yaml;

namespace DesignRules.Loading;

/// <summary>
/// Reads the keys of one YAML mapping into typed, located values. Every read records its key as known, so that
/// <see cref="Finish"/> can report the keys nobody asked for (with a "did you mean"), and every problem becomes a
/// diagnostic rather than an exception.
/// </summary>
internal sealed partial class MappingReader
{
    private readonly YamlMapping mapping;
    private readonly List<Diagnostic> diagnostics;
    private readonly Dictionary<string, KeyValuePair<YamlScalar, YamlNode>> entries = new(StringComparer.Ordinal);
    private readonly List<string> known = [];

    private MappingReader(YamlMapping mapping, string what, List<Diagnostic> diagnostics)
    {
        this.mapping = mapping;
        What = what;
        this.diagnostics = diagnostics;
        Anchor = mapping.Span;
        foreach (var entry in mapping.Entries)
        {
            if (entries.TryGetValue(entry.Key.Value, out var first))
            {
                diagnostics.Add(DesignFileDiagnostics.DuplicateKey.At(entry.Key.Span, entry.Key.Value, Position(first.Key.Span)));
                continue;
            }

            entries[entry.Key.Value] = entry;
        }
    }

    /// <summary>What this mapping describes, for messages ("stage 'rect'").</summary>
    public string What { get; set; }

    public SourceSpan Span => mapping.Span;

    /// <summary>The key that introduced this mapping, where a missing key is best reported; the mapping itself otherwise.</summary>
    public SourceSpan Anchor { get; private set; } = null!;

    public List<Diagnostic> Diagnostics => diagnostics;

    /// <summary>A reader when <paramref name="node"/> is a mapping; otherwise reports the wrong shape and returns null.</summary>
    public static MappingReader? Of(YamlNode? node, string what, List<Diagnostic> diagnostics)
    {
        if (node is YamlMapping m)
        {
            return new MappingReader(m, what, diagnostics);
        }

        if (node is not null)
        {
            diagnostics.Add(DesignFileDiagnostics.WrongShape.At(node.Span, what, "a mapping (key: value lines)", node.ShapeName));
        }

        return null;
    }

    public bool Has(string key)
    {
        Know(key);
        return entries.TryGetValue(key, out var e) && !(e.Value is YamlScalar s && s.IsNull);
    }

    /// <summary>The raw node under a key, or null; reports a missing required key.</summary>
    public YamlNode? Node(string key, bool required, string hint)
    {
        Know(key);
        if (entries.TryGetValue(key, out var e) && !(e.Value is YamlScalar s && s.IsNull))
        {
            return e.Value;
        }

        if (required)
        {
            diagnostics.Add(DesignFileDiagnostics.MissingKey.At(e.Key?.Span ?? Anchor, What, key, hint));
        }

        return null;
    }

    public SourceSpan KeySpan(string key) => entries.TryGetValue(key, out var e) ? e.Key.Span : mapping.Span;

    public YamlScalar? Scalar(string key, bool required, string hint)
    {
        var node = Node(key, required, hint);
        if (node is null or YamlScalar)
        {
            return (YamlScalar?)node;
        }

        diagnostics.Add(DesignFileDiagnostics.WrongShape.At(node.Span, key, "a single value (" + hint + ")", node.ShapeName));
        return null;
    }

    public Located<string>? Text(string key, bool required, string hint)
    {
        var s = Scalar(key, required, hint);
        return s is null ? null : new Located<string>(s.Value, s.Span);
    }

    public Located<string>? Id(string key, bool required)
    {
        var s = Scalar(key, required, "an id such as 'input-buffer'");
        if (s is null)
        {
            return null;
        }

        if (!IdPattern().IsMatch(s.Value))
        {
            diagnostics.Add(DesignFileDiagnostics.BadId.At(s.Span, s.Value));
            return null;
        }

        return new Located<string>(s.Value, s.Span);
    }

    public Located<Quantity>? Quantity(string key, Dimension dimension, bool required, Func<Quantity, string?>? check = null)
    {
        var s = Scalar(key, required, QuantityForms.Example(dimension));
        return s is null ? null : ParseQuantity(s, key, dimension, check);
    }

    public Located<Quantity> Quantity(string key, Dimension dimension, Quantity fallback, Func<Quantity, string?>? check = null) =>
        Quantity(key, dimension, required: false, check) ?? new Located<Quantity>(fallback, KeySpan(key));

    public Located<Quantity>? ParseQuantity(YamlScalar s, string key, Dimension dimension, Func<Quantity, string?>? check)
    {
        if (!Quantities.Quantity.TryParse(s.Value, dimension, out var q, out var error))
        {
            diagnostics.Add(error?.Kind == QuantityErrorKind.WrongDimension
                ? DesignFileDiagnostics.WrongUnit.At(s.Span, s.Value, key, error.Message.TrimEnd('.'), QuantityForms.Example(dimension))
                : DesignFileDiagnostics.MalformedValue.At(s.Span, s.Value, key, error?.Message.TrimEnd('.') ?? "unreadable"));
            return null;
        }

        var problem = PlausibleRange.Check(q) ?? check?.Invoke(q);
        if (problem is not null)
        {
            diagnostics.Add(DesignFileDiagnostics.OutOfRange.At(s.Span, s.Value, key, problem));
            return null;
        }

        return new Located<Quantity>(q, s.Span);
    }

    public Located<QuantityRange>? Range(string key, Dimension dimension, bool required, Func<QuantityRange, string?>? check = null)
    {
        // The example a hint gives follows the dimension asked for.
        string example = dimension == Dimension.Temperature ? "a range such as -40 °C..85 °C" : "a range such as 20 Hz..20 kHz";
        var s = Scalar(key, required, example);
        if (s is null)
        {
            return null;
        }

        if (!QuantityRange.TryParse(s.Value, dimension, out var r, out var error))
        {
            diagnostics.Add(error?.Kind == QuantityErrorKind.WrongDimension
                ? DesignFileDiagnostics.WrongUnit.At(s.Span, s.Value, key, error.Message.TrimEnd('.'), example)
                : DesignFileDiagnostics.MalformedValue.At(s.Span, s.Value, key, (error?.Message.TrimEnd('.') ?? "unreadable") + "; expected " + example));
            return null;
        }

        var problem = PlausibleRange.Check(r.Low) ?? PlausibleRange.Check(r.High) ?? check?.Invoke(r);
        if (problem is not null)
        {
            diagnostics.Add(DesignFileDiagnostics.OutOfRange.At(s.Span, s.Value, key, problem));
            return null;
        }

        return new Located<QuantityRange>(r, s.Span);
    }

    public Located<bool>? Flag(string key)
    {
        var s = Scalar(key, required: false, "true or false");
        if (s is null)
        {
            return null;
        }

        return ReadFlag(s, key);
    }

    public Located<bool>? ReadFlag(YamlScalar s, string key)
    {
        switch (s.Quoted ? string.Empty : s.Value)
        {
            case "true" or "True" or "TRUE":
                return new Located<bool>(true, s.Span);
            case "false" or "False" or "FALSE":
                return new Located<bool>(false, s.Span);
            default:
                diagnostics.Add(DesignFileDiagnostics.UnknownChoice.At(s.Span, s.Value, key, string.Empty, "true, false"));
                return null;
        }
    }

    public Located<T>? Choice<T>(string key, IReadOnlyDictionary<string, T> choices, bool required)
    {
        var s = Scalar(key, required, "one of " + string.Join(", ", choices.Keys));
        return s is null ? null : ReadChoice(s, key, choices);
    }

    public Located<T>? ReadChoice<T>(YamlScalar s, string key, IReadOnlyDictionary<string, T> choices)
    {
        if (choices.TryGetValue(s.Value, out var value))
        {
            return new Located<T>(value, s.Span);
        }

        diagnostics.Add(DesignFileDiagnostics.UnknownChoice.At(
            s.Span, s.Value, key, SpellingSuggestion.Hint(s.Value, choices.Keys), string.Join(", ", choices.Keys)));
        return null;
    }

    public Located<DateOnly>? Date(string key)
    {
        var s = Scalar(key, required: false, "a date YYYY-MM-DD");
        if (s is null)
        {
            return null;
        }

        if (DateOnly.TryParseExact(s.Value, "yyyy-MM-dd", CultureInfo.InvariantCulture, DateTimeStyles.None, out var date))
        {
            return new Located<DateOnly>(date, s.Span);
        }

        diagnostics.Add(DesignFileDiagnostics.BadDate.At(s.Span, s.Value, key));
        return null;
    }

    /// <summary>The items of a list under a key (a single item is not promoted); reports a wrong shape.</summary>
    public IReadOnlyList<YamlNode> List(string key, bool required, string hint)
    {
        var node = Node(key, required, hint);
        switch (node)
        {
            case null:
                return [];
            case YamlSequence seq:
                return seq.Items;
            default:
                diagnostics.Add(DesignFileDiagnostics.WrongShape.At(node.Span, key, "a list (" + hint + ")", node.ShapeName));
                return [];
        }
    }

    public MappingReader? Child(string key, string what, bool required, string hint)
    {
        var child = Of(Node(key, required, hint), what, diagnostics);
        if (child is not null)
        {
            child.Anchor = KeySpan(key);
        }

        return child;
    }

    /// <summary>The entries present, in file order.</summary>
    public IEnumerable<KeyValuePair<YamlScalar, YamlNode>> Entries => mapping.Entries;

    /// <summary>Reports every key nobody read, with the accepted keys and a "did you mean".</summary>
    public void Finish()
    {
        foreach (var entry in mapping.Entries)
        {
            var key = entry.Key.Value;
            if (known.Contains(key, StringComparer.Ordinal))
            {
                continue;
            }

            diagnostics.Add(DesignFileDiagnostics.UnknownKey.At(
                entry.Key.Span, key, What, SpellingSuggestion.Hint(key, known), string.Join(", ", known)));
        }
    }

    /// <summary>Marks a key as accepted without reading it (read elsewhere).</summary>
    public void Know(string key)
    {
        if (!known.Contains(key, StringComparer.Ordinal))
        {
            known.Add(key);
        }
    }

    public static string Position(SourceSpan span) =>
        string.Create(CultureInfo.InvariantCulture, $"line {span.Line}, column {span.Column}");

    // \z, not $: in .NET '$' also matches before a final newline, which would let "id\n" through.
    [GeneratedRegex("^[a-z][a-z0-9-]{0,63}\\z", RegexOptions.CultureInvariant)]
    private static partial Regex IdPattern();
}
