namespace DesignRules.Run;

/// <summary>
/// The MSBuild task's properties as plain values (what MSBuild passed, paths made full in the build's working folder),
/// plus what only the build engine knows (its project file, which codes <c>-warnaserror</c> promotes). One record so that
/// the task hands it to <see cref="BuildCheck"/> in-process or over the socket to the evaluation server alike.
/// </summary>
internal sealed record BuildCall
{
    /// <summary>Design and parts files (full paths).</summary>
    public List<string> Files { get; init; } = [];

    /// <summary><c>DesignRulesRoot</c>.</summary>
    public string? RepositoryRoot { get; init; }

    /// <summary><c>DesignRulesRuleSet</c>.</summary>
    public string? RuleSetFile { get; init; }

    /// <summary><c>DesignRulesSarifFile</c>.</summary>
    public string? SarifFile { get; init; }

    /// <summary><c>DesignRulesJsonFile</c>.</summary>
    public string? JsonFile { get; init; }

    /// <summary>The pages folder when pages are on.</summary>
    public string? PagesFolder { get; init; }

    /// <summary><c>DesignRulesTemplateFolder</c>.</summary>
    public string? TemplateFolder { get; init; }

    /// <summary><c>DesignRulesHelpUriBase</c>.</summary>
    public string? HelpUriBase { get; init; }

    /// <summary><c>DesignRulesHelpFolder</c>.</summary>
    public string? HelpFolder { get; init; }

    /// <summary>The stamp of the last clean check.</summary>
    public string? StampFile { get; init; }

    /// <summary>Where the list of loaded files goes.</summary>
    public string? LoadedFilesFile { get; init; }

    /// <summary>The project file (where DR940 points).</summary>
    public string? ProjectFile { get; init; }

    /// <summary>Where errors about the project's properties point (the engine's project file of the task node).</summary>
    public string? TaskProjectFile { get; init; }

    /// <summary>The folders and patterns searched, in words.</summary>
    public string? Searched { get; init; }

    /// <summary><c>DesignRulesToday</c>.</summary>
    public string? Today { get; init; }

    /// <summary><c>DesignRulesLevels</c>.</summary>
    public string? Levels { get; init; }

    /// <summary><c>TreatWarningsAsErrors</c>.</summary>
    public bool TreatWarningsAsErrors { get; init; }

    /// <summary><c>WarningsNotAsErrors</c>.</summary>
    public string? WarningsNotAsErrors { get; init; }

    /// <summary><c>NoWarn</c>.</summary>
    public string? NoWarn { get; init; }

    /// <summary><c>WarningsAsErrors</c>.</summary>
    public string? WarningsAsErrors { get; init; }

    /// <summary>
    /// The codes the build engine itself treats as errors (<c>-warnaserror</c>), asked of it in the build process for every
    /// DRnnn code; null when the engine cannot say.
    /// </summary>
    public List<string>? HostAsErrors { get; init; }

    /// <summary><c>DesignRulesReportRoot</c>.</summary>
    public string? ReportRoot { get; init; }

    /// <summary><c>DesignRulesEndPositions</c>.</summary>
    public bool EndPositions { get; init; } = true;

    /// <summary>The results cache folder.</summary>
    public string? CacheFolder { get; init; }

    /// <summary><c>DesignRulesBaseline</c>.</summary>
    public string? BaselineFile { get; init; }

    /// <summary><c>DesignRulesNewOnly</c>.</summary>
    public bool NewOnly { get; init; }

    /// <summary>The head start (<c>DesignRulesHeadStart</c>, during restore): only the results cache is filled.</summary>
    public bool HeadStart { get; init; }

    /// <summary>
    /// Of every code a DR diagnostic can have (DR000 to DR999), the ones <paramref name="treatsAsError"/> (the engine's
    /// <c>-warnaserror</c> verdict) makes errors. A plain loop: query iterators over <c>int</c> would be compiled just in
    /// time in the build's process on every build.
    /// </summary>
    public static List<string> CodesTreatedAsErrors(Func<string, bool> treatsAsError)
    {
        ArgumentNullException.ThrowIfNull(treatsAsError);
        var codes = new List<string>();
        for (var number = 0; number < 1000; number++)
        {
            var code = "DR" + number.ToString("000", System.Globalization.CultureInfo.InvariantCulture);
            if (treatsAsError(code))
            {
                codes.Add(code);
            }
        }

        return codes;
    }
}
