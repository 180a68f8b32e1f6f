using System.Globalization;
using DesignRules.Run;
using DesignRules.Run.Serving;
using Microsoft.Build.Framework;
using Microsoft.Build.Utilities;

namespace DesignRules.Build;

/// <summary>
/// The MSBuild task: checks the design and parts files of a hardware repository through the run layer (<see cref="DesignRun"/>)
/// and logs every finding as an error, warning or message with its code, file, line, column, end position and help link.
/// MSBuild applies <c>-warnaserror</c>, <c>WarningsAsErrors</c> and <c>NoWarn</c> to the DR codes itself; this task
/// applies <c>TreatWarningsAsErrors</c> (which MSBuild leaves to compilers), honouring <c>WarningsNotAsErrors</c> and
/// <c>NoWarn</c>. Any internal failure becomes one <c>DR990</c> error, never an unhandled exception.
/// </summary>
public sealed class CheckDesigns : Microsoft.Build.Utilities.Task, ICancelableTask
{
    // Cancel() arrives on another thread while Execute runs; it cancels the run's token (which closes the server connection).
    private volatile Action? cancelRun;

    /// <summary>The code of the one error an internal failure of the tool becomes.</summary>
    public static string InternalErrorCode => RunText.FaultId;

    /// <summary>Design and parts files (any order; duplicates are dropped).</summary>
    public ITaskItem[] Files { get; set; } = [];

    /// <summary>The repository root: report paths are relative to it. Defaults to the project folder.</summary>
    public string? RepositoryRoot { get; set; }

    /// <summary>The rule-set file, or empty for none.</summary>
    public string? RuleSetFile { get; set; }

    /// <summary>Where to write the SARIF 2.1.0 report, or empty for none.</summary>
    public string? SarifFile { get; set; }

    /// <summary>Where to write the JSON report, or empty for none.</summary>
    public string? JsonFile { get; set; }

    /// <summary>The folder the datasheet pages are written to, or empty for no pages.</summary>
    public string? PagesFolder { get; set; }

    /// <summary>A folder of the repository's own page templates, or empty for the built-in ones.</summary>
    public string? TemplateFolder { get; set; }

    /// <summary>The address that <c>DRnnn.md</c> is appended to for help links; wins over <see cref="HelpFolder"/>.</summary>
    public string? HelpUriBase { get; set; }

    /// <summary>A local folder of help pages, linked as <c>file://</c> addresses when <see cref="HelpUriBase"/> is empty.</summary>
    public string? HelpFolder { get; set; }

    /// <summary>
    /// The file written only after a check with no error and no warning, for incremental builds; deleted at the start of
    /// every check, so a failed check (or one with warnings) is never skipped next time.
    /// </summary>
    public string? StampFile { get; set; }

    /// <summary>
    /// True when the inputs are unchanged since the last stamped check: instead of evaluating, the task logs that
    /// check's warnings, notes and waived findings again from the file beside the stamp, so that a skipped build still
    /// shows them (and <c>-warnaserror</c> still sees them).
    /// </summary>
    public bool Replay { get; set; }

    /// <summary>
    /// Where to list every file the check loaded (design, parts — also those named under <c>libraries:</c> outside the
    /// items — and the rule-set file), one full path a line, so that the next build takes them all as inputs. Rewritten
    /// only when the list changes.
    /// </summary>
    public string? LoadedFilesFile { get; set; }

    /// <summary>The project file that runs the check: where a "no design found" error (DR940) points.</summary>
    public string? ProjectFile { get; set; }

    /// <summary>In words, the folders and patterns the design files were searched with (for DR940 when none is found).</summary>
    public string? Searched { get; set; }

    /// <summary>The date waiver expiry is judged against (yyyy-MM-dd); today when empty.</summary>
    public string? Today { get; set; }

    /// <summary>Build-level level changes, <c>DR906=warning;DR702=off</c>, applied after the rule-set file.</summary>
    public string? Levels { get; set; }

    /// <summary>The project's <c>TreatWarningsAsErrors</c>: DR warnings become errors unless listed in <see cref="WarningsNotAsErrors"/>.</summary>
    public bool TreatWarningsAsErrors { get; set; }

    /// <summary>The project's <c>WarningsNotAsErrors</c>.</summary>
    public string? WarningsNotAsErrors { get; set; }

