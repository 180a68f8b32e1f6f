using System.Globalization;
using System.Text.Json;

namespace DesignRules.Reports.Comparison;

/// <summary>
/// A JSON report (<see cref="JsonReport"/>, format 2) read back: its findings, each with its identity, and every design's
/// figures. Two snapshots are compared by <see cref="RunComparison"/>. Reading never throws: a missing, unreadable, foreign
/// or older-format file is a <see cref="SnapshotRead.Problem"/> naming the file and what to do.
/// </summary>
public sealed record ReportSnapshot(string ToolVersion, IReadOnlyList<SnapshotFinding> Findings, IReadOnlyList<SnapshotFigure> Figures)
{
    /// <summary>Reads the report at <paramref name="path"/>.</summary>
    public static SnapshotRead Read(string path)
    {
        ArgumentNullException.ThrowIfNull(path);
        byte[] bytes;
        try
        {
            if (Directory.Exists(path))
            {
                return Fail(path, "is a folder, not a JSON report; name the file written with --json or DesignRulesJsonFile");
            }

            if (!File.Exists(path))
            {
                return Fail(path, "no such report file; write one with 'designrules check --json FILE' or the DesignRulesJsonFile property");
            }

            bytes = File.ReadAllBytes(path);
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException or ArgumentException or NotSupportedException)
        {
            return Fail(path, $"cannot be read ({Diagnostics.DiagnosticText.Escape(ex.Message.TrimEnd('.'))})");
        }

        return FromBytes(bytes, path);
    }

    /// <summary>Reads a report from its bytes; <paramref name="name"/> is what problems call it.</summary>
    public static SnapshotRead FromBytes(ReadOnlySpan<byte> bytes, string name)
    {
        ArgumentNullException.ThrowIfNull(name);
        try
        {
            using var document = JsonDocument.Parse(bytes.ToArray(), new JsonDocumentOptions { MaxDepth = 32 });
            return FromDocument(document.RootElement, name);
        }
        catch (JsonException ex)
        {
            return Fail(name, $"is not JSON ({Diagnostics.DiagnosticText.Escape(ex.Message.TrimEnd('.'))})");
        }
        catch (Exception ex) when (ex is InvalidOperationException or FormatException or KeyNotFoundException)
        {
            return Fail(name, $"is not a well-formed {JsonReport.FormatName} report ({Diagnostics.DiagnosticText.Escape(ex.Message.TrimEnd('.'))}); write it again with this tool");
        }
    }

    private static SnapshotRead FromDocument(JsonElement root, string name)
    {
        if (root.ValueKind != JsonValueKind.Object || !root.TryGetProperty("format", out var format) || format.ValueKind != JsonValueKind.String
            || format.GetString() != JsonReport.FormatName)
        {
            return Fail(name, $"is not a DesignRules JSON report (no \"format\": \"{JsonReport.FormatName}\"); name the file written with --json, not the SARIF report");
        }

        var version = root.TryGetProperty("formatVersion", out var v) && v.ValueKind == JsonValueKind.Number && v.TryGetInt32(out var n) ? n : 0;
        if (version < JsonReport.FormatVersion)
        {
            return Fail(name, string.Create(CultureInfo.InvariantCulture,
                $"is report format {version}, older than format {JsonReport.FormatVersion} that comparison needs (figures with stable keys); check the base again with this tool version"));
        }

        if (version > JsonReport.FormatVersion)
        {
            return Fail(name, string.Create(CultureInfo.InvariantCulture,
                $"is report format {version}, written by a newer tool than this one (format {JsonReport.FormatVersion}); compare with the newer tool"));
        }

        var tool = root.TryGetProperty("tool", out var t) && t.TryGetProperty("version", out var tv) && tv.ValueKind == JsonValueKind.String ? tv.GetString()! : "?";
        var findings = new List<SnapshotFinding>();
        var occurrences = new Dictionary<string, int>(StringComparer.Ordinal);
        foreach (var f in root.GetProperty("findings").EnumerateArray())
        {
            var figures = ReadFigures(f, Text(f, "design") ?? string.Empty, Text(f, "stage"));
            var finding = new SnapshotFinding(
                Text(f, "ruleId") ?? throw new FormatException("a finding has no ruleId"),
                Text(f, "severity") ?? "note",
                Text(f, "message") ?? string.Empty,
                Text(f, "file") ?? string.Empty,
                f.TryGetProperty("line", out var line) && line.TryGetInt32(out var l) ? l : 0,
                Text(f, "design"),
                Text(f, "stage"),
                Text(f, "node"),
                f.TryGetProperty("waived", out var waived) && waived.ValueKind == JsonValueKind.True,
                figures);
            var stem = finding.IdentityStem;
            var count = occurrences[stem] = occurrences.GetValueOrDefault(stem) + 1;
            findings.Add(finding with { Identity = count == 1 ? stem : string.Create(CultureInfo.InvariantCulture, $"{stem}#{count}") });
        }

        var designFigures = new List<SnapshotFigure>();
        foreach (var d in root.GetProperty("designs").EnumerateArray())
        {
            var design = Text(d, "id") ?? string.Empty;
            designFigures.AddRange(ReadFigures(d, design, null));
            foreach (var s in d.GetProperty("stages").EnumerateArray())
            {
                designFigures.AddRange(ReadFigures(s, design, Text(s, "id")));
            }
        }

        return new SnapshotRead(new ReportSnapshot(tool, findings, designFigures), null);
    }

