using System.Security.Cryptography;
using System.Text;
using System.Text.Json;

namespace DesignRules.Pages;

/// <summary>
/// Lets a run keep the pages of designs that did not change instead of rendering them again. The caller (the run layer)
/// gives each design a key of everything its page depends on; a design's page and plots are kept only when its key is
/// the one stored with them, and every one of its files is still in the folder exactly as written (by content), listed
/// in the manifest and not a link. Anything else renders the page again. The index is always rendered from every design.
/// </summary>
public sealed class PageReuse
{
    private readonly string stateFile;
    private readonly IReadOnlyDictionary<string, string> keys;
    private readonly Dictionary<string, StoredPage> stored;
    private readonly Dictionary<string, StoredPage> next = new(StringComparer.Ordinal);

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

        foreach (var (relative, hash) in page.Files)
        {
            if (output.ContentHashOfListedFile(relative) != hash)
            {
                return false;
            }
        }

        next[designId] = page;
        return true;
    }

    /// <summary>Remembers the files just rendered for a design under its key.</summary>
    internal void Record(string designId, IReadOnlyDictionary<string, string> contents)
    {
        if (keys.TryGetValue(designId, out var key))
        {
            next[designId] = new StoredPage(key, contents.ToDictionary(c => c.Key, c => Hash(c.Value), StringComparer.Ordinal));
        }
    }

    /// <summary>Writes what this run kept and rendered, once the folder is committed; designs no longer checked are dropped.</summary>
    internal void Save()
    {
        try
        {
            Directory.CreateDirectory(Path.GetDirectoryName(Path.GetFullPath(stateFile))!);
            var temporary = stateFile + "." + Guid.NewGuid().ToString("N") + ".partial";
            File.WriteAllBytes(temporary, JsonSerializer.SerializeToUtf8Bytes(next));
            File.Move(temporary, stateFile, overwrite: true);
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
            return File.Exists(file)
                ? JsonSerializer.Deserialize<Dictionary<string, StoredPage>>(File.ReadAllBytes(file)) ?? new(StringComparer.Ordinal)
                : new(StringComparer.Ordinal);
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException or JsonException or NotSupportedException)
        {
            return new(StringComparer.Ordinal);
        }
    }

    internal sealed record StoredPage(string Key, Dictionary<string, string> Files);
}
