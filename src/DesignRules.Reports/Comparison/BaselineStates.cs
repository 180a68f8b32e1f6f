using DesignRules.Rules;

namespace DesignRules.Reports.Comparison;

/// <summary>
/// A run's findings classified against a baseline report, the same way <c>designrules compare</c> classifies two reports:
/// the run is read as its own JSON report would read back, so that the identities match exactly.
/// </summary>
public static class BaselineStates
{
    /// <summary>The run read as its JSON report (the settings' baseline left out).</summary>
    public static ReportSnapshot SnapshotOf(CheckReport report, ReportSettings settings)
    {
        ArgumentNullException.ThrowIfNull(report);
        ArgumentNullException.ThrowIfNull(settings);
        var read = ReportSnapshot.FromBytes(JsonReport.ToBytes(report, settings with { Baseline = null }), "the run's own report");
        return read.Snapshot ?? throw new InvalidOperationException(read.Problem);
    }

    /// <summary>The comparison of the run with the settings' baseline, or null without one.</summary>
    public static RunComparison? Compare(CheckReport report, ReportSettings settings)
    {
        ArgumentNullException.ThrowIfNull(settings);
        return settings.Baseline is { } baseline ? RunComparison.Compare(baseline, SnapshotOf(report, settings)) : null;
    }

    /// <summary>SARIF's <c>baselineState</c> of each finding in the report's order, or null without a baseline.</summary>
    internal static IReadOnlyList<string>? Of(CheckReport report, ReportSettings settings) =>
        Compare(report, settings) is { } comparison
            ? comparison.Findings.Take(report.Findings.Count).Select(f => f.BaselineState).ToList()
            : null;
}
