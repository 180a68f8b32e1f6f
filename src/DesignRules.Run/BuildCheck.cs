using System.Globalization;
using DesignRules.Diagnostics;
using DesignRules.Pages;
using DesignRules.Reports;
using DesignRules.Rules;

namespace DesignRules.Run;

/// <summary>
/// What the MSBuild task does with one run, as log entries instead of calls on MSBuild's logger: the run, the stamp, the
/// loaded-files list, and every finding at the level the build's warning switches give it. The task calls it in the build
/// process, the evaluation server in its own; both log the same entries, so a served build and an in-process one show
/// and write the same things. Never throws for the tool's own failures: they become one DR990 error entry.
/// </summary>
internal static class BuildCheck
{
    /// <summary>Checks as <paramref name="call"/> says; <paramref name="hostAsError"/> is the engine's own <c>-warnaserror</c> verdict, or null.</summary>
    public static BuildCheckResult Execute(BuildCall call, IBuildLog log, Func<string, bool>? hostAsError)
    {
        ArgumentNullException.ThrowIfNull(call);
        ArgumentNullException.ThrowIfNull(log);
        var counting = new CountingLog(log);
        try
        {
            DeleteStamp(call.StampFile);
            Check(call, counting, hostAsError ?? HostAsError(call.HostAsErrors));
        }
        catch (Exception ex) when (ex is not (OutOfMemoryException or StackOverflowException or AccessViolationException))
        {
            LogFault(call, counting, RunText.Fault(ex), ex.ToString());
            DeleteStamp(call.StampFile);
        }

        return counting.Result;
    }

    /// <summary>Logs the last stamped check's findings again (an up-to-date build), without evaluating.</summary>
    public static BuildCheckResult Replay(BuildCall call, IBuildLog log)
    {
        ArgumentNullException.ThrowIfNull(call);
        var counting = new CountingLog(log);
        try
        {
            var stamp = string.IsNullOrWhiteSpace(call.StampFile) ? null : Path.GetFullPath(call.StampFile);
            if (stamp is null || !File.Exists(stamp) || !File.Exists(FindingsFile(stamp)))
            {
                return counting.Result;
            }

            var noWarn = new CodeList(call.NoWarn);
            var notAsErrors = new CodeList(call.WarningsNotAsErrors);
            var helpBase = HelpBase(call);
            foreach (var finding in StampedFindings.Read(FindingsFile(stamp)))
            {
                LogFinding(call, counting, finding, noWarn, notAsErrors, helpBase);
            }

            counting.Write(new BuildLogEntry(BuildLogKind.Message,
                "DesignRules: no design, parts or rule-set file changed; evaluation skipped. Last check: " + File.ReadAllText(stamp).Trim())
            { Importance = BuildLogImportance.High });
        }
        catch (Exception ex) when (ex is not (OutOfMemoryException or StackOverflowException or AccessViolationException))
        {
            LogFault(call, counting, RunText.Fault(ex), ex.ToString());
        }

        return counting.Result;
    }

    private static Func<string, bool>? HostAsError(List<string>? codes)
    {
        if (codes is null)
        {
            return null;
        }

        var set = codes.ToHashSet(StringComparer.OrdinalIgnoreCase);
        return set.Contains;
    }

