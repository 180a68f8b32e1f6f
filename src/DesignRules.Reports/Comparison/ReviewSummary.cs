using System.Globalization;
using System.Text;
using DesignRules.Quantities;

namespace DesignRules.Reports.Comparison;

/// <summary>
/// The Markdown review summary of a comparison, sized for a pull-request comment: a count line, then the new findings, the
/// resolved ones, the changed ones, and the figures whose margin shrank most (before → after, with design and stage). Each
/// table shows at most <c>maxRows</c> rows and ends with "and N more". Same comparison, same text: no dates, invariant
/// culture, "\n" line ends.
/// </summary>
public static class ReviewSummary
{
    /// <summary>The rows per table when the caller names no cap: a comment stays readable on one screen per table.</summary>
    public const int DefaultMaxRows = 10;

    /// <summary>The summary's text.</summary>
    public static string Write(RunComparison comparison, int maxRows = DefaultMaxRows)
    {
        ArgumentNullException.ThrowIfNull(comparison);
        maxRows = Math.Max(1, maxRows);
        var text = new StringBuilder();
        var newOnes = comparison.Of(FindingChange.New).ToList();
        var resolved = comparison.Of(FindingChange.Resolved).ToList();
        var changed = comparison.Of(FindingChange.Changed).ToList();
        var unchanged = comparison.Of(FindingChange.Unchanged).Count();
        var shrunk = comparison.Shrunk.ToList();
        var grown = comparison.Grown.Count();
        text.Append("## DesignRules: what this change did\n\n");
        text.Append(Invariant($"**{newOnes.Count} new**, **{resolved.Count} resolved**, {changed.Count} changed and {unchanged} unchanged finding(s); "));
        text.Append(Invariant($"{shrunk.Count} figure margin(s) shrank, {grown} grew.\n"));

        if (newOnes.Count > 0)
        {
            text.Append("\n### New findings\n\n");
            FindingTable(text, newOnes.Select(f => f.Head!).ToList(), maxRows);
        }

        if (resolved.Count > 0)
        {
            text.Append("\n### Resolved findings\n\n");
            FindingTable(text, resolved.Select(f => f.Base!).ToList(), maxRows);
        }

        if (changed.Count > 0)
        {
            text.Append("\n### Changed findings\n\n");
            text.Append("| rule | design / stage | before | after |\n|---|---|---|---|\n");
            foreach (var f in changed.Take(maxRows))
            {
                text.Append(Invariant($"| {f.Head!.RuleId} | {Place(f.Head.Design, f.Head.Stage)} | {Cell(State(f.Base!))} | {Cell(State(f.Head))} |\n"));
            }

            More(text, changed.Count, maxRows);
        }

        if (shrunk.Count > 0)
        {
            text.Append("\n### Margins that shrank most\n\n");
            text.Append("| figure | design / stage | before | after | margin (of limit) |\n|---|---|---|---|---|\n");
            foreach (var m in shrunk.Take(maxRows))
            {
                var b = m.Base!;
                var h = m.Head!;
                text.Append(Invariant(
                    $"| {Cell(h.Name)} ({Cell(h.Key)}) | {Place(h.Design, h.Stage)} | {Value(b.Value, b.Unit)} | {Value(h.Value, h.Unit)} | {Percent(b.RelativeMargin)} → {Percent(h.RelativeMargin)} |\n"));
            }

            More(text, shrunk.Count, maxRows);
        }

        if (newOnes.Count + resolved.Count + changed.Count + shrunk.Count == 0)
        {
            text.Append("\nNo finding and no margin changed.\n");
        }

        return text.ToString();
    }

    private static void FindingTable(StringBuilder text, List<SnapshotFinding> findings, int maxRows)
    {
        text.Append("| rule | level | design / stage | where | message |\n|---|---|---|---|---|\n");
        foreach (var f in findings.Take(maxRows))
        {
            var level = f.Waived ? f.Severity + " (waived)" : f.Severity;
            text.Append(Invariant($"| {f.RuleId} | {level} | {Place(f.Design, f.Stage)} | {Cell(f.File)}:{f.Line} | {Cell(f.Message)} |\n"));
        }

        More(text, findings.Count, maxRows);
    }

    private static void More(StringBuilder text, int count, int maxRows)
    {
        if (count > maxRows)
        {
            text.Append(Invariant($"\n… and {count - maxRows} more.\n"));
        }
    }

    private static string State(SnapshotFinding f) => (f.Waived ? f.Severity + " (waived)" : f.Severity) + ": " + f.Message;

    private static string Place(string? design, string? stage) =>
        design is null ? "—" : stage is null ? Cell(design) : Cell(design) + " / " + Cell(stage);

    private static string Percent(double? ratio) =>
        ratio is { } r && double.IsFinite(r) ? new Quantity(r, Dimension.Ratio).FormatPercent(3) : "—";

    /// <summary>Engineering notation for the units figures carry; a unit without a dimension of ours keeps a plain number.</summary>
    private static string Value(double value, string unit)
    {
        if (unit == "%")
        {
            return new Quantity(value, Dimension.Ratio).FormatPercent(3);
        }

        Dimension? dimension = unit switch
        {
            "V" => Dimension.Voltage,
            "A" => Dimension.Current,
            "Ω" => Dimension.Resistance,
            "F" => Dimension.Capacitance,
            "H" => Dimension.Inductance,
            "Hz" => Dimension.Frequency,
            "s" => Dimension.Time,
            "W" => Dimension.Power,
            "V/s" => Dimension.SlewRate,
            "1" => Dimension.Ratio,
            _ => null,
        };
        return !double.IsFinite(value) ? value.ToString(CultureInfo.InvariantCulture)
            : dimension is { } d ? new Quantity(value, d).Format(3)
            : value.ToString("G3", CultureInfo.InvariantCulture) + " " + unit;
    }

    /// <summary>Text made safe for a Markdown table cell: pipes, backslashes and backticks escaped, line breaks flattened.</summary>
    private static string Cell(string text)
    {
        var b = new StringBuilder(text.Length);
        foreach (var c in text)
        {
            switch (c)
            {
                case '|' or '\\' or '`' or '*' or '_' or '<' or '>' or '[' or ']':
                    b.Append('\\').Append(c);
                    break;
                case '\r' or '\n' or '\t':
                    b.Append(' ');
                    break;
                default:
                    b.Append(char.IsControl(c) ? ' ' : c);
                    break;
            }
        }

        return b.ToString();
    }

    private static string Invariant(FormattableString s) => s.ToString(CultureInfo.InvariantCulture);
}
