using System.Collections.Concurrent;
using System.Security.Cryptography;
using System.Text;
using System.Text.Json;
using System.Text.Json.Serialization;

namespace DesignRules.Pages;

/// <summary>
/// Lets a run keep the pages of designs that did not change instead of rendering them again. The caller (the run layer)
/// gives each design a key of everything its page depends on; a design's page and plots are kept only when its key is
/// the one stored with them, and every one of its files is still in the folder exactly as written (by content), listed
/// in the manifest and not a link. Anything else renders the page again. The index is always rendered from every design.
/// </summary>
public sealed class PageReuse
{
    /// <summary>How many state files a process keeps the parsed form of (a warm server serves a few repositories).</summary>
    internal const int RecentCapacity = 16;

    // The state file this process last read or wrote, by its full path: its exact bytes and what they parse to. A warm
    // server reads the file it wrote one run earlier (about 1 MB of JSON at 500 designs) on every run; when the bytes on disk
    // are exactly those, their parse is known without parsing. Any other bytes (a file changed, replaced or deleted) are
    // parsed as they are. The parsed pages are never changed once made, so sharing them between runs changes nothing.
    private static readonly ConcurrentDictionary<string, (byte[] Bytes, Dictionary<string, StoredPage> Parsed)> Recent = new(StringComparer.Ordinal);

    private readonly string stateFile;
    private readonly IReadOnlyDictionary<string, string> keys;
    private readonly Dictionary<string, StoredPage> stored;
    // What this run keeps and renders, by design id; written in the ids' order, whatever order the designs were looked at
    // in (the pages of many designs are vouched for side by side).
    private readonly SortedDictionary<string, StoredPage> next = new(StringComparer.Ordinal);
    private readonly Lock gate = new();

    /// <summary>Page keys per design id, and the file (outside the pages folder) where what was written under them is kept.</summary>
    public PageReuse(string stateFile, IReadOnlyDictionary<string, string> keys)
    {
        this.stateFile = stateFile ?? throw new ArgumentNullException(nameof(stateFile));
        this.keys = keys ?? throw new ArgumentNullException(nameof(keys));
        stored = Read(stateFile);
    }

    /// <summary>True when the design's files may be kept as they are; they are then remembered for the next run.</summary>
    internal bool CanKeep(string designId, IReadOnlyCollection<string> files, OutputFolder output)
    {
        if (!keys.TryGetValue(designId, out var key) || !stored.TryGetValue(designId, out var page) || page.Key != key
            || page.Files.Count != files.Count || !files.All(page.Files.ContainsKey))
        {
            return false;
        }

        // A file whose size and last-write time are those recorded when it was written is taken as unchanged without
        // reading it (a page of a large repository is hundreds of plot files); any other is read and compared by content,
        // and keeps its new stamp when its content is still the one written.
        var stamps = new Dictionary<string, string>(StringComparer.Ordinal);
        foreach (var (relative, hash) in page.Files)
        {
            var stamp = output.StampOfListedFile(relative);
            if (stamp is null)
            {
                return false;
            }

            if (page.Stamps?.GetValueOrDefault(relative) != stamp && output.ContentHashOfListedFile(relative) != hash)
            {
                return false;
            }

            stamps[relative] = stamp;
        }

        lock (gate)
        {
            next[designId] = page with { Stamps = stamps };
        }

        return true;
    }

    /// <summary>Remembers the files just rendered for a design under its key.</summary>
    internal void Record(string designId, IReadOnlyDictionary<string, string> contents)
    {
        if (keys.TryGetValue(designId, out var key))
        {
            var page = new StoredPage(key, contents.ToDictionary(c => c.Key, c => Hash(c.Value), StringComparer.Ordinal));
            lock (gate)
            {
                next[designId] = page;
            }
        }
    }

    /// <summary>Writes what this run kept and rendered, once the folder is committed; designs no longer checked are dropped.</summary>
    internal void Save(OutputFolder output)
    {
        try
        {
            foreach (var (id, page) in next.Where(p => p.Value.Stamps is null).ToList())
            {
                // The stamps of the files just written; a file without one is read and compared by content next time.
                var stamps = new Dictionary<string, string>(StringComparer.Ordinal);
                foreach (var relative in page.Files.Keys)
                {
                    if (output.StampOfWrittenFile(relative) is { } stamp)
                    {
                        stamps[relative] = stamp;
                    }
                }

                next[id] = page with { Stamps = stamps };
            }

            Directory.CreateDirectory(Path.GetDirectoryName(Path.GetFullPath(stateFile))!);
            var temporary = stateFile + "." + Guid.NewGuid().ToString("N") + ".partial";
            var bytes = JsonSerializer.SerializeToUtf8Bytes(next, PageReuseJson.Default.SortedDictionaryStringStoredPage);
            File.WriteAllBytes(temporary, bytes);
            File.Move(temporary, stateFile, overwrite: true);
            // What these bytes parse to is what was just serialized: the same pages under the same ids (the JSON is this
            // tool's own, of strings and string maps only).
            Remember(stateFile, bytes, new Dictionary<string, StoredPage>(next, StringComparer.Ordinal));
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
        {
            // Without the state the next run renders every page again; nothing is lost.
        }
    }

    /// <summary>Forgets everything, so that no page is kept on the strength of a state the folder no longer matches.</summary>
    internal void Discard()
    {
        try
        {
            File.Delete(stateFile);
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
        {
            // The keys in it still guard every page by content.
        }
    }

    /// <summary>The SHA-256 of a page's text as the folder stores it (UTF-8, \n line ends).</summary>
    internal static string Hash(string content) =>
        Convert.ToHexString(SHA256.HashData(Encoding.UTF8.GetBytes(content.ReplaceLineEndings("\n"))));

    private static Dictionary<string, StoredPage> Read(string file)
    {
        try
        {
            if (!File.Exists(file))
            {
                return new(StringComparer.Ordinal);
            }

            var bytes = File.ReadAllBytes(file);
            if (Recent.TryGetValue(Path.GetFullPath(file), out var recent) && recent.Bytes.AsSpan().SequenceEqual(bytes))
            {
                return recent.Parsed;
            }

            var parsed = JsonSerializer.Deserialize(bytes, PageReuseJson.Default.DictionaryStringStoredPage) ?? new(StringComparer.Ordinal);
            Remember(file, bytes, parsed);
            return parsed;
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException or JsonException or NotSupportedException)
        {
            return new(StringComparer.Ordinal);
        }
    }

    private static void Remember(string file, byte[] bytes, Dictionary<string, StoredPage> parsed)
    {
        if (Recent.Count >= RecentCapacity)
        {
            Recent.Clear();
        }

        Recent[Path.GetFullPath(file)] = (bytes, parsed);
    }

    /// <summary>How many state files' parsed forms are kept now (tests).</summary>
    internal static int RecentCount => Recent.Count;

    /// <summary>A design's page key, its files' content hashes, and their size and last-write time when written or last vouched for.</summary>
    internal sealed record StoredPage(string Key, Dictionary<string, string> Files, Dictionary<string, string>? Stamps = null);
}

/// <summary>The page state's JSON, generated at compile time: the build's process reads it on every build, cold.</summary>
[JsonSerializable(typeof(Dictionary<string, PageReuse.StoredPage>))]
[JsonSerializable(typeof(SortedDictionary<string, PageReuse.StoredPage>))]
internal sealed partial class PageReuseJson : JsonSerializerContext;
