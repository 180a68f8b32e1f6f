using System.Globalization;
using DesignRules.Diagnostics;
using DesignRules.Pages;
using DesignRules.Reports;
using DesignRules.Rules;
using DesignRules.Run;
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
public sealed class CheckDesigns : Microsoft.Build.Utilities.Task
{
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
        try
        {
            if (Replay)
            {
                return ReplayLastCheck();
            }

            DeleteStamp();
            return Check();
        }
        catch (Exception ex) when (ex is not (OutOfMemoryException or StackOverflowException or AccessViolationException))
        {
            LogFault(RunText.Fault(ex), ex.ToString());
            DeleteStamp();
            return false;
        }
    }

    private bool Check()
    {
        var parse = RunRequest.FromBuild(new BuildInputs(Files.Select(f => f.GetMetadata("FullPath")).ToList())
        {
            RepositoryRoot = RepositoryRoot,
            RuleSetFile = RuleSetFile,
            SarifFile = SarifFile,
            JsonFile = JsonFile,
            PagesFolder = PagesFolder,
            TemplateFolder = TemplateFolder,
            HelpUriBase = HelpUriBase,
            Searched = Searched,
            ProjectFile = ProjectFile,
            Today = Today,
            Levels = Levels,
            ReportRoot = ReportRoot,
            Warnings = BuildWarnings(),
            CacheFolder = CacheFolder,
            BaselineFile = BaselineFile,
            NewOnly = NewOnly,
        });

        // Properties that cannot be used are the user's mistake: plain errors at the project, before the check runs.
        foreach (var problem in parse.Problems)
        {
            Log.LogError(null, null, null, BuildEngine?.ProjectFileOfTaskNode, 0, 0, 0, 0, problem.ForBuild);
        }

        if (parse.Request is not { } request)
        {
            return false;
        }

        var cost = TaskCost.Start();
        var outcome = DesignRun.Execute(request, new BuildProgress(Log, request.Root));
        // Where a build's time goes (detailed verbosity): the run, and how much of it the process spent compiling code
        // just in time, which the package's ReadyToRun images are there to avoid.
        Log.LogMessage(MessageImportance.Low, "DesignRules: " + cost.Stop(outcome.Timings));
        if (outcome.Fault is not null)
        {
            LogFault(outcome.Fault, outcome.FaultDetail);
            return false;
        }

        WriteLoadedFiles(outcome.Report.LoadedFiles);
        foreach (var problem in outcome.Problems)
        {
            Log.LogError(null, null, null, BuildEngine?.ProjectFileOfTaskNode, 0, 0, 0, 0, problem.ForBuild);
        }

        if (outcome.Pages is { } pages)
        {
            foreach (var template in pages.Diagnostics)
            {
                var span = template.Span;
                Log.LogError(null, template.Id, null, HelpFor(template.Id), span.File, span.Line, span.Column, EndLine(span), EndColumn(span), template.Message);
            }
        }

        if (outcome.PagesLine is { } pagesLine)
        {
            Log.LogMessage(MessageImportance.Normal, "DesignRules: " + pagesLine);
        }

        var noWarn = new CodeList(NoWarn);
        var notAsErrors = new CodeList(WarningsNotAsErrors);
        foreach (var finding in outcome.Report.Findings)
        {
            LogFinding(finding, noWarn, notAsErrors);
        }

        Log.LogMessage(MessageImportance.High, "DesignRules: " + outcome.Summary);
        if (outcome.BaselineLine is { } baselineLine)
        {
            Log.LogMessage(MessageImportance.High, "DesignRules: " + baselineLine);
        }

        if (Log.HasLoggedErrors)
        {
            return false;
        }

        // A check without errors is stamped together with what it showed, so that a skipped build replays its warnings.
        WriteStamp(outcome.Summary, outcome.Report.Findings);
        return true;
    }

    /// <summary>The wall time of a run and the just-in-time compilation the process did meanwhile (every thread).</summary>
    private readonly struct TaskCost
    {
        private readonly long started;
        private readonly TimeSpan jitTime;
        private readonly long jitMethods;

        private TaskCost(long started, TimeSpan jitTime, long jitMethods) => (this.started, this.jitTime, this.jitMethods) = (started, jitTime, jitMethods);

        public static TaskCost Start() =>
            new(System.Diagnostics.Stopwatch.GetTimestamp(), System.Runtime.JitInfo.GetCompilationTime(), System.Runtime.JitInfo.GetCompiledMethodCount());

        public string Stop(RunTimings phases) => string.Create(CultureInfo.InvariantCulture,
            $"run took {System.Diagnostics.Stopwatch.GetElapsedTime(started).TotalSeconds:0.00} s ({phases}); meanwhile this process compiled {System.Runtime.JitInfo.GetCompiledMethodCount() - jitMethods} method(s) just in time in {(System.Runtime.JitInfo.GetCompilationTime() - jitTime).TotalSeconds:0.00} s.");
    }

    /// <summary>Progress as build messages: one per design at normal verbosity, and a long run's "still checking" at every verbosity.</summary>
    private sealed class BuildProgress(TaskLoggingHelper log, string root) : IRunProgress
    {
        public void DesignChecked(DesignProgress progress) =>
            log.LogMessage(MessageImportance.Normal, "DesignRules: " + RunText.Progress(progress, root));

        public void StillRunning(int completed, int total, TimeSpan elapsed) =>
            log.LogMessage(MessageImportance.High, "DesignRules: " + RunText.StillRunning(completed, total, elapsed));
    }

    private bool ReplayLastCheck()
    {
        var stamp = string.IsNullOrWhiteSpace(StampFile) ? null : Path.GetFullPath(StampFile);
        if (stamp is null || !File.Exists(stamp) || !File.Exists(FindingsFile(stamp)))
        {
            return true;
        }

        var noWarn = new CodeList(NoWarn);
        var notAsErrors = new CodeList(WarningsNotAsErrors);
        foreach (var finding in StampedFindings.Read(FindingsFile(stamp)))
        {
            LogFinding(finding, noWarn, notAsErrors);
        }

        Log.LogMessage(MessageImportance.High,
            "DesignRules: no design, parts or rule-set file changed; evaluation skipped. Last check: " + File.ReadAllText(stamp).Trim());
        return !Log.HasLoggedErrors;
    }

    private static string FindingsFile(string stamp) => stamp + ".findings.json";

    private void LogFinding(Finding f, CodeList noWarn, CodeList notAsErrors)
    {
        // A file name can hold a newline too; the log line shows it escaped, like the message.
        var s = f.Span with { File = DiagnosticText.Escape(f.Span.File) };
        var help = HelpFor(f.RuleId);
        var (endLine, endColumn) = (EndLine(s), EndColumn(s));
        if (f.IsWaived)
        {
            Log.LogMessage(null, f.RuleId, null, s.File, s.Line, s.Column, endLine, endColumn, MessageImportance.Low,
                $"{f.Message} (waived: {f.Waiver})");
            return;
        }

        switch (f.Severity)
        {
            case Severity.Error:
                ErrorCount++;
                Log.LogError(null, f.RuleId, null, help, s.File, s.Line, s.Column, endLine, endColumn, f.Message);
                break;
            case Severity.Warning when noWarn.Contains(f.RuleId):
                Log.LogMessage(null, f.RuleId, null, s.File, s.Line, s.Column, endLine, endColumn, MessageImportance.Low, f.Message);
                break;
            case Severity.Warning when TreatWarningsAsErrors && !notAsErrors.Contains(f.RuleId):
                ErrorCount++;
                Log.LogError(null, f.RuleId, null, help, s.File, s.Line, s.Column, endLine, endColumn, f.Message);
                break;
            case Severity.Warning:
                // MSBuild turns this into an error itself under -warnaserror or WarningsAsErrors, and into a message under NoWarn.
                WarningCount++;
                Log.LogWarning(null, f.RuleId, null, help, s.File, s.Line, s.Column, endLine, endColumn, f.Message);
                break;
            default:
                Log.LogMessage(null, f.RuleId, null, s.File, s.Line, s.Column, endLine, endColumn, MessageImportance.Normal, f.Message);
                break;
        }
    }

    private void LogFault(string sentence, string? detail)
    {
        Log.LogError(null, InternalErrorCode, null, HelpFor(InternalErrorCode), BuildEngine?.ProjectFileOfTaskNode, 0, 0, 0, 0, sentence);
        if (detail is not null)
        {
            Log.LogMessage(MessageImportance.Low, detail);
        }
    }

    /// <summary>
    /// Where a diagnostic's help link points: the configured base; else the copy of the page in the pages folder (pages
    /// copy every help page they link to), a file of the repository rather than of a package cache; else the folder given.
    /// </summary>
    private string? EffectiveHelpBase() =>
        !string.IsNullOrWhiteSpace(HelpUriBase) ? HelpUriBase
        : !string.IsNullOrWhiteSpace(PagesFolder) ? HelpLinks.FolderUri(Path.Combine(Path.GetFullPath(PagesFolder), DatasheetPages.HelpFolder))
        : !string.IsNullOrWhiteSpace(HelpFolder) ? HelpLinks.FolderUri(HelpFolder)
        : null;

    private string? HelpFor(string ruleId) => HelpLinks.For(ruleId, EffectiveHelpBase());

    private WarningLevels BuildWarnings() =>
        new(TreatWarningsAsErrors, new CodeList(WarningsAsErrors), new CodeList(WarningsNotAsErrors), new CodeList(NoWarn))
        {
            HostTreatsAsError = BuildEngine is IBuildEngine8 engine ? engine.ShouldTreatWarningAsError : null,
        };

    private int EndLine(DesignRules.Diagnostics.SourceSpan span) => EndPositions ? span.EndLine : 0;

    private int EndColumn(DesignRules.Diagnostics.SourceSpan span) => EndPositions ? span.EndColumn : 0;

    private void DeleteStamp()
    {
        if (!string.IsNullOrWhiteSpace(StampFile))
        {
            foreach (var file in new[] { FindingsFile(Path.GetFullPath(StampFile)), Path.GetFullPath(StampFile) }.Where(File.Exists))
            {
                File.Delete(file);
            }
        }
    }

    private void WriteLoadedFiles(IReadOnlyList<string> loaded)
    {
        if (string.IsNullOrWhiteSpace(LoadedFilesFile))
        {
            return;
        }

        var full = Path.GetFullPath(LoadedFilesFile);
        var text = string.Concat(loaded.Select(f => f + "\n"));
        if (File.Exists(full) && File.ReadAllText(full) == text)
        {
            return;
        }

        Directory.CreateDirectory(Path.GetDirectoryName(full)!);
        File.WriteAllText(full, text);
    }

    private void WriteStamp(string summary, IEnumerable<Finding> findings)
    {
        if (string.IsNullOrWhiteSpace(StampFile))
        {
            return;
        }

        var full = Path.GetFullPath(StampFile);
        Directory.CreateDirectory(Path.GetDirectoryName(full)!);
        StampedFindings.Write(FindingsFile(full), findings);
        File.WriteAllText(full, summary + Environment.NewLine);
    }
}
