namespace DesignRules.Pages;

/// <summary>Where pages go and where a repository's own templates are.</summary>
/// <param name="OutputFolder">The one folder pages and plots are written to (created when missing).</param>
/// <param name="TemplateFolder">A folder of the repository's own templates; each replaces the built-in of the same name. Null for none.</param>
/// <param name="RepositoryRoot">The repository root, to show design files by their path relative to it. Null to show them as given.</param>
public sealed record PageOptions(string OutputFolder, string? TemplateFolder = null, string? RepositoryRoot = null)
{
    /// <summary>
    /// The address rule help links start with (<c>DRnnn.md</c> is appended); null links to copies of the help pages
    /// that the run writes into the pages folder's <c>rules/</c>, so every link resolves beside the pages.
    /// </summary>
    public string? HelpUriBase { get; init; }

    /// <summary>Keys that let unchanged designs keep their pages and plots instead of rendering them again; null renders every page.</summary>
    public PageReuse? Reuse { get; init; }

    /// <summary>How many designs' pages are rendered at once; null for one per core (the files are written in one order either way).</summary>
    public int? MaxParallelDesigns { get; init; }
}

/// <summary>What a page run did.</summary>
/// <param name="Written">Files written (or kept unchanged, see <see cref="PageResult.Kept"/>), relative to the output folder, sorted.</param>
/// <param name="Removed">Stale files of an earlier run removed, relative to the output folder.</param>
/// <param name="Diagnostics">Template and output problems, located.</param>
public sealed record PageResult(IReadOnlyList<string> Written, IReadOnlyList<string> Removed, IReadOnlyList<DesignRules.Diagnostics.Diagnostic> Diagnostics)
{
    /// <summary>The files among <see cref="Written"/> that were kept as they were (their design did not change), not written again.</summary>
    public IReadOnlyList<string> Kept { get; init; } = [];
}
