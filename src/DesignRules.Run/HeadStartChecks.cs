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
/// check that read any other file, such as a parts library outside the items, is not kept), every one still has that
/// content when the check is done, and every design's result has a key the head start found or wrote in the results
/// cache. Taken only by a run of the same request (files, rule set, date, search,
/// tool) whose own hashes, taken before it reads anything, are exactly those: the check then is the check of exactly the
/// files on disk, as the results cache's entries are. Each check is taken once; anything else checks as before.
/// </para>
/// </summary>
internal static class HeadStartChecks
{
    /// <summary>How many head starts' checks a process keeps at most (a server serves a few repositories).</summary>
    internal const int Capacity = 8;

    private static readonly ConcurrentDictionary<string, Entry> Entries = new(StringComparer.Ordinal);

    /// <summary>How many checks wait to be taken now (tests).</summary>
    internal static int Count => Entries.Count;

    /// <summary>Keeps a head start's check when nothing about it is in doubt (see the class).</summary>
    public static void Put(RunRequest request, ResultCache cache, CheckReport check, IReadOnlyList<DesignProgress> progress)
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

        Entries[Fingerprint(request)] = new Entry(check, hashes, results, progress);
    }

    /// <summary>
    /// The head start's check of exactly this request and content, removed from the store, with the cache made to hold
    /// what a run that checked would hold; null when there is none.
    /// </summary>
    public static Entry? Take(RunRequest request, ResultCache cache)
    {
        if (!Entries.TryRemove(Fingerprint(request), out var entry) || !cache.HasHashes(entry.Hashes))
        {
            return null;
        }

        cache.Adopt(entry.Results);
        return entry;
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

    /// <summary>A kept check: the report, each file's content hash, each design's result key and file, and each design's progress.</summary>
    internal sealed record Entry(CheckReport Check, IReadOnlyDictionary<string, string> Hashes, ResultCache.Results Results, IReadOnlyList<DesignProgress> Progress);
}
