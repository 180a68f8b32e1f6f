using System.Globalization;

namespace DesignRules.Diagnostics;

/// <summary>
/// What a kind of diagnostic is: its id, title, category, default severity, help page and message format.
/// Message formats use numbered placeholders (<c>{0}</c>); arguments are substituted once and never re-parsed,
/// so text taken from a design file can hold braces safely; control characters in arguments are escaped and very long
/// arguments cut (<see cref="DiagnosticText"/>), so no argument can break the message's one line.
/// </summary>
/// <param name="Id">The stable id, <c>DR</c> and three digits.</param>
/// <param name="Title">A short title.</param>
/// <param name="Category">The concern the id belongs to.</param>
/// <param name="DefaultSeverity">The severity used unless configuration changes it.</param>
/// <param name="MessageFormat">The message with numbered placeholders.</param>
/// <param name="HelpPage">The help page path relative to the repository root, e.g. <c>rules/DR901.md</c>.</param>
public sealed record DiagnosticDescriptor(
    string Id, string Title, string Category, Severity DefaultSeverity, string MessageFormat, string HelpPage)
{
    /// <summary>The rule's adjustable limits with their defaults.</summary>
    public IReadOnlyList<ThresholdDefinition> Thresholds { get; init; } = [];

    /// <summary>Makes a diagnostic of this kind at <paramref name="span"/> from named message arguments.</summary>
    public Diagnostic At(SourceSpan span, IReadOnlyDictionary<string, string> arguments) =>
        new(Id, DefaultSeverity, Render(arguments), span, HelpPage);

    /// <summary>Substitutes named arguments (<c>{name}</c>) into the message format without re-reading the result.</summary>
    public string Render(IReadOnlyDictionary<string, string> arguments) =>
        Substitute(name => arguments.TryGetValue(name, out var v) ? DiagnosticText.Quote(v) : "{" + name + "}");

    /// <summary>Makes a diagnostic of this kind at <paramref name="span"/>.</summary>
    public Diagnostic At(SourceSpan span, params object?[] args) =>
        new(Id, DefaultSeverity, Render(args), span, HelpPage);

    /// <summary>Substitutes positional arguments (<c>{0}</c>) into the message format without re-reading the result.</summary>
    public string Render(object?[] args) =>
        Substitute(name => int.TryParse(name, NumberStyles.None, CultureInfo.InvariantCulture, out var i) && i < args.Length
            ? DiagnosticText.Quote(Convert.ToString(args[i], CultureInfo.InvariantCulture))
            : string.Empty);

    private string Substitute(Func<string, string> value)
    {
        var text = new System.Text.StringBuilder(MessageFormat.Length + 32);
        for (var i = 0; i < MessageFormat.Length; i++)
        {
            var c = MessageFormat[i];
            var close = c == '{' ? MessageFormat.IndexOf('}', i + 1) : -1;
            if (close > i + 1 && MessageFormat.AsSpan(i + 1, close - i - 1).IndexOfAnyExcept(PlaceholderCharacters) < 0)
            {
                text.Append(value(MessageFormat[(i + 1)..close]));
                i = close;
            }
            else
            {
                text.Append(c);
            }
        }

        return text.ToString();
    }

    private static readonly System.Buffers.SearchValues<char> PlaceholderCharacters =
        System.Buffers.SearchValues.Create("abcdefghijklmnopqrstuvwxyz0123456789-");
}

/// <summary>An adjustable limit of a rule.</summary>
/// <param name="Name">The threshold's key in the catalogue and in rule-set files.</param>
/// <param name="Default">The default value.</param>
/// <param name="Description">What it limits and where the default comes from.</param>
public sealed record ThresholdDefinition(string Name, Quantities.Quantity Default, string Description);
