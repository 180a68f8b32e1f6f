using System.Globalization;
using System.Text;
using Scriban;
using Scriban.Functions;
using Scriban.Runtime;
using Scriban.Syntax;

namespace DesignRules.Pages;

/// <summary>
/// Markdown that is already safe to put into a page: made by <see cref="MarkdownEscape"/> or by the page model itself.
/// Everything else a template writes is escaped as inline text first, so user text (titles, summaries, waiver
/// reasons, part descriptions, messages) can never become HTML, a link, emphasis, a heading or a broken table.
/// </summary>
/// <param name="Text">The Markdown.</param>
internal sealed record MarkdownText(string Text)
{
    public override string ToString() => Text;
}

/// <summary>Escaping of user text for each place a page puts it: inline text and table cells, code spans, link targets.</summary>
internal static class MarkdownEscape
{
    // Characters with a meaning anywhere in a line of Markdown (CommonMark, GitHub tables, strikethrough and math).
    private const string InlineSpecials = "\\`*_[]<>|~&$";

    /// <summary>Inline text: markup characters backslash-escaped, a leading block marker neutralised, controls made visible.</summary>
    public static string Inline(string? text)
    {
        var result = InlineMidLine(text ?? string.Empty);
        // At the start of a line these would open a heading, a quote, a list or a setext underline.
        var leading = result.Length - result.TrimStart(' ').Length;
        var body = result[leading..];
        if (body.Length > 0 && (body[0] is '#' or '=' or '>' || (body[0] is '-' or '+' && (body.Length == 1 || body[1] == ' '))))
        {
            return result[..leading] + "\\" + body;
        }

        var digits = body.TakeWhile(char.IsAsciiDigit).Count();
        if (digits is > 0 and < 10 && digits < body.Length && body[digits] is '.' or ')' && (digits + 1 == body.Length || body[digits + 1] == ' '))
        {
            return result[..(leading + digits)] + "\\" + body[digits..];
        }

        return result;
    }

    /// <summary>A code span holding <paramref name="text"/> literally, fenced by more backticks than it contains.</summary>
    public static string Code(string? text)
    {
        // Pipes end a table cell even inside a code span (GitHub tables), so they are escaped there too.
        var plain = Visible(text ?? string.Empty).Replace("|", "\\|", StringComparison.Ordinal);
        if (plain.Length == 0)
        {
            return string.Empty;
        }

        var longest = 0;
        var run = 0;
        foreach (var c in plain)
        {
            run = c == '`' ? run + 1 : 0;
            longest = Math.Max(longest, run);
        }

        var fence = new string('`', longest + 1);
        var pad = plain[0] is '`' or ' ' || plain[^1] is '`' or ' ' ? " " : string.Empty;
        return fence + pad + plain + pad + fence;
    }

    /// <summary>
    /// A finding message: its own `code` parts stay code spans, everything else is inline text. An unpaired backtick
    /// (from text a user wrote) is escaped like any other mark.
    /// </summary>
    public static string Message(string? text)
    {
        var parts = (text ?? string.Empty).Split('`');
        var result = new StringBuilder();
        for (var i = 0; i < parts.Length; i++)
        {
            var isCode = i % 2 == 1 && i < parts.Length - 1 && parts[i].Length > 0;
            if (isCode)
            {
                result.Append(Code(parts[i]));
            }
            else
            {
                if (i % 2 == 1)
                {
                    // An empty pair or an unpaired tick: keep the ticks as text.
                    result.Append(i < parts.Length - 1 ? "\\`\\`" : "\\`");
                }

                result.Append(i == 0 ? Inline(parts[i]) : InlineMidLine(parts[i]));
            }
        }

        return result.ToString();
    }

    /// <summary>A link target: anything outside the unreserved and path characters percent-encoded, so no target ends early.</summary>
    public static string Url(string? target)
    {
        var text = new StringBuilder();
        foreach (var b in Encoding.UTF8.GetBytes(target ?? string.Empty))
        {
            var c = (char)b;
            if (b < 0x80 && (char.IsAsciiLetterOrDigit(c) || "-._~/:#?=&%+,;@!*'".Contains(c, StringComparison.Ordinal)))
            {
                text.Append(c);
            }
            else
            {
                text.Append('%').Append(b.ToString("X2", CultureInfo.InvariantCulture));
            }
        }

        return text.ToString();
    }

