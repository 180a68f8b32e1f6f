using System.Globalization;
using DesignRules.Pages;
using DesignRules.Reports;
using DesignRules.Reports.Comparison;
using DesignRules.Rules;

namespace DesignRules.Run;

/// <summary>
/// The one run both hosts make: check (reusing the cached results of designs whose inputs did not change), apply the
/// level changes, write SARIF, JSON and pages, and return the outcome. Never throws: a failure of the tool itself is the
/// outcome's <see cref="RunOutcome.Fault"/>.
/// </summary>
public static class DesignRun
{
    /// <summary>Runs <paramref name="request"/>; <paramref name="progress"/> hears of each design as it finishes and of a long run still going.</summary>
    public static RunOutcome Execute(RunRequest request, IRunProgress? progress = null)
    {
        ArgumentNullException.ThrowIfNull(request);
        try
        {
            // A head start works on one core while the build restores, on every core once the build's check waits for it.
            return request.HeadStart ? HeadStartCores.Run(cores => ExecuteOrThrow(request, progress, cores)) : ExecuteOrThrow(request, progress, null);
        }
        catch (Exception ex) when (ex is not (OutOfMemoryException or StackOverflowException or AccessViolationException))
        {
            return new RunOutcome { Fault = RunText.Fault(ex), FaultDetail = ex.ToString() };
        }
    }

