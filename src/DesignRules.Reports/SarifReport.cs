using System.Security.Cryptography;
using System.Text;
using System.Text.Json;
using DesignRules.Diagnostics;
using DesignRules.Rules;
using DesignRules.Yaml;

namespace DesignRules.Reports;

/// <summary>
/// Writes a check report as SARIF 2.1.0 (OASIS): one run whose <c>tool.driver</c> lists every rule, and one result per
/// finding with a repository-relative location, a fingerprint that survives unrelated edits (rule, design, stage and
/// YAML key path, never a line number), and, for waived findings, an in-source suppression with the waiver's reason.
/// The bytes depend only on the report and the settings: no timestamps, invariant formatting, stable order.
/// </summary>
public static class SarifReport
{
    /// <summary>The schema address SARIF 2.1.0 files name.</summary>
    public const string SchemaUri = "https://json.schemastore.org/sarif-2.1.0.json";

    /// <summary>The SARIF document as UTF-8 bytes.</summary>
    public static byte[] ToBytes(CheckReport report, ReportSettings settings)
    {
        ArgumentNullException.ThrowIfNull(report);
        ArgumentNullException.ThrowIfNull(settings);
        return ReportJson.ToBytes(w => Write(w, report, settings));
    }

    /// <summary>Writes the SARIF document to <paramref name="path"/>, creating its folder.</summary>
    public static void WriteFile(CheckReport report, ReportSettings settings, string path) =>
        ReportFiles.Write(path, ToBytes(report, settings));

    private static void Write(Utf8JsonWriter w, CheckReport report, ReportSettings settings)
    {
        var rules = RuleCatalogue(report);
        var index = rules.Select((r, i) => (r.Id, i)).ToDictionary(x => x.Id, x => x.i, StringComparer.Ordinal);
        w.WriteStartObject();
        w.WriteString("$schema", SchemaUri);
        w.WriteString("version", "2.1.0");
        w.WriteStartArray("runs");
        w.WriteStartObject();
        WriteTool(w, rules, settings);
        w.WriteStartObject("originalUriBaseIds");
        w.WriteStartObject(ReportSettings.RootBaseId);
        w.WriteStartObject("description");
        w.WriteString("text", "The root of the hardware repository that was checked.");
        w.WriteEndObject();
        w.WriteEndObject();
        w.WriteEndObject();
        w.WriteStartArray("results");
        var fingerprints = new Fingerprints(settings.RepositoryRoot);
        var states = Comparison.BaselineStates.Of(report, settings);
        for (var i = 0; i < report.Findings.Count; i++)
        {
            var finding = report.Findings[i];
            WriteResult(w, finding, index[finding.RuleId], settings, fingerprints.Next(finding), states?[i]);
        }

        w.WriteEndArray();
        w.WriteString("columnKind", "utf16CodeUnits");

        // SARIF has no place of its own for a safety caution; the run's property bag carries the same entries as the
        // JSON report, so that a code-scanning upload keeps them beside the findings.
        w.WriteStartObject("properties");
        JsonReport.WriteCautions(w, report, settings);
        w.WriteEndObject();
        w.WriteEndObject();
        w.WriteEndArray();
        w.WriteEndObject();
    }

    /// <summary>Every rule the run knows plus any rule a finding names that the catalogue lacks, in id order.</summary>
    private static List<DiagnosticDescriptor> RuleCatalogue(CheckReport report)
    {
        var byId = new SortedDictionary<string, DiagnosticDescriptor>(StringComparer.Ordinal);
        foreach (var rule in report.Rules)
        {
            byId.TryAdd(rule.Id, rule);
        }

        foreach (var f in report.Findings.Where(f => !byId.ContainsKey(f.RuleId)))
        {
            byId[f.RuleId] = new DiagnosticDescriptor(f.RuleId, f.Title, "other", f.Severity, f.Title, f.HelpPage);
        }

        return [.. byId.Values];
    }

