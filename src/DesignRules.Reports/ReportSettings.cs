namespace DesignRules.Reports;

/// <summary>What a report needs besides the findings: where the repository is, where help pages live, and who wrote it.</summary>
/// <param name="RepositoryRoot">The folder that file paths in the report are made relative to.</param>
/// <param name="HelpUriBase">The address that <c>DRnnn.md</c> is appended to for a rule's help page; null for none.</param>
/// <param name="ToolVersion">The version of the tool that ran the check.</param>
public sealed record ReportSettings(string RepositoryRoot, string? HelpUriBase, string ToolVersion)
{
    /// <summary>The uriBaseId under which file paths are reported relative to <see cref="RepositoryRoot"/>.</summary>
    public const string RootBaseId = "REPOROOT";

    /// <summary>The tool's name as reports state it.</summary>
    public const string ToolName = "DesignRules";

    /// <summary>
    /// The baseline report a run is compared with (<c>--baseline</c>, <c>DesignRulesBaseline</c>): when given, every SARIF
    /// result carries its <c>baselineState</c>. Null for none.
    /// </summary>
    public Comparison.ReportSnapshot? Baseline { get; init; }

    /// <summary>
    /// Where people learn about the tool (SARIF's <c>tool.driver.informationUri</c>): the help base when one is given,
    /// else the tool's own identifier, an absolute URI that names the tool and its version without pointing at a host
    /// (the project has no public address the tool could name on its own).
    /// </summary>
    public string InformationUri { get; init; } =
        Uri.TryCreate(HelpUriBase, UriKind.Absolute, out var help) ? help.AbsoluteUri : "urn:designrules:" + Uri.EscapeDataString(ToolVersion);
}
