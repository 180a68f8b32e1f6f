using DesignRules.Model;

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

    /// <summary>
    /// Results of earlier checks (the run layer's cache): asked for each design before it is evaluated, and told each
    /// result once its check has completed. Null evaluates every design.
    /// </summary>
    public IDesignResultStore? Results { get; init; }

    /// <summary>Told how many designs loaded, before any is evaluated (for hosts that show how far a long run has come).</summary>
    public Action<int>? DesignsLoaded { get; init; }

    /// <summary>
    /// The most threads each parallel loop of the check uses: the designs side by side, and the runs inside each design
    /// (band ends, tolerance corners, samples), so 1 runs the whole check on one thread; null for one per core. The
    /// findings do not depend on it (every parallel run writes its own slot).
    /// </summary>
    public int? MaxDegreeOfParallelism { get; init; }
}

/// <summary>
/// Where a check finds the results of earlier checks. An implementation must return a result only when it was computed
/// from exactly this design (its file and every parts file it uses), rule set and date, by this very tool: a result
/// replayed from stale inputs would pass a design that fails. Called from several threads at once.
/// </summary>
public interface IDesignResultStore
{
    /// <summary>The result of an earlier completed check of exactly this design under these settings, or null.</summary>
    DesignResult? Find(Design design, RuleSet ruleSet, DateOnly today);

    /// <summary>Keeps the result of a check of <paramref name="design"/> that has just completed.</summary>
    void Keep(Design design, RuleSet ruleSet, DateOnly today, DesignResult result);
}

/// <summary>What the check of one design yields: its findings (after waivers) and its summary (figures, plots, verdicts).</summary>
/// <param name="Findings">The design's findings, before any host-level change of levels.</param>
/// <param name="Summary">Its figures, plots, yields and requirement verdicts.</param>
public sealed record DesignResult(IReadOnlyList<Finding> Findings, DesignSummary Summary)
{
    /// <summary>
    /// True when the store holds this result because another run evaluated the design just now (a build's head start,
    /// which the run waited for), not because nothing it depends on changed since an earlier check.
    /// </summary>
    public bool JustEvaluated { get; init; }
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
public sealed record DesignProgress(string File, string DesignId, int Errors, int Warnings, TimeSpan Elapsed)
{
    /// <summary>True when the result came from an earlier check (nothing it depends on changed), not from evaluation.</summary>
    public bool FromStore { get; init; }

    /// <summary>True when the result came from the store because another run evaluated the design just now (<see cref="DesignResult.JustEvaluated"/>).</summary>
    public bool JustEvaluated { get; init; }

    /// <summary>How many designs of the run have finished, this one included.</summary>
    public int Completed { get; init; }

    /// <summary>How many designs the run checks.</summary>
    public int Total { get; init; }
}
