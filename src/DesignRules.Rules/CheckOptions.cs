namespace DesignRules.Rules;

/// <summary>What a check run needs besides the design files.</summary>
/// <param name="RuleSetFile">The optional rule-set file (severities, thresholds, Monte Carlo settings).</param>
/// <param name="Today">The date waivers' expiry is judged against; passed in so that runs are reproducible.</param>
public sealed record CheckOptions(string? RuleSetFile, DateOnly Today);

/// <summary>One design checked, for progress lines: its file, id, open errors and warnings, and how long it took.</summary>
/// <param name="File">The design file.</param>
/// <param name="DesignId">The design's id.</param>
/// <param name="Errors">Findings at error level (before build-level changes) that no waiver covers.</param>
/// <param name="Warnings">Findings at warning level that no waiver covers.</param>
/// <param name="Elapsed">Time spent on this design.</param>
public sealed record DesignProgress(string File, string DesignId, int Errors, int Warnings, TimeSpan Elapsed);
