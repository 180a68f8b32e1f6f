using DesignRules.Diagnostics;
using DesignRules.Rules;

namespace DesignRules.Reports.Comparison;

/// <summary>
/// The new-only gate (<c>--new-only</c>, <c>DesignRulesNewOnly</c>): a finding the baseline report already has (unchanged
/// or changed) is shown as a note that says so, so only findings new against the baseline fail the check. A team adopts
/// the gate on a repository that has findings today and tightens it later. Waived findings stay waived; the reports
/// (SARIF, JSON) keep every finding's true level, with its <c>baselineState</c>.
/// </summary>
public static class NewOnlyGate
{
    /// <summary>The words added to a finding the gate lets pass.</summary>
    public const string InBaselineNote = " (also in the baseline report, so not new: shown as a note under the new-only gate)";

    /// <summary>The report with every counting finding that the baseline already has lowered to a note.</summary>
    /// <param name="report">The report as the host logs or shows it.</param>
    /// <param name="settings">The settings the reports are written with; <see cref="ReportSettings.Baseline"/> must be set.</param>
    /// <param name="passed">How many findings the gate let pass.</param>
    public static CheckReport Apply(CheckReport report, ReportSettings settings, out int passed)
    {
        ArgumentNullException.ThrowIfNull(report);
        ArgumentNullException.ThrowIfNull(settings);
        var baseline = settings.Baseline ?? throw new ArgumentException("The new-only gate needs a baseline report.", nameof(settings));
        var known = baseline.Findings.Select(f => f.Identity).ToHashSet(StringComparer.Ordinal);
        var snapshot = BaselineStates.SnapshotOf(report, settings);
        var findings = new List<Finding>(report.Findings.Count);
        passed = 0;
        for (var i = 0; i < report.Findings.Count; i++)
        {
            var f = report.Findings[i];
            if (!f.IsWaived && f.Severity is Severity.Error or Severity.Warning && known.Contains(snapshot.Findings[i].Identity))
            {
                passed++;
                findings.Add(f with { Severity = Severity.Note, Message = f.Message + InBaselineNote });
            }
            else
            {
                findings.Add(f);
            }
        }

        return report with { Findings = findings };
    }
}
