using DesignRules.Diagnostics;
using DesignRules.Rules;

namespace DesignRules.Reports;

/// <summary>
/// How a build treats warnings, compiler-style: all as errors (<c>-warnaserror</c>, <c>TreatWarningsAsErrors</c>), some
/// as errors (<c>WarningsAsErrors</c>), some never (<c>WarningsNotAsErrors</c>), some not at all (<c>NoWarn</c>).
/// Reports apply it so that SARIF says what the build said: a suppressed code is not annotated, a promoted one is an error.
/// </summary>
/// <param name="AllAsErrors">Every warning is an error, except those in <paramref name="NotAsErrors"/>.</param>
/// <param name="AsErrors">Codes whose warnings are errors.</param>
/// <param name="NotAsErrors">Codes whose warnings stay warnings under <paramref name="AllAsErrors"/>.</param>
/// <param name="NoWarn">Codes whose warnings are not reported.</param>
public sealed record WarningLevels(bool AllAsErrors, CodeList AsErrors, CodeList NotAsErrors, CodeList NoWarn)
{
    /// <summary>Warnings stay warnings.</summary>
    public static WarningLevels None { get; } = new(false, CodeList.Empty, CodeList.Empty, CodeList.Empty);

    /// <summary>A host's own verdict (MSBuild's <c>-warnaserror</c> as the engine reports it); null when it has none.</summary>
    public Func<string, bool>? HostTreatsAsError { get; init; }

    /// <summary>The level <paramref name="finding"/> is reported at; null when its warning is switched off by <see cref="NoWarn"/>.</summary>
    public Severity? Effective(Finding finding)
    {
        ArgumentNullException.ThrowIfNull(finding);
        if (finding.Severity != Severity.Warning || finding.IsWaived)
        {
            return finding.Severity;
        }

        if (NoWarn.Contains(finding.RuleId))
        {
            return null;
        }

        var promoted = AsErrors.Contains(finding.RuleId)
            || (AllAsErrors && !NotAsErrors.Contains(finding.RuleId))
            || HostTreatsAsError?.Invoke(finding.RuleId) == true;
        return promoted ? Severity.Error : Severity.Warning;
    }

    /// <summary>The report as the build shows it: promoted warnings as errors, switched-off warnings left out.</summary>
    public CheckReport Apply(CheckReport report)
    {
        ArgumentNullException.ThrowIfNull(report);
        var findings = new List<Finding>(report.Findings.Count);
        foreach (var finding in report.Findings)
        {
            if (Effective(finding) is { } level)
            {
                findings.Add(level == finding.Severity ? finding : finding with { Severity = level });
            }
        }

        return report with { Findings = findings };
    }
}

/// <summary>A set of diagnostic codes written the MSBuild way: separated by semicolons, commas or spaces.</summary>
public sealed class CodeList
{
    private readonly HashSet<string> codes;

    /// <summary>Reads the list; null or empty is no code.</summary>
    public CodeList(string? text) =>
        codes = new HashSet<string>(
            (text ?? string.Empty).Split([';', ',', ' ', '\t', '\r', '\n'], StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries),
            StringComparer.OrdinalIgnoreCase);

    /// <summary>No code.</summary>
    public static CodeList Empty { get; } = new(null);

    /// <summary>True when <paramref name="code"/> is listed (case-insensitive).</summary>
    public bool Contains(string code) => codes.Contains(code);
}