    private static void WriteTool(Utf8JsonWriter w, List<DiagnosticDescriptor> rules, ReportSettings settings)
    {
        w.WriteStartObject("tool");
        w.WriteStartObject("driver");
        w.WriteString("name", ReportSettings.ToolName);
        w.WriteString("version", settings.ToolVersion);
        w.WriteString("semanticVersion", settings.ToolVersion);
        w.WriteString("informationUri", settings.InformationUri);
        w.WriteStartArray("rules");
        foreach (var rule in rules)
        {
            w.WriteStartObject();
            w.WriteString("id", rule.Id);
            w.WriteString("name", RuleName(rule.Title));
            w.WriteStartObject("shortDescription");
            w.WriteString("text", rule.Title);
            w.WriteEndObject();
            w.WriteStartObject("fullDescription");
            w.WriteString("text", RuleHelp.Why(rule.Id) ?? rule.Title + ".");
            w.WriteEndObject();
            w.WriteStartObject("help");
            w.WriteString("text", RuleHelp.Text(rule.Id) ?? rule.Title + ".");
            w.WriteString("markdown", RuleHelp.Markdown(rule.Id) ?? rule.Title + ".");
            w.WriteEndObject();
            if (HelpLinks.For(rule.Id, settings.HelpUriBase) is { } help)
            {
                w.WriteString("helpUri", help);
            }

            w.WriteStartObject("defaultConfiguration");
            w.WriteString("level", ReportJson.Level(rule.DefaultSeverity));
            w.WriteEndObject();
            w.WriteStartObject("properties");
            w.WriteString("category", rule.Category);
            w.WriteStartArray("tags");
            w.WriteStringValue(rule.Category);
            w.WriteStringValue("design-rules");
            w.WriteEndArray();
            w.WriteEndObject();
            w.WriteEndObject();
        }

        w.WriteEndArray();
        w.WriteEndObject();
        w.WriteEndObject();
    }

    private static void WriteResult(Utf8JsonWriter w, Finding f, int ruleIndex, ReportSettings settings, string fingerprint, string? baselineState = null)
    {
        w.WriteStartObject();
        w.WriteString("ruleId", f.RuleId);
        w.WriteNumber("ruleIndex", ruleIndex);
        w.WriteString("level", ReportJson.Level(f.Severity));
        w.WriteStartObject("message");
        w.WriteString("text", f.Message);
        w.WriteEndObject();
        w.WriteStartArray("locations");
        w.WriteStartObject();
        w.WriteStartObject("physicalLocation");
        w.WriteStartObject("artifactLocation");
        var relative = RepositoryPaths.Relative(settings.RepositoryRoot, f.Span.File);
        if (relative is not null)
        {
            w.WriteString("uri", EscapePath(relative));
            w.WriteString("uriBaseId", ReportSettings.RootBaseId);
        }
        else
        {
            w.WriteString("uri", Path.IsPathRooted(f.Span.File) ? new Uri(f.Span.File).AbsoluteUri : f.Span.File);
        }

        w.WriteEndObject();
        WriteRegion(w, f.Span);
        w.WriteEndObject();
        w.WriteEndObject();
        w.WriteEndArray();
        w.WriteStartObject("partialFingerprints");
        w.WriteString(FingerprintName, fingerprint);
        w.WriteEndObject();
        if (baselineState is not null)
        {
            w.WriteString("baselineState", baselineState);
        }

        if (f.Waiver is not null)
        {
            // A waiver is written in the design file itself, beside the design it waives: an in-source suppression.
            w.WriteStartArray("suppressions");
            w.WriteStartObject();
            w.WriteString("kind", "inSource");
            w.WriteString("status", "accepted");
            w.WriteString("justification", f.Waiver);
            w.WriteEndObject();
            w.WriteEndArray();
        }

        WriteProperties(w, f);
        WriteFixes(w, f, settings);
        w.WriteEndObject();
    }

    /// <summary>
    /// Writes the SARIF 2.1.0 <c>fixes</c> of a finding whose fix hint (or one of its alternatives) is one YAML value
    /// replacement: per such hint one fix with one artifact change that deletes the value's region and inserts the
    /// replacement text, so an editor or a review bot can apply it. A hint that needs another part (a figure, not a value)
    /// or a different signal has no SARIF fix; its text is in the message.
    /// </summary>
    private static void WriteFixes(Utf8JsonWriter w, Finding f, ReportSettings settings)
    {
        var values = f.Fix?.All.Where(h => h is { ValueSpan: not null, Replacement: not null }).ToList() ?? [];
        if (values.Count == 0)
        {
            return;
        }

        w.WriteStartArray("fixes");
        foreach (var fix in values)
        {
            WriteFix(w, fix, fix.ValueSpan!, fix.Replacement!, settings);
        }

        w.WriteEndArray();
    }

