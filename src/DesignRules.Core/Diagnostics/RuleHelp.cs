using System.Text;
using System.Text.RegularExpressions;

namespace DesignRules.Diagnostics;

/// <summary>
/// The help pages of the rules (<c>rules/DRnnn.md</c>), embedded in this assembly: reports embed them (SARIF's
/// <c>help</c>), and datasheet pages copy the ones they link to beside themselves, so a link never points into a
/// package cache.
/// </summary>
public static partial class RuleHelp
{
    /// <summary>The Markdown help page of <paramref name="ruleId"/>, or null when the tool has none.</summary>
    public static string? Markdown(string ruleId)
    {
        ArgumentNullException.ThrowIfNull(ruleId);
        if (!IdForm().IsMatch(ruleId))
        {
            return null;
        }

        using var stream = typeof(RuleHelp).Assembly.GetManifestResourceStream($"DesignRules.Rules.{ruleId}.md");
        if (stream is null)
        {
            return null;
        }

        using var reader = new StreamReader(stream, Encoding.UTF8);
        return reader.ReadToEnd().ReplaceLineEndings("\n");
    }

    /// <summary>
    /// The first paragraph under "Why this rule exists" as plain text (one line), or null when the page has none:
    /// a rule's full description.
    /// </summary>
    public static string? Why(string ruleId)
    {
        var page = Markdown(ruleId);
        if (page is null)
        {
            return null;
        }

        var lines = page.Split('\n');
        var start = Array.FindIndex(lines, l => l.StartsWith("## Why", StringComparison.Ordinal));
        if (start < 0)
        {
            return null;
        }

        var paragraph = lines.Skip(start + 1).SkipWhile(string.IsNullOrWhiteSpace).TakeWhile(l => !string.IsNullOrWhiteSpace(l) && !l.StartsWith('#'));
        var text = PlainText(string.Join(' ', paragraph.Select(l => l.Trim())));
        return text.Length == 0 ? null : text;
    }

    /// <summary>The page with Markdown marks taken out (headings, emphasis, code ticks, link targets): SARIF's <c>help.text</c>.</summary>
    public static string? Text(string ruleId) => Markdown(ruleId) is { } page ? PlainText(page) : null;

    private static string PlainText(string markdown)
    {
        var text = Heading().Replace(markdown, string.Empty);
        text = Link().Replace(text, "$1");
        return text.Replace("**", string.Empty, StringComparison.Ordinal).Replace("`", string.Empty, StringComparison.Ordinal).Trim();
    }

    [GeneratedRegex("^DR[0-9]{3}$", RegexOptions.CultureInvariant)]
    private static partial Regex IdForm();

    [GeneratedRegex("^#+ ", RegexOptions.Multiline | RegexOptions.CultureInvariant)]
    private static partial Regex Heading();

    [GeneratedRegex(@"\[([^\]]*)\]\([^)]*\)", RegexOptions.CultureInvariant)]
    private static partial Regex Link();
}