    private static void Check(BuildCall call, CountingLog log, Func<string, bool>? hostAsError)
    {
        var parse = RunRequest.FromBuild(new BuildInputs(call.Files)
        {
            RepositoryRoot = call.RepositoryRoot,
            RuleSetFile = call.RuleSetFile,
            SarifFile = call.SarifFile,
            JsonFile = call.JsonFile,
            PagesFolder = call.PagesFolder,
            TemplateFolder = call.TemplateFolder,
            HelpUriBase = call.HelpUriBase,
            Searched = call.Searched,
            ProjectFile = call.ProjectFile,
            Today = call.Today,
            Levels = call.Levels,
            ReportRoot = call.ReportRoot,
            Warnings = new WarningLevels(call.TreatWarningsAsErrors, new CodeList(call.WarningsAsErrors), new CodeList(call.WarningsNotAsErrors),
                new CodeList(call.NoWarn))
            {
                HostTreatsAsError = hostAsError,
            },
            CacheFolder = call.CacheFolder,
            BaselineFile = call.BaselineFile,
            NewOnly = call.NewOnly,
            HeadStart = call.HeadStart,
        });

        // Properties that cannot be used are the user's mistake: plain errors at the project, before the check runs.
        foreach (var problem in parse.Problems)
        {
            log.Write(new BuildLogEntry(BuildLogKind.Error, problem.ForBuild) { File = call.TaskProjectFile });
        }

        if (parse.Request is not { } request)
        {
            return;
        }

        var cost = RunCost.Start();
        var outcome = DesignRun.Execute(request, new Progress(log, request.Root));
        // Where a build's time goes (detailed verbosity): the run, and how much of it the process spent compiling code
        // just in time, which the package's ReadyToRun images (and the warm evaluation server) are there to avoid.
        log.Write(new BuildLogEntry(BuildLogKind.Message, "DesignRules: " + cost.Stop(outcome.Timings)
            + (outcome.TookHeadStartCheck ? $" The head start's check of the same files was taken ({outcome.HeadStartAccount})." : string.Empty)) { Importance = BuildLogImportance.Low });
        if (outcome.Fault is not null)
        {
            LogFault(call, log, outcome.Fault, outcome.FaultDetail);
            return;
        }

        WriteLoadedFiles(call.LoadedFilesFile, outcome.Report.LoadedFiles, call.Files);
        foreach (var problem in outcome.Problems)
        {
            log.Write(new BuildLogEntry(BuildLogKind.Error, problem.ForBuild) { File = call.TaskProjectFile });
        }

        if (outcome.Pages is { } pages)
        {
            foreach (var template in pages.Diagnostics)
            {
                var span = template.Span;
                log.Write(new BuildLogEntry(BuildLogKind.Error, template.Message)
                {
                    Code = template.Id,
                    HelpLink = HelpFor(call, template.Id),
                    File = span.File,
                    Line = span.Line,
                    Column = span.Column,
                    EndLine = call.EndPositions ? span.EndLine : 0,
                    EndColumn = call.EndPositions ? span.EndColumn : 0,
                });
            }
        }

        if (outcome.PagesLine is { } pagesLine)
        {
            log.Write(new BuildLogEntry(BuildLogKind.Message, "DesignRules: " + pagesLine));
        }

        var noWarn = new CodeList(call.NoWarn);
        var notAsErrors = new CodeList(call.WarningsNotAsErrors);
        var helpBase = HelpBase(call);
        foreach (var finding in outcome.Report.Findings)
        {
            LogFinding(call, log, finding, noWarn, notAsErrors, helpBase);
        }

        log.Write(new BuildLogEntry(BuildLogKind.Message, "DesignRules: " + outcome.Summary) { Importance = BuildLogImportance.High });
        if (outcome.BaselineLine is { } baselineLine)
        {
            log.Write(new BuildLogEntry(BuildLogKind.Message, "DesignRules: " + baselineLine) { Importance = BuildLogImportance.High });
        }

        if (log.HasErrors)
        {
            return;
        }

        // A check without errors is stamped together with what it showed, so that a skipped build replays its warnings.
        WriteStamp(call.StampFile, outcome.Summary, outcome.Report.Findings);
    }

    private static void LogFinding(BuildCall call, CountingLog log, Finding f, CodeList noWarn, CodeList notAsErrors, string? helpBase)
    {
        // A file name can hold a newline too; the log line shows it escaped, like the message.
        var s = f.Span with { File = DiagnosticText.Escape(f.Span.File) };
        var entry = new BuildLogEntry(BuildLogKind.Message, f.Message)
        {
            Code = f.RuleId,
            File = s.File,
            Line = s.Line,
            Column = s.Column,
            EndLine = call.EndPositions ? s.EndLine : 0,
            EndColumn = call.EndPositions ? s.EndColumn : 0,
        };
        var help = HelpLinks.For(f.RuleId, helpBase);
        if (f.IsWaived)
        {
            log.Write(entry with { Message = $"{f.Message} (waived: {f.Waiver})", Importance = BuildLogImportance.Low });
            return;
        }

        switch (f.Severity)
        {
            case Severity.Error:
                log.Write(entry with { Kind = BuildLogKind.Error, HelpLink = help }, counted: true);
                break;
            case Severity.Warning when noWarn.Contains(f.RuleId):
                log.Write(entry with { Importance = BuildLogImportance.Low });
                break;
            case Severity.Warning when call.TreatWarningsAsErrors && !notAsErrors.Contains(f.RuleId):
                log.Write(entry with { Kind = BuildLogKind.Error, HelpLink = help }, counted: true);
                break;
            case Severity.Warning:
                // MSBuild turns this into an error itself under -warnaserror or WarningsAsErrors, and into a message under NoWarn.
                log.Write(entry with { Kind = BuildLogKind.Warning, HelpLink = help }, counted: true);
                break;
            default:
                log.Write(entry);
                break;
        }
    }

    private static void LogFault(BuildCall call, CountingLog log, string sentence, string? detail)
    {
        log.Write(new BuildLogEntry(BuildLogKind.Error, sentence) { Code = RunText.FaultId, HelpLink = HelpFor(call, RunText.FaultId), File = call.TaskProjectFile });
        if (detail is not null)
        {
            log.Write(new BuildLogEntry(BuildLogKind.Message, detail) { Importance = BuildLogImportance.Low });
        }
    }

    /// <summary>
    /// Where a diagnostic's help link points: the configured base; else the copy of the page in the pages folder (pages
    /// copy every help page they link to), a file of the repository rather than of a package cache; else the folder given.
    /// </summary>
    private static string? HelpFor(BuildCall call, string ruleId) => HelpLinks.For(ruleId, HelpBase(call));

