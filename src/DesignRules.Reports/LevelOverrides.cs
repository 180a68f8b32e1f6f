using DesignRules.Diagnostics;
using DesignRules.Rules;

namespace DesignRules.Reports;

/// <summary>
/// A build-level change of finding levels, written <c>DR906=warning;DR702=off</c> (levels: error, warning, note, off),
/// applied after the rule-set file. It serves quick trials and the tool's own tests; lasting changes belong in the
/// rule-set file, where they can be scoped to a design or stage.
/// </summary>
public sealed record LevelOverrides(IReadOnlyDictionary<string, Severity?> Levels)
{
    /// <summary>No changes.</summary>
    public static LevelOverrides None { get; } = new(new Dictionary<string, Severity?>(StringComparer.Ordinal));

    /// <summary>Reads the text form; returns null and a reason when an entry is malformed.</summary>
    public static LevelOverrides? Parse(string? text, out string? problem)
    {
        problem = null;
        var levels = new Dictionary<string, Severity?>(StringComparer.Ordinal);
        foreach (var entry in (text ?? string.Empty).Split([';', ','], StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries))
        {
            var parts = entry.Split('=', ':');
            var id = parts[0].Trim().ToUpperInvariant();
            if (parts.Length != 2 || id.Length != 5 || !id.StartsWith("DR", StringComparison.Ordinal) || !id[2..].All(char.IsAsciiDigit))
            {
                problem = $"'{entry}' is not of the form DRnnn=level";
                return null;
            }

            if (!RuleCatalogue.Default.TryGet(id, out _))
            {
                problem = $"'{id}' in '{entry}' is not a rule id of the catalogue (rules/catalogue.yaml lists them)";
                return null;
            }

            switch (parts[1].Trim().ToLowerInvariant())
            {
                case "error": levels[id] = Severity.Error; break;
                case "warning": levels[id] = Severity.Warning; break;
                case "note": levels[id] = Severity.Note; break;
                case "off": levels[id] = null; break;
                default:
                    problem = $"'{parts[1].Trim()}' in '{entry}' is not a level; use error, warning, note or off";
                    return null;
            }
        }

        return new LevelOverrides(levels);
    }

    /// <summary>The report with the levels changed (and findings of rules set to off removed).</summary>
    public CheckReport Apply(CheckReport report)
    {
        ArgumentNullException.ThrowIfNull(report);
        if (Levels.Count == 0)
        {
            return report;
        }

        var findings = new List<Finding>(report.Findings.Count);
        foreach (var finding in report.Findings)
        {
            if (!Levels.TryGetValue(finding.RuleId, out var level))
            {
                findings.Add(finding);
            }
            else if (level is { } severity)
            {
                findings.Add(finding with { Severity = severity });
            }
        }

        return report with { Findings = findings };
    }
}