    /// <summary>The project's <c>NoWarn</c>: listed DR warnings are logged as low-importance messages.</summary>
    public string? NoWarn { get; set; }

    /// <summary>The project's <c>WarningsAsErrors</c> (MSBuild promotes these itself; reports need to know too).</summary>
    public string? WarningsAsErrors { get; set; }

    /// <summary>
    /// The folder SARIF and JSON paths are relative to: empty for the nearest folder at or above
    /// <see cref="RepositoryRoot"/> that holds <c>.git</c> (else <see cref="RepositoryRoot"/> itself), so that code
    /// scanning finds the files however deep the project sits in the repository.
    /// </summary>
    public string? ReportRoot { get; set; }

    /// <summary>False writes locations as <c>file(line,col)</c>, without the end position, for problem matchers that read only that form.</summary>
    public bool EndPositions { get; set; } = true;

    /// <summary>Findings logged as errors (after warnings treated as errors).</summary>
    [Output]
    public int ErrorCount { get; private set; }

    /// <summary>Findings logged as warnings.</summary>
    [Output]
    public int WarningCount { get; private set; }

    /// <summary>
    /// The per-design results cache (<c>obj/…/designrules/cache</c>): only designs whose files, parts, rule-set sections or
    /// tool changed are evaluated again, and only their pages rendered again. Empty for none.
    /// </summary>
    public string? CacheFolder { get; set; }

    /// <summary>
    /// <c>DesignRulesBaseline</c>: a JSON report of an earlier run (the base branch's); every SARIF result then carries its
    /// <c>baselineState</c>. Empty for none.
    /// </summary>
    public string? BaselineFile { get; set; }

    /// <summary><c>DesignRulesNewOnly</c>: fail only on findings new against <see cref="BaselineFile"/>.</summary>
    public bool NewOnly { get; set; }

    /// <summary>
    /// <c>DesignRulesServer</c>: true hands the run to the warm evaluation server of this task folder (started on first use,
    /// exits after <see cref="ServerIdleSeconds"/> without a run); false runs it in the build process.
    /// </summary>
    public bool Server { get; set; }

    /// <summary><c>DesignRulesServerIdleSeconds</c>: how long a server this task starts waits for runs before it exits.</summary>
    public double ServerIdleSeconds { get; set; } = ServerSettings.DefaultIdleSeconds;

    /// <summary>
    /// A head start (<c>DesignRulesHeadStart</c>, while the build restores): hand the check of the designs to the
    /// evaluation server and return at once, without waiting, logging findings or writing any output but the server's
    /// results cache. The build's own check later finds the results there, or waits in the server for a design still under
    /// way, so the edited design is evaluated while MSBuild restores and evaluates the project. Never fails the build: when
    /// the server is off or cannot be reached nothing happens, and the build's check runs as always.
    /// </summary>
    public bool HeadStart { get; set; }

    /// <summary>Tells servers of one task folder apart (tests of "another tool identity"); empty normally.</summary>
    public string? ServerSalt { get; set; }

    /// <summary>The servers' socket folder (tests); null for the per-user default.</summary>
    internal string? ServerSocketFolder { get; set; }

    /// <inheritdoc />
    public override bool Execute()
    {
        // The task runs inside the build process, whose culture is the user's (a comma-decimal locale, say), while every
        // output must be the same bytes on every machine: run the check in the invariant culture and restore it after.
        var culture = CultureInfo.CurrentCulture;
        var uiCulture = CultureInfo.CurrentUICulture;
        CultureInfo.CurrentCulture = CultureInfo.InvariantCulture;
        CultureInfo.CurrentUICulture = CultureInfo.InvariantCulture;
        try
        {
            return ExecuteInvariant();
        }
        finally
        {
            CultureInfo.CurrentCulture = culture;
            CultureInfo.CurrentUICulture = uiCulture;
        }
    }