    /// <summary>
    /// The base of every help link of one call, made once per call rather than once per finding: a folder's base is a full
    /// path turned into a <c>file://</c> address, which would otherwise be made again for each of hundreds of findings.
    /// </summary>
    private static string? HelpBase(BuildCall call) =>
        !string.IsNullOrWhiteSpace(call.HelpUriBase) ? call.HelpUriBase
            : !string.IsNullOrWhiteSpace(call.PagesFolder) ? HelpLinks.FolderUri(Path.Combine(Path.GetFullPath(call.PagesFolder), DatasheetPages.HelpFolder))
            : !string.IsNullOrWhiteSpace(call.HelpFolder) ? HelpLinks.FolderUri(call.HelpFolder)
            : null;

    private static string FindingsFile(string stamp) => stamp + ".findings.json";

    private static void DeleteStamp(string? stampFile)
    {
        if (!string.IsNullOrWhiteSpace(stampFile))
        {
            foreach (var file in new[] { FindingsFile(Path.GetFullPath(stampFile)), Path.GetFullPath(stampFile) }.Where(File.Exists))
            {
                File.Delete(file);
            }
        }
    }

    /// <summary>
    /// Lists the loaded files that are not among the files the build handed over (<paramref name="given"/>: the design and
    /// parts items, which are inputs of the check target in any case): the rule-set file and parts files named under
    /// <c>libraries:</c> outside the items. Listing the given files again would only make every build read, item and
    /// de-duplicate a second copy of the whole repository's file list (twice: the head start during restore, and the check).
    /// </summary>
    private static void WriteLoadedFiles(string? loadedFilesFile, IReadOnlyList<string> loaded, IReadOnlyCollection<string> given)
    {
        if (string.IsNullOrWhiteSpace(loadedFilesFile))
        {
            return;
        }

        var full = Path.GetFullPath(loadedFilesFile);
        var items = given.ToHashSet(StringComparer.Ordinal);
        var text = string.Concat(loaded.Where(f => !items.Contains(f)).Select(f => f + "\n"));
        if (File.Exists(full) && File.ReadAllText(full) == text)
        {
            return;
        }

        Directory.CreateDirectory(Path.GetDirectoryName(full)!);
        File.WriteAllText(full, text);
    }

    private static void WriteStamp(string? stampFile, string summary, IEnumerable<Finding> findings)
    {
        if (string.IsNullOrWhiteSpace(stampFile))
        {
            return;
        }

        var full = Path.GetFullPath(stampFile);
        Directory.CreateDirectory(Path.GetDirectoryName(full)!);
        StampedFindings.Write(FindingsFile(full), findings);
        File.WriteAllText(full, summary + Environment.NewLine);
    }

    /// <summary>Passes entries on and counts errors and warnings (the task's outputs; any error fails the build).</summary>
    private sealed class CountingLog(IBuildLog inner) : IBuildLog
    {
        private int errors;
        private int warnings;
        private int countedErrors;

        public bool HasErrors => Volatile.Read(ref errors) > 0;

        public BuildCheckResult Result => new(!HasErrors, countedErrors, warnings);

        public void Write(BuildLogEntry entry) => Write(entry, counted: false);

        public void Write(BuildLogEntry entry, bool counted)
        {
            if (entry.Kind == BuildLogKind.Error)
            {
                Interlocked.Increment(ref errors);
                if (counted)
                {
                    countedErrors++;
                }
            }
            else if (entry.Kind == BuildLogKind.Warning && counted)
            {
                warnings++;
            }

            inner.Write(entry);
        }
    }

    /// <summary>Progress as build messages: one per design at normal verbosity, and a long run's "still checking" at every verbosity.</summary>
    private sealed class Progress(IBuildLog log, string root) : IRunProgress
    {
        public void DesignChecked(DesignProgress progress) =>
            log.Write(new BuildLogEntry(BuildLogKind.Message, "DesignRules: " + RunText.Progress(progress, root)) { Progress = true });

        public void StillRunning(int completed, int total, TimeSpan elapsed) =>
            log.Write(new BuildLogEntry(BuildLogKind.Message, "DesignRules: " + RunText.StillRunning(completed, total, elapsed))
            { Importance = BuildLogImportance.High, Progress = true });
    }

    /// <summary>The wall time of a run and the just-in-time compilation the process did meanwhile (every thread).</summary>
    private readonly struct RunCost
    {
        private readonly long started;
        private readonly TimeSpan jitTime;
        private readonly long jitMethods;

        private RunCost(long started, TimeSpan jitTime, long jitMethods) => (this.started, this.jitTime, this.jitMethods) = (started, jitTime, jitMethods);

        public static RunCost Start() =>
            new(System.Diagnostics.Stopwatch.GetTimestamp(), System.Runtime.JitInfo.GetCompilationTime(), System.Runtime.JitInfo.GetCompiledMethodCount());

        public string Stop(RunTimings phases) => string.Create(CultureInfo.InvariantCulture,
            $"run took {System.Diagnostics.Stopwatch.GetElapsedTime(started).TotalSeconds:0.00} s ({phases}); meanwhile this process compiled {System.Runtime.JitInfo.GetCompiledMethodCount() - jitMethods} method(s) just in time in {(System.Runtime.JitInfo.GetCompilationTime() - jitTime).TotalSeconds:0.00} s.");
    }
}
