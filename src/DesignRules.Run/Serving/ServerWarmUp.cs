using DesignRules.Loading;

namespace DesignRules.Run.Serving;

/// <summary>
/// What a new evaluation server does once, after the first build's own check it serves: it checks one design of that
/// check again, twice (once when the first check took <see cref="RepeatOnlyUnder"/> or more), on one core, into a
/// scratch folder of its own that it then deletes, so that the runtime has compiled the check's code optimised before
/// the next build's check reaches it.
/// <para>
/// The server's code is ReadyToRun, but the runtime still recompiles the hottest methods optimised (tiered compilation)
/// once each has been called thirty times and calls pause: measured on the 500-design repository (2026-12-04), a new
/// server's first edited design took its head start 2.0 s of processor time and its second 1.2 s, against 0.7 s from the
/// third on; the one-change builds after the one that started the server took 2.1 s and then 1.7–1.8 s. The build that
/// starts a server meets it cold whatever it does; two checks of one design bring the next build's to the third state.
/// The whole check's files are loaded first, as a build's run loads them, so the loader is warm too (and a warm server
/// keeps each file's parsed tree while its text is unchanged).
/// </para>
/// <para>
/// It writes nothing a build writes or reads: no stamp, no loaded-files list, no results cache and nothing in the
/// repository; only its scratch folder below the temporary folder, removed after. It never registers as a head start, so
/// no build takes its check. It works on one core (<see cref="HeadStartCores"/>, never widened), so a build arriving
/// meanwhile keeps the other; it stops between its checks once the server stops.
/// </para>
/// </summary>
internal static class ServerWarmUp
{
    /// <summary>How many times the design is checked at most: the second check still ran partly on code not yet recompiled.</summary>
    internal const int Checks = 2;

    /// <summary>
    /// A first check this long is not repeated: its hot code has run far more than thirty times already (a design with
    /// many Monte Carlo samples, say), and a second would only keep a core busy as long again.
    /// </summary>
    internal static readonly TimeSpan RepeatOnlyUnder = TimeSpan.FromSeconds(3);

    /// <summary>
    /// Checks the design of <paramref name="call"/> whose file comes first (ordinal order) <see cref="Checks"/> times, as
    /// described above; returns that file, or null when the call loads no design or <paramref name="stop"/> was set first.
    /// </summary>
    public static string? Run(BuildCall call, CancellationToken stop)
    {
        ArgumentNullException.ThrowIfNull(call);
        return HeadStartCores.Run(_ => CheckOneDesign(call, stop));
    }

    private static string? CheckOneDesign(BuildCall call, CancellationToken stop)
    {
        if (stop.IsCancellationRequested)
        {
            return null;
        }

        var loaded = DesignLoader.LoadFiles(call.Files);
        var designFiles = loaded.Designs.Select(d => Path.GetFullPath(d.File)).ToHashSet(StringComparer.Ordinal);
        var design = designFiles.Order(StringComparer.Ordinal).FirstOrDefault();
        if (design is null)
        {
            return null;
        }

        // The parts and rule-set files as the run had them, and the one design.
        var files = call.Files.Where(f => Path.GetFullPath(f) is var full && (full == design || !designFiles.Contains(full))).ToList();
        var scratch = Path.Combine(Path.GetTempPath(), $"designrules-warm-up-{Environment.ProcessId}-{Guid.NewGuid():N}");
        try
        {
            var clock = System.Diagnostics.Stopwatch.StartNew();
            for (var check = 0; check < Checks && !stop.IsCancellationRequested && clock.Elapsed < RepeatOnlyUnder; check++)
            {
                clock.Restart();
                BuildCheck.Execute(new BuildCall
                {
                    Files = files,
                    RepositoryRoot = call.RepositoryRoot,
                    RuleSetFile = call.RuleSetFile,
                    TemplateFolder = call.TemplateFolder,
                    HelpUriBase = call.HelpUriBase,
                    ProjectFile = call.ProjectFile,
                    TaskProjectFile = call.TaskProjectFile,
                    Searched = call.Searched,
                    Today = call.Today,
                    Levels = call.Levels,
                    // What a build's run writes, into the scratch folder: the pages (rendering and plotting are the
                    // run's part after the check) and the JSON report.
                    PagesFolder = Path.Combine(scratch, "pages"),
                    JsonFile = Path.Combine(scratch, "report.json"),
                }, new DiscardingLog(), hostAsError: null);
            }

            return stop.IsCancellationRequested ? null : design;
        }
        finally
        {
            try
            {
                if (Directory.Exists(scratch))
                {
                    Directory.Delete(scratch, recursive: true);
                }
            }
            catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
            {
                // Left below the temporary folder, which the system clears; nothing of the repository's.
            }
        }
    }

    private sealed class DiscardingLog : IBuildLog
    {
        public void Write(BuildLogEntry entry)
        {
        }
    }
}
