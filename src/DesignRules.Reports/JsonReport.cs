using System.Text.Json;
using DesignRules.Rules;

namespace DesignRules.Reports;

/// <summary>
/// Writes a check report as a JSON document of our own (<c>designrules-findings</c>, format 2): a summary, every
/// finding with its location, help page, waiver and figures in SI units, and every checked design's key figures per stage
/// (passing designs included, so that CI can read a design's numbers), each with its stable key and the limit and margin
/// where a rule judged it. The format is published as a JSON Schema (<see cref="SchemaName"/>, in the package's
/// <c>schemas/</c> folder). Deterministic bytes, like the SARIF report.
/// </summary>
public static class JsonReport
{
    /// <summary>The format name stated in the document.</summary>
    public const string FormatName = "designrules-findings";

    /// <summary>
    /// The format version; raised only when a field changes meaning or disappears. 2: every figure carries its stable
    /// <c>key</c>, and a finding's figures have the same keys, labels and units as the stage's. A finding's optional
    /// <c>fix</c> object (its computed fix hint) was added within format 2: readers that ignore it lose nothing.
    /// </summary>
    public const int FormatVersion = 2;

    /// <summary>The file name of the format's JSON Schema (draft 2020-12), beside the design, parts and rule-set schemas.</summary>
    public const string SchemaName = "report.schema.json";

    /// <summary>The JSON document as UTF-8 bytes.</summary>
    public static byte[] ToBytes(CheckReport report, ReportSettings settings)
    {
        ArgumentNullException.ThrowIfNull(report);
        ArgumentNullException.ThrowIfNull(settings);
        return ReportJson.ToBytes(w => Write(w, report, settings));
    }

    /// <summary>Writes the JSON document to <paramref name="path"/>, creating its folder.</summary>
    public static void WriteFile(CheckReport report, ReportSettings settings, string path) =>
        ReportFiles.Write(path, ToBytes(report, settings));

    private static void Write(Utf8JsonWriter w, CheckReport report, ReportSettings settings)
    {
        w.WriteStartObject();
        w.WriteString("format", FormatName);
        w.WriteNumber("formatVersion", FormatVersion);
        w.WriteStartObject("tool");
        w.WriteString("name", ReportSettings.ToolName);
        w.WriteString("version", settings.ToolVersion);
        w.WriteEndObject();
        w.WriteStartObject("summary");
        w.WriteNumber("designs", report.DesignCount);
        w.WriteNumber("files", report.FileCount);
        w.WriteNumber("errors", report.ErrorCount);
        w.WriteNumber("warnings", report.WarningCount);
        w.WriteNumber("notes", report.Findings.Count(f => f.Severity == Diagnostics.Severity.Note && !f.IsWaived));
        w.WriteNumber("waived", report.Findings.Count(f => f.IsWaived));
        w.WriteEndObject();
        WriteCautions(w, report, settings);
        WriteYields(w, report);
        w.WriteStartArray("findings");
        var nodes = new FindingNodes();
        foreach (var f in report.Findings)
        {
            WriteFinding(w, f, settings, nodes);
        }

        w.WriteEndArray();
        WriteRequirements(w, report);
        w.WriteStartArray("designs");
        foreach (var design in report.Designs)
        {
            WriteDesign(w, design, settings);
        }

        w.WriteEndArray();
        w.WriteEndObject();
    }

    /// <summary>Every stated requirement's verdict, from the rules that judged it ("not checked" when none did).</summary>
    private static void WriteRequirements(Utf8JsonWriter w, CheckReport report)
    {
        w.WriteStartArray("requirements");
        foreach (var design in report.Designs)
        {
            foreach (var r in design.Requirements)
            {
                w.WriteStartObject();
                w.WriteString("design", design.Design.Id.Value);
                w.WriteString("stage", r.StageId);
                w.WriteString("requirement", r.Name);
                w.WriteString("verdict", r.Verdict);
                w.WriteStartArray("judgedBy");
                foreach (var id in r.JudgedBy) w.WriteStringValue(id);
                w.WriteEndArray();
                w.WriteEndObject();
            }
        }

        w.WriteEndArray();
    }

