using System.Globalization;
using System.Text;

namespace DesignRules.Diagnostics;

/// <summary>
/// Makes text taken from a user's files safe inside a diagnostic: control characters, line and paragraph separators
/// and bidirectional overrides are written as visible escapes (<c>\n</c>, <c>\u001B</c>), so a key holding an escape
/// sequence and a newline can never print a forged <c>file(1,1): error DR000</c> line into a build log, and a very
/// long value is cut, so one message stays one readable line.
/// </summary>
public static class DiagnosticText
{
    /// <summary>Longest piece of user text a message quotes before it is cut with an ellipsis.</summary>
    public const int MaxQuotedCharacters = 1_000;

    /// <summary>Escapes every character that could break a log line or reorder its display; other text is unchanged.</summary>
    public static string Escape(string? text)
    {
        if (string.IsNullOrEmpty(text))
        {
            return text ?? string.Empty;
        }

        var first = IndexOfUnsafe(text);
        if (first < 0)
        {
            return text;
        }

        var result = new StringBuilder(text.Length + 16).Append(text, 0, first);
        for (var i = first; i < text.Length; i++)
        {
            var c = text[i];
            if (!IsUnsafe(c))
            {
                result.Append(c);
                continue;
            }

            result.Append(c switch
            {
                '\n' => "\\n",
                '\r' => "\\r",
                '\t' => "\\t",
                _ => "\\u" + ((int)c).ToString("X4", CultureInfo.InvariantCulture),
            });
        }

        return result.ToString();
    }

    /// <summary>Escapes <paramref name="text"/> and cuts it to <see cref="MaxQuotedCharacters"/> characters.</summary>
    public static string Quote(string? text)
    {
        var escaped = Escape(text);
        return escaped.Length <= MaxQuotedCharacters ? escaped
            : string.Create(CultureInfo.InvariantCulture, $"{escaped[..MaxQuotedCharacters]}… ({escaped.Length} characters)");
    }

    private static int IndexOfUnsafe(string text)
    {
        for (var i = 0; i < text.Length; i++)
        {
            if (IsUnsafe(text[i]))
            {
                return i;
            }
        }

        return -1;
    }

    // C0 and C1 controls and DEL, line and paragraph separators, and the bidirectional embedding, override and isolate marks.
    private static bool IsUnsafe(char c) =>
        char.IsControl(c) || c is '\u2028' or '\u2029' || c is >= '\u202A' and <= '\u202E' || c is >= '\u2066' and <= '\u2069';
}
