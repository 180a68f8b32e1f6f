using System.Collections.Concurrent;

namespace DesignRules.Pages;

/// <summary>
/// Pages and plots rendered ahead of the run that writes them: a build's head start renders the page of each design it
/// evaluated while the build restores, and the build's own run then writes those texts instead of rendering them on its
/// critical path. An entry is found only under the same page key (everything a design's page depends on, see
/// <see cref="PageReuse"/>) and the same page options, so it is exactly what the run would render; each entry is taken
/// once. Kept in the process (a warm evaluation server), bounded; anything not found is rendered as before.
/// </summary>
internal static class PreparedPages
{
    /// <summary>How many designs' rendered pages a process keeps at most (a head start prepares the designs that changed).</summary>
    internal const int Capacity = 64;

    private static readonly ConcurrentDictionary<string, IReadOnlyList<KeyValuePair<string, string>>> Entries = new(StringComparer.Ordinal);

    /// <summary>How many prepared pages wait to be written now (tests).</summary>
    internal static int Count => Entries.Count;

    /// <summary>Keeps a design's page and plot texts, page first, under <paramref name="key"/>.</summary>
    internal static void Put(string key, IReadOnlyList<KeyValuePair<string, string>> files)
    {
        if (Entries.Count >= Capacity)
        {
            // Pages prepared for runs that never came (a build cancelled after its restore): forgotten, never wrong.
            Entries.Clear();
        }

        Entries[key] = files;
    }

    /// <summary>The texts prepared under <paramref name="key"/>, removed from the store; null when there are none.</summary>
    internal static IReadOnlyList<KeyValuePair<string, string>>? Take(string key) => Entries.TryRemove(key, out var files) ? files : null;

    /// <summary>
    /// The key of a design's rendered files: its page key and, beside it, everything of the options the texts depend on
    /// (the page key names them too; written out again so that the store never depends on how that key is made).
    /// </summary>
    internal static string? KeyOf(PageReuse? reuse, string designId, string designFile, string pageName, PageOptions options) =>
        reuse?.KeyOf(designId) is not { } pageKey ? null
            : string.Join('\n', pageKey, designId, designFile, pageName, options.TemplateFolder ?? "-", options.RepositoryRoot ?? "-", options.HelpUriBase ?? "-");
}