    /// <summary>
    /// Writes one design's key figures: <c>{ "id", "file", "figures", "stages": [{ "id", "figures" }] }</c>, stages in signal
    /// order, figures in the order the rules recorded them.
    /// </summary>
    private static void WriteDesign(Utf8JsonWriter w, DesignSummary design, ReportSettings settings)
    {
        w.WriteStartObject();
        w.WriteString("id", design.Design.Id.Value);
        w.WriteString("file", RepositoryPaths.Display(settings.RepositoryRoot, design.Design.File));
        WriteFigures(w, design.DesignFigures);
        w.WriteStartArray("stages");
        foreach (var (stage, figures) in design.StageFigures)
        {
            w.WriteStartObject();
            w.WriteString("id", stage);
            WriteFigures(w, figures);
            w.WriteEndObject();
        }

        w.WriteEndArray();
        w.WriteEndObject();
    }

    private static void WriteFinding(Utf8JsonWriter w, Finding f, ReportSettings settings, FindingNodes nodes)
    {
        w.WriteStartObject();
        w.WriteString("ruleId", f.RuleId);
        w.WriteString("title", f.Title);
        w.WriteString("severity", ReportJson.Level(f.Severity));
        w.WriteString("message", f.Message);
        w.WriteString("file", RepositoryPaths.Display(settings.RepositoryRoot, f.Span.File));
        w.WriteNumber("line", f.Span.Line);
        w.WriteNumber("column", f.Span.Column);
        w.WriteNumber("endLine", f.Span.EndLine);
        w.WriteNumber("endColumn", f.Span.EndColumn);
        WriteOptional(w, "node", nodes.PathOf(f.Span));
        w.WriteString("helpPage", f.HelpPage);
        if (HelpLinks.For(f.RuleId, settings.HelpUriBase) is { } help)
        {
            w.WriteString("helpUri", help);
        }

        WriteOptional(w, "design", f.DesignId);
        WriteOptional(w, "stage", f.StageId);
        w.WriteBoolean("waived", f.IsWaived);
        WriteOptional(w, "waiver", f.Waiver);
        WriteFigures(w, f.Figures);
        WriteFix(w, f.Fix, settings);
        w.WriteEndObject();
    }

    /// <summary>
    /// Writes <c>"fix": { "kind", "subject", "value", "unit", "text", "replacement"?, "file"?, "line"?, ... }</c> where the rule
    /// computed the smallest change that makes the finding pass; the location and replacement only for a YAML value.
    /// </summary>
    private static void WriteFix(Utf8JsonWriter w, FixHint? fix, ReportSettings settings)
    {
        if (fix is null)
        {
            return;
        }

        w.WritePropertyName("fix");
        WriteFixObject(w, fix, settings);
    }

    /// <summary>One fix hint as an object; its alternatives (other changes that would each fix the finding) nest as <c>alternatives</c>.</summary>
    private static void WriteFixObject(Utf8JsonWriter w, FixHint fix, ReportSettings settings)
    {
        w.WriteStartObject();
        w.WriteString("kind", fix.KindName);
        w.WriteString("subject", fix.Subject);
        ReportJson.Number(w, "value", fix.Value);
        w.WriteString("unit", fix.Unit);
        w.WriteString("text", fix.Text);
        w.WriteBoolean("beyondPartClasses", fix.BeyondPartClasses);
        if (fix.ValueSpan is { } span && fix.Replacement is { } replacement)
        {
            w.WriteString("replacement", replacement);
            w.WriteString("file", RepositoryPaths.Display(settings.RepositoryRoot, span.File));
            w.WriteNumber("line", span.Line);
            w.WriteNumber("column", span.Column);
            w.WriteNumber("endLine", span.EndLine);
            w.WriteNumber("endColumn", span.EndColumn);
        }

        if (fix.Alternatives.Count > 0)
        {
            w.WriteStartArray("alternatives");
            foreach (var alternative in fix.Alternatives)
            {
                WriteFixObject(w, alternative, settings);
            }

            w.WriteEndArray();
        }

        w.WriteEndObject();
    }

