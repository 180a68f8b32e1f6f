using System.Text.Json;
using System.Text.Json.Serialization;
using DesignRules.Diagnostics;
using DesignRules.Rules;

namespace DesignRules.Run;

/// <summary>
/// The findings of the last stamped check, kept beside the stamp so that an up-to-date build can show them again
/// without evaluating. Only what logging needs is kept; figures are in the JSON report.
/// </summary>
internal static class StampedFindings
{
    public static void Write(string file, IEnumerable<Finding> findings)
    {
        var records = findings.Select(f => new Stored(
            f.RuleId, f.Title, f.Severity.ToString(), f.Message, f.Span.File, f.Span.Line, f.Span.Column, f.Span.EndLine,
            f.Span.EndColumn, f.HelpPage, f.Waiver)).ToList();
        var temporary = file + ".partial";
        File.WriteAllText(temporary, JsonSerializer.Serialize(records, StampedFindingsJson.Default.ListStored));
        File.Move(temporary, file, overwrite: true);
    }

    /// <summary>
    /// Reads the findings back, streaming the file through the serializer's pooled buffers: the whole file as one string
    /// (half a megabyte for 750 findings, a megabyte of characters, and the reader's copies) was over a fifth of a replay's
    /// time, most of it the build process touching fresh memory.
    /// </summary>
    public static IEnumerable<Finding> Read(string file)
    {
        List<Stored>? stored;
        using (var stream = new FileStream(file, FileMode.Open, FileAccess.Read, FileShare.Read, bufferSize: 1, FileOptions.SequentialScan))
        {
            stored = JsonSerializer.Deserialize(stream, StampedFindingsJson.Default.ListStored);
        }

        return (stored ?? []).Select(s => new Finding(
            s.RuleId, s.Title, Enum.Parse<Severity>(s.Severity), s.Message,
            new SourceSpan(s.File, s.Line, s.Column, s.EndLine, s.EndColumn), s.HelpPage, null, null, s.Waiver, []));
    }

    internal sealed record Stored(
        string RuleId, string Title, string Severity, string Message, string File, int Line, int Column, int EndLine,
        int EndColumn, string HelpPage, string? Waiver);
}

/// <summary>
/// The stamp's JSON, generated at compile time: a no-change build that replays warnings reads it in MSBuild's process,
/// where the reflection serializer would first emit and JIT its accessors.
/// </summary>
[JsonSerializable(typeof(List<StampedFindings.Stored>))]
internal sealed partial class StampedFindingsJson : JsonSerializerContext;
