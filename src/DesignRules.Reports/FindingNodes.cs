using DesignRules.Diagnostics;
using DesignRules.Yaml;

namespace DesignRules.Reports;

/// <summary>
/// The YAML key path of the node a finding points at (<c>stages[gain].values.rf</c>), each file read once per report. The
/// path names what a finding is about without a line number, so a finding keeps its identity when unrelated lines move.
/// </summary>
internal sealed class FindingNodes
{
    private readonly Dictionary<string, string?> texts = new(StringComparer.Ordinal);

    /// <summary>The key path at the span's start, or null when the file cannot be read or the position names no node.</summary>
    public string? PathOf(SourceSpan span)
    {
        if (string.IsNullOrEmpty(span.File) || span.Line < 1)
        {
            return null;
        }

        if (!texts.TryGetValue(span.File, out var text))
        {
            try
            {
                text = File.Exists(span.File) ? File.ReadAllText(span.File) : null;
            }
            catch (Exception ex) when (ex is IOException or UnauthorizedAccessException or ArgumentException or NotSupportedException)
            {
                text = null;
            }

            texts[span.File] = text;
        }

        return text is null ? null : NodePath.At(span.File, text, span.Line, span.Column);
    }
}