    private bool ExecuteInvariant()
    {
        var started = TaskStart.Now();
        var log = new TaskLog(Log);
        using var cancellation = new CancellationTokenSource();
        cancelRun = cancellation.Cancel;
        try
        {
            var call = Call();
            if (HeadStart)
            {
                HandOver(call, started, cancellation.Token);
                return true;
            }

            var result = Replay ? BuildCheck.Replay(call, log) : RunServedOrInProcess(call, log, started, cancellation.Token);
            ErrorCount = result.ErrorCount;
            WarningCount = result.WarningCount;
            return result.Success && !Log.HasLoggedErrors;
        }
        catch (OperationCanceledException) when (cancellation.IsCancellationRequested)
        {
            // The build was cancelled while the server ran the check: the server abandons the run, the build stops.
            Log.LogMessage(MessageImportance.Low, "DesignRules: the build was cancelled; the evaluation server abandons the run.");
            return false;
        }
        catch (Exception ex) when (ex is not (OutOfMemoryException or StackOverflowException or AccessViolationException))
        {
            // Only the task's own plumbing can get here (the run layer turns its failures into a DR990 entry itself).
            Log.LogError(null, InternalErrorCode, null, null, BuildEngine?.ProjectFileOfTaskNode, 0, 0, 0, 0, RunText.Fault(ex));
            Log.LogMessage(MessageImportance.Low, ex.ToString());
            return false;
        }
        finally
        {
            cancelRun = null;
        }
    }

    /// <inheritdoc />
    public void Cancel()
    {
        try
        {
            cancelRun?.Invoke();
        }
        catch (ObjectDisposedException)
        {
            // The run ended meanwhile: nothing left to cancel.
        }
    }

    /// <summary>
    /// Hands the run to the warm evaluation server of this task folder when <see cref="Server"/> is on, else (and whenever
    /// the server cannot serve) runs it here. Both run <see cref="BuildCheck"/>, so the outputs and the log are the same.
    /// </summary>
    private BuildCheckResult RunServedOrInProcess(BuildCall call, TaskLog log, TaskStart started, CancellationToken cancellation)
    {
        var hostAsError = BuildEngine is IBuildEngine8 engine ? engine.ShouldTreatWarningAsError : (Func<string, bool>?)null;
        if (Server && Served(call, hostAsError) is { } served)
        {
            var result = ServerClient.TryRun(served, log, new ServerOptions(TaskFolder, ServerIdleSeconds, Blank(ServerSalt), ServerSocketFolder), started,
                handOverOnly: false, cancellation, out var whyNot);
            if (result is not null)
            {
                return result;
            }

            Log.LogMessage(MessageImportance.Low, $"DesignRules: checking in the build process: {whyNot}.");
        }

        return BuildCheck.Execute(call, log, hostAsError);
    }

    /// <summary>
    /// The head start: only the results cache is the server's to write (no reports, pages, stamp or loaded-files list), and
    /// the level and warning switches do not matter to the cache, so they are not asked of the engine.
    /// </summary>
    private void HandOver(BuildCall call, TaskStart started, CancellationToken cancellation)
    {
        // The head start target runs at two steps of a restore (the entry project's first and each project's own) in two
        // instances of the same project; the second hand-over of one restore would only make the server hash every file
        // again while it evaluates.
        if (BuildEngine is IBuildEngine4 engine)
        {
            var key = "DesignRules.HeadStart|" + ProjectFile + "|" + CacheFolder;
            if (engine.GetRegisteredTaskObject(key, RegisteredTaskObjectLifetime.Build) is not null)
            {
                Log.LogMessage(MessageImportance.Low, "DesignRules: head start: handed over earlier in this restore.");
                return;
            }

            engine.RegisterTaskObject(key, new object(), RegisteredTaskObjectLifetime.Build, allowEarlyCollection: false);
        }

        var why = !Server ? "the evaluation server is off (DesignRulesServer=false)"
            : string.IsNullOrWhiteSpace(CacheFolder) ? "the results cache is off (DesignRulesCache=false)"
            : null;
        if (why is null && Served(call, hostAsError: null) is { } served)
        {
            var headStart = served with
            {
                SarifFile = null, JsonFile = null, PagesFolder = null, StampFile = null, LoadedFilesFile = null, BaselineFile = null, NewOnly = false, HeadStart = true,
            };
            var handed = ServerClient.TryRun(headStart, new TaskLog(Log), new ServerOptions(TaskFolder, ServerIdleSeconds, Blank(ServerSalt), ServerSocketFolder), started,
                handOverOnly: true, cancellation, out why);
            if (handed is not null)
            {
                Log.LogMessage(MessageImportance.Low, "DesignRules: head start: the evaluation server checks the designs while the build goes on.");
                return;
            }
        }

        Log.LogMessage(MessageImportance.Low, $"DesignRules: no head start: {why ?? "a path cannot be made full"}.");
    }

