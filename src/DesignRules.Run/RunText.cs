using System.Globalization;
using DesignRules.Diagnostics;
using DesignRules.Reports;
using DesignRules.Rules;

namespace DesignRules.Run;

/// <summary>The sentences both hosts print, in one place so that they never drift apart.</summary>
public static class RunText
{
    /// <summary>The code of the one error an internal failure of the tool becomes.</summary>
    public static readonly RuleId FaultId = RuleIds.InternalFailure;

    /// <summary><c>N design(s) in M file(s) checked: E error(s), W warning(s), X waived.</c></summary>
    public static string Summary(CheckReport report)
    {
        ArgumentNullException.ThrowIfNull(report);
        return string.Create(CultureInfo.InvariantCulture,
            $"{report.DesignCount} design(s) in {report.FileCount} file(s) checked: {report.ErrorCount} error(s), {report.WarningCount} warning(s), {report.Findings.Count(f => f.IsWaived)} waived.");
    }

    /// <summary>
    /// <c>against the baseline: 1 new, 0 changed, 3 unchanged, 1 resolved finding(s).</c>, and under the new-only gate how
    /// many findings it let pass as notes.
    /// </summary>
    public static string Baseline(Reports.Comparison.RunComparison comparison, int? passedByGate)
    {
        ArgumentNullException.ThrowIfNull(comparison);
        int Count(Reports.Comparison.FindingChange c) => comparison.Of(c).Count();
        var line = string.Create(CultureInfo.InvariantCulture,
            $"against the baseline: {Count(Reports.Comparison.FindingChange.New)} new, {Count(Reports.Comparison.FindingChange.Changed)} changed, {Count(Reports.Comparison.FindingChange.Unchanged)} unchanged, {Count(Reports.Comparison.FindingChange.Resolved)} resolved finding(s).");
        return passedByGate is { } passed
            ? line + string.Create(CultureInfo.InvariantCulture, $" New-only gate: {passed} finding(s) also in the baseline shown as notes; only new ones fail the check.")
            : line;
    }

    /// <summary>One design finished: <c>checked designs/x.yaml (x): 0 error(s), 1 warning(s), 0.42 s</c>.</summary>
    public static string Progress(DesignProgress progress, string root)
    {
        ArgumentNullException.ThrowIfNull(progress);
        var how = progress.JustEvaluated ? "evaluated by the head start, from the results cache"
            : progress.FromStore ? "unchanged, from the results cache" : string.Create(CultureInfo.InvariantCulture, $"{progress.Elapsed.TotalSeconds:0.00} s");
        return string.Create(CultureInfo.InvariantCulture,
            $"checked {DiagnosticText.Escape(RepositoryPaths.Display(root, progress.File))} ({DiagnosticText.Escape(progress.DesignId)}): {progress.Errors} error(s), {progress.Warnings} warning(s), {how}");
    }

    /// <summary>A long run still going: how many designs are done and how long it has taken.</summary>
    public static string StillRunning(int completed, int total, TimeSpan elapsed) =>
        total > 0
            ? string.Create(CultureInfo.InvariantCulture, $"still checking: {completed} of {total} design(s) done after {elapsed.TotalSeconds:0} s")
            : string.Create(CultureInfo.InvariantCulture, $"still loading the designs after {elapsed.TotalSeconds:0} s");

    /// <summary>The DR990 sentence, from the catalogue: what failed, and that it is the tool's fault.</summary>
    public static string Fault(Exception exception)
    {
        ArgumentNullException.ThrowIfNull(exception);
        var detail = exception is AggregateException { InnerExceptions.Count: 1 } single ? single.InnerExceptions[0] : exception;
        return RuleCatalogue.Default[FaultId].Render(new object?[] { $"{detail.GetType().Name}: {detail.Message.TrimEnd('.')}" });
    }
}
