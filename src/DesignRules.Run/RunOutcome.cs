using DesignRules.Pages;
using DesignRules.Rules;

namespace DesignRules.Run;

/// <summary>What one run did, for a host to print: the findings, the reports, the pages and the summary.</summary>
public sealed record RunOutcome
{
    /// <summary>The check with the request's level changes applied, before the host's warning levels (hosts log from it).</summary>
    public CheckReport Report { get; init; } = Empty;

    /// <summary>The check as the host shows it (warnings promoted or switched off): what SARIF, JSON and the summary say.</summary>
    public CheckReport Shown { get; init; } = Empty;

    /// <summary>Options, paths or report files the run could not use (the host exits as for unusable input).</summary>
    public IReadOnlyList<RequestProblem> Problems { get; init; } = [];

    /// <summary>A report the request sent to standard output, as bytes; null when none.</summary>
    public byte[]? StandardOutput { get; init; }

    /// <summary>What writing the pages did; null when no pages were asked for.</summary>
    public PageResult? Pages { get; init; }

    /// <summary>The pages line (files written, kept and removed); null when no pages were written.</summary>
    public string? PagesLine { get; init; }

    /// <summary>True when the pages folder was refused (DR931): an unusable option, like a missing path.</summary>
    public bool PagesRefused => Pages?.Diagnostics.Any(d => d.Id == DatasheetPages.FolderProblemId) == true;

    /// <summary>Findings at error level as shown.</summary>
    public int ErrorCount => Shown.ErrorCount;

    /// <summary>Findings at warning level as shown.</summary>
    public int WarningCount => Shown.WarningCount;

    /// <summary>The summary line both hosts print (the build prefixes its log lines with <c>DesignRules: </c>).</summary>
    public string Summary => RunText.Summary(Shown);

    /// <summary>
    /// Against a baseline report: the counts of new, changed, unchanged and resolved findings, and under the new-only gate
    /// how many findings it let pass; null without a baseline.
    /// </summary>
    public string? BaselineLine { get; init; }

    /// <summary>How many designs came from the results cache rather than evaluation.</summary>
    public int FromCache { get; init; }

    /// <summary>True when the run took the check its build's head start made of exactly the same files (nothing loaded or looked up again).</summary>
    public bool TookHeadStartCheck { get; init; }

    /// <summary>When <see cref="TookHeadStartCheck"/>: the head start's own account (its phases, what it waited for), for the detailed log.</summary>
    public string? HeadStartAccount { get; init; }

    /// <summary>Where the run's wall time went, phase by phase (for a detailed log line; never part of a report).</summary>
    public RunTimings Timings { get; init; } = RunTimings.None;

    /// <summary>The sentence of the one DR990 error when the tool itself failed; null otherwise.</summary>
    public string? Fault { get; init; }

    /// <summary>The failure in full (type, message, stack), for a low-importance log line; null without a fault.</summary>
    public string? FaultDetail { get; init; }

    private static CheckReport Empty { get; } = new([], [], 0, 0);
}