    private static RunOutcome ExecuteOrThrow(RunRequest request, IRunProgress? progress, HeadStartCores? cores)
    {
        var clock = new RunClock();
        // Disposed at the end: a design claimed but never kept (its check failed) is released for waiting runs.
        // The rule set is hashed with the given files, before anything is read: a head start's check is kept for the build's
        // only when every file it read was (HeadStartChecks).
        var hashed = request.RuleSetFile is null ? request.Files : request.Files.Append(request.RuleSetFile);
        // A head start is marked under way until its check is kept (or not): a build's check that arrives meanwhile may wait for it.
        using var pending = request.HeadStart && request.CacheFolder is not null ? HeadStartChecks.Begin(request, cores) : null;
        using var cache = request.CacheFolder is null ? null : new ResultCache(request.CacheFolder, hashed, request.ToolIdentityOverride, request.MaxDegreeOfParallelism)
        {
            HeadStart = request.HeadStart,
            Claimed = pending is null ? null : pending.Claimed,
        };
        var options = new CheckOptions(request.RuleSetFile, request.Today)
        {
            Search = request.Search,
            Results = cache,
            MaxDegreeOfParallelism = request.MaxDegreeOfParallelism,
        };

        clock.Lap(RunPhase.Inputs);
        CheckReport check;
        var tookHeadStart = false;
        string? headStartAccount = null;
        using (var watch = progress is null ? null : new LongRunWatch(progress))
        {
            if (cache is not null && !request.HeadStart && HeadStartChecks.Take(request, cache) is { } ahead)
            {
                // The build's head start checked exactly these files: its check stands, and each design is told as read from
                // the results cache, as a run that looked each up would tell it (evaluated by the head start, or unchanged).
                check = ahead.Check;
                tookHeadStart = true;
                headStartAccount = ahead.Account;
                clock.Lap(RunPhase.Loading);
                watch?.DesignsLoaded(ahead.Progress.Count);
                foreach (var design in ahead.Progress)
                {
                    watch?.DesignChecked(design with
                    {
                        FromStore = true,
                        JustEvaluated = cache.KeyOf(design.DesignId) is { } key && EvaluationClaims.TakeEvaluatedByHeadStart(key),
                        Elapsed = TimeSpan.Zero,
                    });
                }
            }
            else
            {
                var told = request.HeadStart ? new List<DesignProgress>() : null;
                check = DesignCheck.Run(request.Files, options with
                {
                    DesignsLoaded = count =>
                    {
                        clock.Lap(RunPhase.Loading);
                        watch?.DesignsLoaded(count);
                    },
                }, design =>
                {
                    told?.Add(design);
                    watch?.DesignChecked(design);
                });
                if (told is not null && cache is not null)
                {
                    HeadStartChecks.Put(request, cache, check, [.. told.OrderBy(d => d.File, StringComparer.Ordinal).Select((d, i) => d with { Completed = i + 1 })],
                        clock.Account(RunPhase.Designs));
                }

                pending?.Dispose();
            }
        }

        cache?.RemoveEntriesOfMissingDesigns();
        clock.Lap(RunPhase.Designs);
        var report = request.Levels.Apply(check);
        var shown = request.Warnings.Apply(report);
        var settings = new ReportSettings(request.ReportRoot, request.HelpUriBase, RepositoryConventions.ToolVersion) { Baseline = request.Baseline };
        byte[]? standardOutput = null;
        try
        {
            var sarif = WriteReport(request.SarifFile, () => SarifReport.ToBytes(shown, settings), () => SarifReport.WriteFile(shown, settings, request.SarifFile!));
            var json = WriteReport(request.JsonFile, () => JsonReport.ToBytes(shown, settings), () => JsonReport.WriteFile(shown, settings, request.JsonFile!));
            standardOutput = sarif ?? json;
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
        {
            return new RunOutcome
            {
                Report = report,
                Shown = shown,
                FromCache = cache?.Hits ?? 0,
                Timings = clock.Stop(RunPhase.Reports),
                Problems = [new RequestProblem(null, $"a report file cannot be written ({Diagnostics.DiagnosticText.Escape(ex.Message.TrimEnd('.'))}).")],
            };
        }

        // Against a baseline: one line of counts; under the new-only gate, the findings the baseline has become notes in what
        // the hosts log and count (the reports above keep every true level, with its baselineState).
        string? baselineLine = null;
        var (logged, counted) = (report, shown);
        if (BaselineStates.Compare(shown, settings) is { } comparison)
        {
            var passed = 0;
            if (request.NewOnly)
            {
                logged = NewOnlyGate.Apply(report, settings, out _);
                counted = NewOnlyGate.Apply(shown, settings, out passed);
            }

            baselineLine = RunText.Baseline(comparison, request.NewOnly ? passed : null);
        }

        clock.Lap(RunPhase.Reports);
        PageResult? pages = null;
        string? pagesLine = null;
        if (request.PagesFolder is not null)
        {
            // Pages show the levels the rule set and the level changes gave, not a build's warning promotion: the
            // committed datasheets do not change with -warnaserror.
            pages = DatasheetPages.Write(report, new PageOptions(request.PagesFolder, request.TemplateFolder, request.Root)
            {
                HelpUriBase = request.HelpUriBase,
                Reuse = cache?.PageReuse(report, request),
                MaxParallelDesigns = request.MaxDegreeOfParallelism,
            });
            if (!pages.Diagnostics.Any(d => d.Id == DatasheetPages.FolderProblemId))
            {
                var kept = pages.Kept.Count > 0 ? string.Create(CultureInfo.InvariantCulture, $" ({pages.Kept.Count} unchanged, kept)") : string.Empty;
                pagesLine = string.Create(CultureInfo.InvariantCulture,
                    $"{pages.Written.Count - pages.Kept.Count} page and plot file(s) written to {request.PagesFolder}{kept}, {pages.Removed.Count} stale file(s) removed.");
            }
        }

        return new RunOutcome
        {
            Report = logged,
            Shown = counted,
            StandardOutput = standardOutput,
            Pages = pages,
            PagesLine = pagesLine,
            BaselineLine = baselineLine,
            FromCache = cache?.Hits ?? 0,
            TookHeadStartCheck = tookHeadStart,
            HeadStartAccount = headStartAccount,
            Timings = clock.Stop(RunPhase.Pages),
        };
    }

    /// <summary>Writes one report to its file, or returns its bytes when it goes to standard output.</summary>
    private static byte[]? WriteReport(string? target, Func<byte[]> bytes, Action toFile)
    {
        if (target is null)
        {
            return null;
        }

        if (target == RunRequest.StandardOutput)
        {
            return bytes();
        }

        toFile();
        return null;
    }
}
