namespace DesignRules.Run;

/// <summary>How an MSBuild host logs one entry: error, warning or message.</summary>
internal enum BuildLogKind
{
    /// <summary>A build error.</summary>
    Error,

    /// <summary>A build warning.</summary>
    Warning,

    /// <summary>A build message of <see cref="BuildLogEntry.Importance"/>.</summary>
    Message,
}

/// <summary>The importance of a build message (MSBuild's <c>MessageImportance</c>, without depending on MSBuild here).</summary>
internal enum BuildLogImportance
{
    /// <summary>Shown at minimal verbosity.</summary>
    High,

    /// <summary>Shown at normal verbosity.</summary>
    Normal,

    /// <summary>Shown at detailed verbosity.</summary>
    Low,
}

/// <summary>
/// One line the MSBuild task logs, as a value: the run layer decides what the build shows, and the task (in the build
/// process) only hands each entry to MSBuild's logger. A plain record so that the evaluation server can send it over its
/// socket and the task logs exactly what it would have logged in-process.
/// </summary>
/// <param name="Kind">Error, warning or message.</param>
/// <param name="Message">The text.</param>
internal sealed record BuildLogEntry(BuildLogKind Kind, string Message)
{
    /// <summary>A message's importance.</summary>
    public BuildLogImportance Importance { get; init; } = BuildLogImportance.Normal;

    /// <summary>The diagnostic code (DRnnn), or null.</summary>
    public string? Code { get; init; }

    /// <summary>The help link of an error or warning, or null.</summary>
    public string? HelpLink { get; init; }

    /// <summary>The file the entry points at, or null.</summary>
    public string? File { get; init; }

    /// <summary>Line, 0 for none.</summary>
    public int Line { get; init; }

    /// <summary>Column, 0 for none.</summary>
    public int Column { get; init; }

    /// <summary>End line, 0 for none.</summary>
    public int EndLine { get; init; }

    /// <summary>End column, 0 for none.</summary>
    public int EndColumn { get; init; }

    /// <summary>
    /// True for progress lines logged while the run goes on (a design checked, still running): the server streams them at
    /// once; every other entry it sends with the run's end, so a run abandoned halfway never logs half its findings.
    /// </summary>
    public bool Progress { get; init; }
}

/// <summary>Where <see cref="BuildCheck"/> sends what the build shows (calls may come from worker threads, one at a time per entry).</summary>
internal interface IBuildLog
{
    /// <summary>Logs one entry.</summary>
    void Write(BuildLogEntry entry);
}

/// <summary>What a build check ended with: whether the build goes on, and the counts the task returns as outputs.</summary>
/// <param name="Success">False when an error was logged.</param>
/// <param name="ErrorCount">Findings logged as errors.</param>
/// <param name="WarningCount">Findings logged as warnings.</param>
internal sealed record BuildCheckResult(bool Success, int ErrorCount, int WarningCount);