    /// <summary>
    /// The call as the server needs it: every path made full here (the server's working folder is not the build's), and
    /// the engine's <c>-warnaserror</c> verdict asked for every DR code (the server cannot call back into the engine).
    /// Null when a path cannot be made full; the run then goes in-process, where the run layer reports it.
    /// </summary>
    private static BuildCall? Served(BuildCall call, Func<string, bool>? hostAsError)
    {
        try
        {
            return call with
            {
                RepositoryRoot = Full(call.RepositoryRoot) ?? Directory.GetCurrentDirectory(),
                RuleSetFile = Full(call.RuleSetFile),
                SarifFile = Full(call.SarifFile),
                JsonFile = Full(call.JsonFile),
                PagesFolder = Full(call.PagesFolder),
                TemplateFolder = Full(call.TemplateFolder),
                HelpFolder = Full(call.HelpFolder),
                StampFile = Full(call.StampFile),
                LoadedFilesFile = Full(call.LoadedFilesFile),
                ProjectFile = Full(call.ProjectFile),
                ReportRoot = Full(call.ReportRoot),
                CacheFolder = Full(call.CacheFolder),
                BaselineFile = Full(call.BaselineFile),
                HostAsErrors = hostAsError is null ? null : BuildCall.CodesTreatedAsErrors(hostAsError),
            };
        }
        catch (Exception ex) when (ex is ArgumentException or NotSupportedException or PathTooLongException)
        {
            return null;
        }

        static string? Full(string? path) => Blank(path) is { } given ? Path.GetFullPath(given) : null;
    }

    private BuildCall Call() => new()
    {
        Files = [.. Files.Select(f => f.GetMetadata("FullPath"))],
        RepositoryRoot = RepositoryRoot,
        RuleSetFile = RuleSetFile,
        SarifFile = SarifFile,
        JsonFile = JsonFile,
        PagesFolder = PagesFolder,
        TemplateFolder = TemplateFolder,
        HelpUriBase = HelpUriBase,
        HelpFolder = HelpFolder,
        StampFile = StampFile,
        LoadedFilesFile = LoadedFilesFile,
        ProjectFile = ProjectFile,
        TaskProjectFile = BuildEngine?.ProjectFileOfTaskNode,
        Searched = Searched,
        Today = Today,
        Levels = Levels,
        TreatWarningsAsErrors = TreatWarningsAsErrors,
        WarningsNotAsErrors = WarningsNotAsErrors,
        NoWarn = NoWarn,
        WarningsAsErrors = WarningsAsErrors,
        ReportRoot = ReportRoot,
        EndPositions = EndPositions,
        CacheFolder = CacheFolder,
        BaselineFile = BaselineFile,
        NewOnly = NewOnly,
    };

    private static string? Blank(string? text) => string.IsNullOrWhiteSpace(text) ? null : text;

    /// <summary>The folder of the task assembly, where the server's assembly lies beside it.</summary>
    internal static string TaskFolder => Path.GetDirectoryName(typeof(CheckDesigns).Assembly.Location) ?? AppContext.BaseDirectory;

    /// <summary>Hands each entry the run layer logs to MSBuild's logger (entries may come from worker threads).</summary>
    private sealed class TaskLog(TaskLoggingHelper log) : IBuildLog
    {
        public void Write(BuildLogEntry entry)
        {
            switch (entry.Kind)
            {
                case BuildLogKind.Error:
                    log.LogError(null, entry.Code, null, entry.HelpLink, entry.File, entry.Line, entry.Column, entry.EndLine, entry.EndColumn, entry.Message);
                    break;
                case BuildLogKind.Warning:
                    log.LogWarning(null, entry.Code, null, entry.HelpLink, entry.File, entry.Line, entry.Column, entry.EndLine, entry.EndColumn, entry.Message);
                    break;
                case BuildLogKind.Message when entry.Code is null && entry.File is null:
                    log.LogMessage(Importance(entry.Importance), entry.Message);
                    break;
                default:
                    log.LogMessage(null, entry.Code, null, entry.File, entry.Line, entry.Column, entry.EndLine, entry.EndColumn, Importance(entry.Importance), entry.Message);
                    break;
            }
        }

        private static MessageImportance Importance(BuildLogImportance importance) => importance switch
        {
            BuildLogImportance.High => MessageImportance.High,
            BuildLogImportance.Low => MessageImportance.Low,
            _ => MessageImportance.Normal,
        };
    }
}