    /// <summary>Label text of a Mermaid node inside double quotes: quotes, angle brackets and ticks as Mermaid entity codes.</summary>
    public static string MermaidLabel(string? text) =>
        Visible(text ?? string.Empty).Replace("#", "#35;", StringComparison.Ordinal).Replace("\"", "#quot;", StringComparison.Ordinal)
            .Replace("<", "#lt;", StringComparison.Ordinal).Replace(">", "#gt;", StringComparison.Ordinal)
            .Replace("`", "#96;", StringComparison.Ordinal);

    /// <summary>
    /// Line breaks and tabs become spaces; other control and direction-override characters become a visible
    /// <c>U+XXXX</c>, so that nothing invisible reorders or hides text in a page.
    /// </summary>
    public static string Visible(string text)
    {
        if (!text.Any(NeedsReplacing))
        {
            return text;
        }

        var result = new StringBuilder(text.Length + 8);
        foreach (var c in text)
        {
            if (c is '\r' or '\n' or '\t' or '\u2028' or '\u2029')
            {
                result.Append(' ');
            }
            else if (NeedsReplacing(c))
            {
                result.Append(CultureInfo.InvariantCulture, $"U+{(int)c:X4}");
            }
            else
            {
                result.Append(c);
            }
        }

        return result.ToString();
    }

    private static bool NeedsReplacing(char c) =>
        char.IsControl(c) || c is '\u2028' or '\u2029' or (>= '\u202A' and <= '\u202E') or (>= '\u2066' and <= '\u2069') or '\u200E' or '\u200F';

    private static string InlineMidLine(string text)
    {
        // Only a line's start opens a block; the middle of a message needs the inline escapes alone.
        var plain = Visible(text);
        var escaped = new StringBuilder(plain.Length + 8);
        foreach (var c in plain)
        {
            if (InlineSpecials.Contains(c, StringComparison.Ordinal))
            {
                escaped.Append('\\');
            }

            escaped.Append(c);
        }

        return escaped.ToString();
    }
}

/// <summary>
/// The template context of the pages: every value a template writes is escaped as inline Markdown unless it is
/// <see cref="MarkdownText"/> (what the escaping functions, the page model's links and diagrams, and <c>include</c>
/// return). A repository's own template is therefore safe by default; it may choose a different escaping
/// (<c>code</c>, <c>cell</c>) but never none.
/// </summary>
internal sealed class MarkdownTemplateContext : TemplateContext
{
    public override TemplateContext Write(Scriban.Parsing.SourceSpan span, object? textAsObject) => textAsObject switch
    {
        null => base.Write(span, textAsObject),
        MarkdownText safe => base.Write(span, safe.Text),
        _ => base.Write(span, MarkdownEscape.Inline(ObjectToString(textAsObject))),
    };
}

/// <summary><c>include</c> whose result (a rendered template, already escaped) is written as it is.</summary>
internal sealed class MarkdownInclude : IScriptCustomFunction
{
    private readonly IncludeFunction inner = new();

    public int RequiredParameterCount => inner.RequiredParameterCount;

    public int ParameterCount => inner.ParameterCount;

    public ScriptVarParamKind VarParamKind => inner.VarParamKind;

    public Type ReturnType => typeof(object);

    public ScriptParameterInfo GetParameterInfo(int index) => inner.GetParameterInfo(index);

    public object? Invoke(TemplateContext context, ScriptNode? callerContext, ScriptArray arguments, ScriptBlockStatement? blockStatement) =>
        Wrap(context, inner.Invoke(context, callerContext!, arguments, blockStatement!));

    public async ValueTask<object?> InvokeAsync(TemplateContext context, ScriptNode? callerContext, ScriptArray arguments, ScriptBlockStatement? blockStatement) =>
        Wrap(context, await inner.InvokeAsync(context, callerContext!, arguments, blockStatement!).ConfigureAwait(false));

    private static MarkdownText Wrap(TemplateContext context, object? result) =>
        new(result is null ? string.Empty : result as string ?? context.ObjectToString(result) ?? string.Empty);
}
