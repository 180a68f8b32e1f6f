using System.Collections.Concurrent;
using System.Globalization;
using System.Text;
using DesignRules.Diagnostics;
using DesignRules.Rules;

namespace DesignRules.Run;

/// <summary>
/// The check a build's head start made, kept in the evaluation server for the build's own check of the same content:
/// that check then neither loads the files again nor looks up every design's result, which a large repository's build
/// would otherwise do on its critical path once more, a second or so after the head start did.
/// <para>
/// Kept only when nothing is in doubt: the check found no error (an error may be a file it could not read, which no
/// hash stands for), every file it read was hashed before it was read (the design and parts items and the rule set; a
/// check that read any other file, such as a parts library outside the items, is not kept), every one had that content
/// after the check read it (the hash its run took after loading, or one taken when the check is done), and every design's
/// result has a key the head start found or wrote in the results cache. Taken only by a run of the same request (files,
/// rule set, date, search, tool) whose own hashes, taken before it reads anything, are exactly those: the check then is the check of exactly the
/// files on disk, as the results cache's entries are. Each check is taken once; anything else checks as before.
/// </para>
/// </summary>
internal static class HeadStartChecks
{
    /// <summary>How many head starts' checks a process keeps at most (a server serves a few repositories).</summary>
    internal const int Capacity = 8;

    private static readonly ConcurrentDictionary<string, Entry> Entries = new(StringComparer.Ordinal);

    // Head starts under way, by fingerprint: a build's check that arrives meanwhile may wait for one (see Take).
    private static readonly ConcurrentDictionary<string, Pending> Running = new(StringComparer.Ordinal);

    /// <summary>Keeps a head start's check when nothing about it is in doubt (see the class).</summary>
    public static void Put(RunRequest request, ResultCache cache, CheckReport check, IReadOnlyList<DesignProgress> progress, Func<string> account)
    {
        // A check with an error is not kept: one of its errors may be a file it could not read (a parts library not there
        // yet), which no hash stands for.
        if (check.Findings.Any(f => f.Severity == Severity.Error))
        {
            return;
        }

        var hashes = cache.HashesBeforeLoading(check.LoadedFiles.Concat(request.Files.Select(Path.GetFullPath)));
        if (hashes is null || !cache.StillTheSame(hashes) || !cache.EveryDesignHasAResult(check, out var results))
        {
            return;
        }

        if (Entries.Count >= Capacity)
        {
            // Head starts whose builds never came to their check (cancelled after the restore): forgotten, never wrong.
            Entries.Clear();
        }

        Entries[Fingerprint(request)] = new Entry(check, hashes, results, progress, account);
    }

    /// <summary>
    /// The head start's check of exactly this request and content, removed from the store, with the cache made to hold
    /// what a run that checked would hold; null when there is none.
    /// </summary>
    /// <remarks>
    /// A head start of the same request still under way is waited for while it finishes what it was doing when this run
    /// came: the design it was evaluating, or evaluates first (this run would wait for that design's claim too), and its
    /// lookups of the others (which this run would otherwise make itself). Once it claims another design, this run stops waiting and checks as
    /// before, sharing the remaining designs with it, so a head start with many designs to evaluate never holds a build
    /// back to one core. At most <see cref="EvaluationClaims.WaitLimit"/>.
    /// </remarks>
    public static Entry? Take(RunRequest request, ResultCache cache)
    {
        var fingerprint = Fingerprint(request);
        if (Running.TryGetValue(fingerprint, out var running))
        {
            running.WaitWhileOnItsCurrentDesign(EvaluationClaims.WaitLimit);
        }

        if (!Entries.TryRemove(fingerprint, out var entry) || !cache.HasHashes(entry.Hashes))
        {
            return null;
        }

        cache.Adopt(entry.Results);
        return entry;
    }

    /// <summary>Marks a head start of <paramref name="request"/> as under way until the returned mark is disposed (after <see cref="Put"/>).</summary>
    public static Pending Begin(RunRequest request, HeadStartCores? cores)
    {
        var fingerprint = Fingerprint(request);
        var pending = new Pending(fingerprint, cores);
        Running[fingerprint] = pending;
        return pending;
    }

    /// <summary>Everything of a request the check's findings and figures depend on besides the files' content.</summary>
    private static string Fingerprint(RunRequest request)
    {
        var text = new StringBuilder();
        text.Append("rule-set ").Append(request.RuleSetFile is null ? "-" : Path.GetFullPath(request.RuleSetFile)).Append('\n')
            .Append("today ").Append(request.Today.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture)).Append('\n')
            .Append("search ").Append(request.Search?.Location ?? "-").Append(' ').Append(request.Search?.Description ?? "-").Append('\n')
            .Append("tool ").Append(request.ToolIdentityOverride ?? "-").Append('\n')
            .Append("cache ").Append(request.CacheFolder is null ? "-" : Path.GetFullPath(request.CacheFolder)).Append('\n');
        foreach (var file in request.Files.Select(Path.GetFullPath).Distinct(StringComparer.Ordinal).Order(StringComparer.Ordinal))
        {
            text.Append("file ").Append(file).Append('\n');
        }

        return text.ToString();
    }

    /// <summary>A head start under way: how many designs it has claimed for evaluation, and whether it is done.</summary>
    internal sealed class Pending(string fingerprint, HeadStartCores? cores) : IDisposable
    {
        private readonly ManualResetEventSlim done = new(false);
        private int claimed;

        /// <summary>The head start claimed a design to evaluate it.</summary>
        public void Claimed() => Interlocked.Increment(ref claimed);

        /// <summary>
        /// Gives the head start every core, then waits until it is done or claims a design after the design it held when
        /// the wait began.
        /// </summary>
        public void WaitWhileOnItsCurrentDesign(TimeSpan limit)
        {
            // The build now waits: its cores are the head start's (HeadStartCores).
            cores?.Widen();
            var atArrival = Volatile.Read(ref claimed);
            var clock = System.Diagnostics.Stopwatch.StartNew();
            // Polled: the head start's next claim has no event of its own, and a few milliseconds are nothing beside a design.
            while (!done.Wait(5) && Volatile.Read(ref claimed) <= Math.Max(atArrival, 1) && clock.Elapsed < limit)
            {
            }
        }

        public void Dispose()
        {
            Running.TryRemove(new KeyValuePair<string, Pending>(fingerprint, this));
            done.Set();
        }
    }

    /// <summary>A kept check: the report, each file's content hash, each design's result key and file, and each design's progress.</summary>
    internal sealed record Entry(CheckReport Check, IReadOnlyDictionary<string, string> Hashes, ResultCache.Results Results, IReadOnlyList<DesignProgress> Progress, Func<string> Told)
    {
        /// <summary>The head start's own account of its run (phases, processor time, how long ago it ended), for the detailed log.</summary>
        public string Account => "the head start: " + Told();
    }
}