    private static void WriteFix(Utf8JsonWriter w, FixHint fix, SourceSpan span, string replacement, ReportSettings settings)
    {
        w.WriteStartObject();
        w.WriteStartObject("description");
        w.WriteString("text", fix.Text);
        w.WriteEndObject();
        w.WriteStartArray("artifactChanges");
        w.WriteStartObject();
        w.WriteStartObject("artifactLocation");
        if (RepositoryPaths.Relative(settings.RepositoryRoot, span.File) is { } relative)
        {
            w.WriteString("uri", EscapePath(relative));
            w.WriteString("uriBaseId", ReportSettings.RootBaseId);
        }
        else
        {
            w.WriteString("uri", Path.IsPathRooted(span.File) ? new Uri(span.File).AbsoluteUri : span.File);
        }

        w.WriteEndObject();
        w.WriteStartArray("replacements");
        w.WriteStartObject();
        w.WriteStartObject("deletedRegion");
        w.WriteNumber("startLine", Math.Max(1, span.Line));
        w.WriteNumber("startColumn", Math.Max(1, span.Column));
        w.WriteNumber("endLine", Math.Max(span.Line, span.EndLine));
        w.WriteNumber("endColumn", Math.Max(span.Column, span.EndColumn));
        w.WriteEndObject();
        w.WriteStartObject("insertedContent");
        w.WriteString("text", replacement);
        w.WriteEndObject();
        w.WriteEndObject();
        w.WriteEndArray();
        w.WriteEndObject();
        w.WriteEndArray();
        w.WriteEndObject();
    }

    private static void WriteRegion(Utf8JsonWriter w, SourceSpan span)
    {
        w.WriteStartObject("region");
        w.WriteNumber("startLine", Math.Max(1, span.Line));
        w.WriteNumber("startColumn", Math.Max(1, span.Column));
        var endsLater = span.EndLine > span.Line || (span.EndLine == span.Line && span.EndColumn > span.Column);
        if (endsLater)
        {
            w.WriteNumber("endLine", span.EndLine);
            w.WriteNumber("endColumn", span.EndColumn);
        }

        w.WriteEndObject();
    }

    private static void WriteProperties(Utf8JsonWriter w, Finding f)
    {
        if (f.DesignId is null && f.StageId is null && f.Figures.Count == 0)
        {
            return;
        }

        w.WriteStartObject("properties");
        if (f.DesignId is not null)
        {
            w.WriteString("design", f.DesignId);
        }

        if (f.StageId is not null)
        {
            w.WriteString("stage", f.StageId);
        }

        if (f.Figures.Count > 0)
        {
            JsonReport.WriteFigures(w, f.Figures);
        }

        w.WriteEndObject();
    }

    /// <summary>"Unknown part" → "UnknownPart": SARIF's rule name is an identifier, the title stays the description.</summary>
    internal static string RuleName(string title) =>
        string.Concat(title.Split([' ', '-', '/'], StringSplitOptions.RemoveEmptyEntries)
            .Select(word => char.ToUpperInvariant(word[0]) + word[1..]))
        .Where(char.IsLetterOrDigit).Aggregate(new System.Text.StringBuilder(), (b, c) => b.Append(c)).ToString();

    /// <summary>The name of the partial fingerprint; the version changes only if the recipe does.</summary>
    public const string FingerprintName = "designRulesFinding/v1";

    /// <summary>
    /// Fingerprints that stay the same when unrelated lines move: rule, file, design, stage and the YAML key path of
    /// the node, plus a count for the rare case of two findings with all of these equal.
    /// </summary>
    private sealed class Fingerprints(string root)
    {
        private readonly Dictionary<string, string?> texts = new(StringComparer.Ordinal);
        private readonly Dictionary<string, int> seen = new(StringComparer.Ordinal);

        public string Next(Finding f)
        {
            var key = string.Join('\u001f', f.RuleId, RepositoryPaths.Display(root, f.Span.File), f.DesignId ?? string.Empty,
                f.StageId ?? string.Empty, NodePathOf(f.Span) ?? string.Empty);
            var count = seen[key] = seen.GetValueOrDefault(key) + 1;
            var bytes = SHA256.HashData(Encoding.UTF8.GetBytes(key + "\u001f" + count.ToString(System.Globalization.CultureInfo.InvariantCulture)));
            return Convert.ToHexStringLower(bytes)[..32];
        }

        private string? NodePathOf(SourceSpan span)
        {
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

    private static string EscapePath(string relative) =>
        string.Join('/', relative.Split('/').Select(Uri.EscapeDataString));
}
