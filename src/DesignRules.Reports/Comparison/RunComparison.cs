namespace DesignRules.Reports.Comparison;

/// <summary>How a finding of the head run stands against the base run (SARIF's <c>baselineState</c> words in brackets).</summary>
public enum FindingChange
{
    /// <summary>Only in the head run (<c>new</c>).</summary>
    New,

    /// <summary>In both, with the same level, waiver and message (<c>unchanged</c>).</summary>
    Unchanged,

    /// <summary>In both, but its level, waiver or message (and so its numbers) differ (<c>updated</c>).</summary>
    Changed,

    /// <summary>Only in the base run: the head fixed it (<c>absent</c>).</summary>
    Resolved,
}

/// <summary>One finding classified: the head's finding (null when resolved) and the base's (null when new).</summary>
public sealed record ClassifiedFinding(FindingChange Change, SnapshotFinding? Base, SnapshotFinding? Head)
{
    /// <summary>The finding as the newer run has it (the base's when resolved).</summary>
    public SnapshotFinding Current => Head ?? Base!;

    /// <summary>SARIF 2.1.0's <c>baselineState</c> word (§3.27.24): new, unchanged, updated or absent.</summary>
    public string BaselineState => Change switch
    {
        FindingChange.New => "new",
        FindingChange.Unchanged => "unchanged",
        FindingChange.Changed => "updated",
        _ => "absent",
    };
}

/// <summary>
/// One figure in both runs (or only one), and how far it moved relative to its margin: <see cref="MarginShrink"/> is the
/// base's margin minus the head's, each as a fraction of its limit (0.35: the figure lost 35 % of its limit's worth of
/// margin; negative: it gained).
/// </summary>
public sealed record FigureMove(SnapshotFigure? Base, SnapshotFigure? Head)
{
    /// <summary>The figure as the newer run has it.</summary>
    public SnapshotFigure Current => Head ?? Base!;

    /// <summary>How much the relative margin shrank (positive) or grew (negative); null unless both runs judged the figure.</summary>
    public double? MarginShrink => Base?.RelativeMargin is { } before && Head?.RelativeMargin is { } after && double.IsFinite(before - after)
        ? before - after : null;

    /// <summary>The change of value as a fraction of the base's margin (1: the figure moved by its whole margin); null without one.</summary>
    public double? MovedByMargin => Base is { Margin: { } m } b && Head is { } h && m != 0 && double.IsFinite(h.Value - b.Value)
        ? (h.Value - b.Value) / Math.Abs(m) : null;
}

/// <summary>
/// Two runs compared: every finding of either classified (new, resolved, unchanged, changed), every figure matched by
/// design, stage and key. Lists keep the head report's order (resolved ones the base's), figures are ordered by how much
/// their margin shrank, most first; ties by identity, so that the result never depends on anything but the two reports.
/// </summary>
public sealed record RunComparison(IReadOnlyList<ClassifiedFinding> Findings, IReadOnlyList<FigureMove> Figures)
{
    /// <summary>A margin change smaller than this fraction of the limit is rounding, not a move.</summary>
    public const double NegligibleShrink = 1e-6;

    /// <summary>Compares <paramref name="head"/> with <paramref name="baseline"/>.</summary>
    public static RunComparison Compare(ReportSnapshot baseline, ReportSnapshot head)
    {
        ArgumentNullException.ThrowIfNull(baseline);
        ArgumentNullException.ThrowIfNull(head);
        var before = baseline.Findings.ToDictionary(f => f.Identity, StringComparer.Ordinal);
        var after = head.Findings.Select(f => f.Identity).ToHashSet(StringComparer.Ordinal);
        var findings = new List<ClassifiedFinding>(head.Findings.Count);
        foreach (var h in head.Findings)
        {
            if (!before.TryGetValue(h.Identity, out var b))
            {
                findings.Add(new ClassifiedFinding(FindingChange.New, null, h));
            }
            else
            {
                var same = b.Severity == h.Severity && b.Waived == h.Waived && b.Message == h.Message;
                findings.Add(new ClassifiedFinding(same ? FindingChange.Unchanged : FindingChange.Changed, b, h));
            }
        }

        findings.AddRange(baseline.Findings.Where(b => !after.Contains(b.Identity)).Select(b => new ClassifiedFinding(FindingChange.Resolved, b, null)));

        var baseFigures = new Dictionary<string, SnapshotFigure>(StringComparer.Ordinal);
        foreach (var f in baseline.Figures)
        {
            baseFigures.TryAdd(f.Identity, f);
        }

        var moves = new List<FigureMove>();
        var seen = new HashSet<string>(StringComparer.Ordinal);
        foreach (var h in head.Figures.Where(f => seen.Add(f.Identity)))
        {
            moves.Add(new FigureMove(baseFigures.GetValueOrDefault(h.Identity), h));
        }

        moves.AddRange(baseFigures.Values.Where(b => !seen.Contains(b.Identity)).Select(b => new FigureMove(b, null)));
        var ordered = moves
            .OrderByDescending(m => m.MarginShrink ?? double.NegativeInfinity)
            .ThenBy(m => m.Current.Identity, StringComparer.Ordinal)
            .ToList();
        return new RunComparison(findings, ordered);
    }

    /// <summary>The findings of one kind, in order.</summary>
    public IEnumerable<ClassifiedFinding> Of(FindingChange change) => Findings.Where(f => f.Change == change);

    /// <summary>Figures whose margin shrank by more than rounding, most first.</summary>
    public IEnumerable<FigureMove> Shrunk => Figures.Where(m => m.MarginShrink > NegligibleShrink);

    /// <summary>Figures whose margin grew by more than rounding.</summary>
    public IEnumerable<FigureMove> Grown => Figures.Where(m => m.MarginShrink < -NegligibleShrink);
}
