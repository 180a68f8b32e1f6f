using System.Globalization;

namespace DesignRules.Diagnostics;

/// <summary>
/// What a kind of diagnostic is: its id, title, category, default severity, help page and message format.
/// Message formats use numbered placeholders (<c>{0}</c>); arguments are substituted once and never re-parsed,
/// so text taken from a design file can hold braces safely.
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
    /// <summary>Makes a diagnostic of this kind at <paramref name="span"/>.</summary>
    public Diagnostic At(SourceSpan span, params object?[] args) =>
        new(Id, DefaultSeverity, Render(args), span, HelpPage);

    /// <summary>Substitutes the arguments into the message format without re-reading the result.</summary>
    internal string Render(object?[] args)
    {
        var text = new System.Text.StringBuilder(MessageFormat.Length + 32);
        for (var i = 0; i < MessageFormat.Length; i++)
        {
            var c = MessageFormat[i];
            if (c == '{' && i + 2 < MessageFormat.Length && char.IsAsciiDigit(MessageFormat[i + 1]) && MessageFormat[i + 2] == '}')
            {
                var index = MessageFormat[i + 1] - '0';
                text.Append(index < args.Length ? Convert.ToString(args[index], CultureInfo.InvariantCulture) : string.Empty);
                i += 2;
            }
            else
            {
                text.Append(c);
            }
        }

        return text.ToString();
    }
}
