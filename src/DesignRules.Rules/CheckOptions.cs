namespace DesignRules.Rules;

/// <summary>What a check run needs besides the design files.</summary>
/// <param name="RuleSetFile">The optional rule-set file (severities, thresholds, Monte Carlo settings).</param>
/// <param name="Today">The date waivers' expiry is judged against; passed in so that runs are reproducible.</param>
public sealed record CheckOptions(string? RuleSetFile, DateOnly Today)
{
    /// <summary>
    /// What the host searched for design files (folders and patterns), and where to point when nothing was found (the
    /// project file, or the folder given). When set and no design loads, the check reports DR940 there.
    /// </summary>
    public DesignSearch? Search { get; init; }
}

/// <summary>Where a host looked for design files.</summary>
/// <param name="Location">The file or folder a "no design found" finding points at.</param>
/// <param name="Description">The folders and patterns searched, in words.</param>
public sealed record DesignSearch(string Location, string Description);

/// <summary>One design checked, for progress lines: its file, id, open errors and warnings, and how long it took.</summary>
/// <param name="File">The design file.</param>
/// <param name="DesignId">The design's id.</param>
/// <param name="Errors">Findings at error level (before build-level changes) that no waiver covers.</param>
/// <param name="Warnings">Findings at warning level that no waiver covers.</param>
/// <param name="Elapsed">Time spent on this design.</param>
public sealed record DesignProgress(string File, string DesignId, int Errors, int Warnings, TimeSpan Elapsed);