    private static List<SnapshotFigure> ReadFigures(JsonElement owner, string design, string? stage)
    {
        var list = new List<SnapshotFigure>();
        if (!owner.TryGetProperty("figures", out var figures) || figures.ValueKind != JsonValueKind.Array)
        {
            return list;
        }

        foreach (var f in figures.EnumerateArray())
        {
            list.Add(new SnapshotFigure(design, stage, Text(f, "key") ?? throw new FormatException("a figure has no key"), Text(f, "name") ?? string.Empty,
                Number(f, "value") ?? double.NaN, Text(f, "unit") ?? string.Empty, Number(f, "limit"), Number(f, "margin")));
        }

        return list;
    }

    private static string? Text(JsonElement e, string name) =>
        e.TryGetProperty(name, out var p) && p.ValueKind == JsonValueKind.String ? p.GetString() : null;

    private static double? Number(JsonElement e, string name)
    {
        if (!e.TryGetProperty(name, out var p))
        {
            return null;
        }

        return p.ValueKind switch
        {
            JsonValueKind.Number => p.GetDouble(),
            JsonValueKind.String => p.GetString() switch { "Infinity" => double.PositiveInfinity, "-Infinity" => double.NegativeInfinity, _ => double.NaN },
            _ => null,
        };
    }

    private static SnapshotRead Fail(string name, string problem) => new(null, $"{name}: {problem}");
}

/// <summary>A report read back, or the one sentence that says why it cannot be used (<c>path: what is wrong; what to do</c>).</summary>
public sealed record SnapshotRead(ReportSnapshot? Snapshot, string? Problem);

/// <summary>
/// A finding of a report read back. Its <see cref="Identity"/> is what two runs are matched by: rule id, design (the file
/// for a finding outside any design), stage, the YAML key path of the node it points at and the key of its first figure,
/// plus <c>#n</c> for the n-th finding with all of these equal. No line number and no message take part, so a finding keeps
/// its identity when unrelated lines move or when its numbers change (it is then "changed", not new and resolved).
/// </summary>
public sealed record SnapshotFinding(string RuleId, string Severity, string Message, string File, int Line, string? Design, string? Stage,
    string? Node, bool Waived, IReadOnlyList<SnapshotFigure> Figures)
{
    /// <summary>The identity (set by the reader, unique within one report).</summary>
    public string Identity { get; init; } = string.Empty;

    internal string IdentityStem => string.Join('|', RuleId, Design ?? File, Stage ?? string.Empty, Node ?? string.Empty,
        Figures.Count > 0 ? Figures[0].Key : string.Empty);

    /// <summary>True when the finding counts: not waived and at error or warning level.</summary>
    public bool Counts => !Waived && Severity is "error" or "warning";
}

/// <summary>A figure of a report read back, with the design and stage it belongs to (stage null: the design as a whole).</summary>
public sealed record SnapshotFigure(string Design, string? Stage, string Key, string Name, double Value, string Unit, double? Limit, double? Margin)
{
    /// <summary>Where the figure is, for matching across two runs: design, stage and key.</summary>
    public string Identity => string.Join('|', Design, Stage ?? string.Empty, Key);

    /// <summary>
    /// The margin as a fraction of the limit (0.4: the figure is 40 % of its limit inside it; negative: beyond it), so that
    /// margins of figures in different units compare; null without a limit. A zero limit takes the value's size instead.
    /// </summary>
    public double? RelativeMargin => Margin is { } m && Limit is { } l
        ? (Math.Abs(l) > 0 ? m / Math.Abs(l) : Math.Abs(Value) > 0 ? m / Math.Abs(Value) : 0)
        : null;
}