    /// <summary>
    /// Writes <c>"cautions": [{ "design", "file", "hazards", "note", "aboveExtraLowVoltage", "text" }]</c>: one entry per
    /// checked design that declares a hazard or works above extra-low voltage, in the report's design order.
    /// </summary>
    internal static void WriteCautions(Utf8JsonWriter w, CheckReport report, ReportSettings settings)
    {
        w.WriteStartArray("cautions");
        foreach (var design in report.Designs.Select(s => s.Design))
        {
            if (Model.SafetyCaution.For(design) is not { } caution)
            {
                continue;
            }

            w.WriteStartObject();
            w.WriteString("design", design.Id.Value);
            w.WriteString("file", RepositoryPaths.Display(settings.RepositoryRoot, design.File));
            w.WriteStartArray("hazards");
            foreach (var kind in caution.Hazards)
            {
                w.WriteStringValue(Model.Hazards.NameOf(kind));
            }

            w.WriteEndArray();
            WriteOptional(w, "note", caution.Note);
            w.WriteBoolean("aboveExtraLowVoltage", caution.AboveExtraLowVoltage);
            w.WriteString("text", caution.Text);
            w.WriteEndObject();
        }

        w.WriteEndArray();
    }

    /// <summary>
    /// Writes <c>"yields"</c>: per design and stage judged against a yield, the Monte Carlo samples, the passing count,
    /// the yield with its two-sided Clopper–Pearson interval and level, the requirement and the verdict (ratios, not percent).
    /// </summary>
    private static void WriteYields(Utf8JsonWriter w, CheckReport report)
    {
        w.WriteStartArray("yields");
        foreach (var summary in report.Designs)
        {
            foreach (var y in summary.Yields)
            {
                w.WriteStartObject();
                w.WriteString("design", summary.Design.Id.Value);
                w.WriteString("stage", y.StageId);
                w.WriteNumber("samples", y.Samples);
                w.WriteNumber("passing", y.Passing);
                w.WriteNumber("seed", y.Seed);
                w.WriteBoolean("sequential", y.Sequential);
                ReportJson.Number(w, "accuracy", y.Accuracy);
                ReportJson.Number(w, "yield", y.Yield);
                ReportJson.Number(w, "lower", y.Lower);
                ReportJson.Number(w, "upper", y.Upper);
                ReportJson.Number(w, "confidence", y.Confidence);
                ReportJson.Number(w, "required", y.Required);
                w.WriteString("verdict", y.VerdictText);
                if (y.SamplesNeeded is { } needed)
                {
                    w.WriteNumber("samplesNeeded", needed);
                }
                else
                {
                    w.WriteNull("samplesNeeded");
                }

                w.WriteEndObject();
            }
        }

        w.WriteEndArray();
    }

    /// <summary>
    /// Writes <c>"figures": [{ "key", "name", "value", "unit", "limit"?, "margin"?, "temperature"? }]</c> in the given order: the stable key
    /// (<c>slew.demand@rect.u1.out</c>) to match on, the label for people; limit and margin only where a rule judged the figure.
    /// </summary>
    internal static void WriteFigures(Utf8JsonWriter w, IReadOnlyList<Figure> figures)
    {
        w.WriteStartArray("figures");
        foreach (var figure in figures)
        {
            w.WriteStartObject();
            w.WriteString("key", figure.Key.ToString());
            w.WriteString("name", figure.Name);
            ReportJson.Number(w, "value", figure.Value);
            w.WriteString("unit", figure.Unit);
            if (figure.Limit is { } limit)
            {
                ReportJson.Number(w, "limit", limit);
                ReportJson.Number(w, "margin", figure.Margin ?? double.NaN);
            }

            if (figure.Temperature is { } celsius)
            {
                ReportJson.Number(w, "temperature", celsius);
            }

            w.WriteEndObject();
        }

        w.WriteEndArray();
    }

    private static void WriteOptional(Utf8JsonWriter w, string name, string? value)
    {
        if (value is null)
        {
            w.WriteNull(name);
        }
        else
        {
            w.WriteString(name, value);
        }
    }
}
