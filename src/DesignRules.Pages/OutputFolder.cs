using System.Collections.Concurrent;
using System.Diagnostics;
using System.Globalization;
using System.IO.Enumeration;
using System.Text;
using DesignRules.Diagnostics;

namespace DesignRules.Pages;

/// <summary>
/// The output folder's discipline. Pages are gathered first and written together under a lock on the folder; a file is
/// written only where nothing is or where the manifest (<c>.designrules-pages</c>) says an earlier run wrote it; no
/// symbolic link below the folder is ever followed (the folder's own path may be one); every file is written whole to a
/// hidden temporary name unique to the run and renamed into place; and only files the manifest lists are ever removed.
/// A problem with the folder becomes <see cref="PagesFolderException"/> with a plain sentence naming the path.
/// </summary>
internal sealed class OutputFolder
{
    /// <summary>The manifest's file name inside the output folder.</summary>
    public const string ManifestName = ".designrules-pages";

    /// <summary>The lock file concurrent checks take on the folder; it stays, empty, between runs.</summary>
    public const string LockName = ".designrules-pages.lock";

    private readonly string root;
    private readonly TimeSpan lockWait;
    private readonly SortedDictionary<string, string> pending = new(StringComparer.Ordinal);
    private readonly SortedSet<string> kept = new(StringComparer.Ordinal);
    private readonly Lazy<HashSet<string>> listedBefore;

    // Folders below the root already seen to be real folders, not links: a design's plots share one folder, and checking
    // it again for each of its files cost a directory lookup per file. Emptied when the commit starts, so that the
    // commit checks every folder once more under the lock. Concurrent: the pages of many designs are vouched for at once.
    private readonly ConcurrentDictionary<string, bool> linkFreeFolders = new(StringComparer.Ordinal);

    // The stamps of the plain files of each folder looked at before the commit (see StampsIn); never used by the commit.
    private readonly ConcurrentDictionary<string, Lazy<Dictionary<string, string>>> folderStamps = new(StringComparer.Ordinal);

    public OutputFolder(string folder, TimeSpan? lockWait = null)
    {
        root = Path.TrimEndingDirectorySeparator(Path.GetFullPath(folder));
        this.lockWait = lockWait ?? TimeSpan.FromSeconds(60);
        // Read once, on first need, by whichever thread asks first (the files of many designs are looked at side by side);
        // a manifest that cannot be read throws to every caller, as it did to the one caller before.
        listedBefore = new(() => Directory.Exists(root) ? ReadManifest() : [], LazyThreadSafetyMode.PublicationOnly);
    }

    /// <summary>How many folders the commit looks at side by side (-1: one per core), as the run's designs are.</summary>
    public int MaxParallel { get; init; } = -1;

    /// <summary>The files written, relative to the folder, once <see cref="Commit"/> has run.</summary>
    public IReadOnlyCollection<string> Written => pending.Keys.Concat(kept).Order(StringComparer.Ordinal).ToList();

    /// <summary>The files kept as an earlier run wrote them (see <see cref="Keep"/>).</summary>
    public IReadOnlyCollection<string> Kept => kept;

    /// <summary>
    /// Keeps a file an earlier run wrote, unchanged: it stays listed in the manifest and is neither written nor removed.
    /// Only for a file <see cref="ContentHashOfListedFile"/> has just vouched for.
    /// </summary>
    public void Keep(string relative) => kept.Add(relative.Replace('\\', '/'));

    /// <summary>
    /// The SHA-256 of a file an earlier run wrote (listed in the manifest, a plain file reached through no link); null when
    /// it is missing, unlisted, a link, or cannot be read.
    /// </summary>
    public string? ContentHashOfListedFile(string relative)
    {
        try
        {
            var full = Inside(relative);
            if (full is null || !listedBefore.Value.Contains(relative) || LinkOnTheWay(relative) is not null || !File.Exists(full))
            {
                return null;
            }

            return Convert.ToHexString(System.Security.Cryptography.SHA256.HashData(File.ReadAllBytes(full)));
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
        {
            return null;
        }
    }

    /// <summary>
    /// The size and last-write time of a file an earlier run wrote (listed, a plain file reached through no link), as
    /// "size:ticks"; null when it is missing, unlisted, a link, or cannot be read. A file whose stamp is the one recorded
    /// when it was written need not be read to be known unchanged.
    /// </summary>
    public string? StampOfListedFile(string relative)
    {
        try
        {
            var full = Inside(relative);
            // The folders on the way are checked once per run (a design's plots share one); the file itself by its entry
            // in its folder's listing, read once per folder (see StampsIn).
            return full is null || !listedBefore.Value.Contains(relative) || LinkOnTheWay(relative, foldersOnly: true) is not null
                ? null
                : StampsIn(Path.GetDirectoryName(full)!).GetValueOrDefault(Path.GetFileName(full));
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
        {
            return null;
        }
    }

    /// <summary>
    /// A folder's plain files, listed without a status call per entry: skipping links and folders needs none, the directory
    /// entry's own type says so (on a file system that does not give the type, the runtime looks at the entry itself, never
    /// through a link). Errors are not skipped: a folder that cannot be listed is the caller's to handle.
    /// </summary>
    private static readonly EnumerationOptions PlainFiles = new()
    {
        AttributesToSkip = FileAttributes.Directory | FileAttributes.ReparsePoint,
        IgnoreInaccessible = false,
        MatchType = MatchType.Simple,
        RecurseSubdirectories = false,
    };

    /// <summary>
    /// The stamps of the plain files in <paramref name="folder"/>, by name, read once per run and folder (a design's plots
    /// share one; every page shares the root). The listing's own entry types leave out folders and symbolic links without
    /// a status call, and each file's size and time come from one status call on its entry (lstat on Unix: never through a
    /// link), as <see cref="StampOf"/> gives them, without the file object, its full path and the attribute checks (which
    /// cost a further system call per file) of a lookup per file: a large repository's pages are thousands of files, and
    /// a warm server looks at every one on every run. A folder that cannot be listed has no stamps: its files are rendered again.
    /// </summary>
    private Dictionary<string, string> StampsIn(string folder) => folderStamps.GetOrAdd(folder, f => new Lazy<Dictionary<string, string>>(() =>
    {
        var stamps = new Dictionary<string, string>(StringComparer.Ordinal);
        try
        {
            var entries = new FileSystemEnumerable<(string Name, string Stamp)>(f,
                (ref FileSystemEntry entry) => (entry.FileName.ToString(),
                    string.Create(CultureInfo.InvariantCulture, $"{entry.Length}:{entry.LastWriteTimeUtc.UtcDateTime.Ticks}")), PlainFiles);
            foreach (var (name, stamp) in entries)
            {
                stamps[name] = stamp;
            }
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
        {
            stamps.Clear();
        }

        return stamps;
    })).Value;

    /// <summary>The stamp of a file this run has just written (for the next run's <see cref="StampOfListedFile"/>); null when it is gone.</summary>
    public string? StampOfWrittenFile(string relative)
    {
        try
        {
            var full = Inside(relative);
            return full is null ? null : StampOf(full);
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
        {
            return null;
        }
    }

    /// <summary>
    /// "size:ticks" of a plain file, from one status call on the entry itself (lstat on Unix: a symbolic link shows as a
    /// reparse point and is refused, never followed); null for a link, a folder or nothing.
    /// </summary>
    private static string? StampOf(string full)
    {
        var info = new FileInfo(full);
        return PlainFile(info)
            ? string.Create(CultureInfo.InvariantCulture, $"{info.Length}:{info.LastWriteTimeUtc.Ticks}")
            : null;
    }

    /// <summary>
    /// True when <paramref name="full"/> is, by its folder's listing (read once per folder into <paramref name="folders"/>),
    /// an entry that is neither a folder nor a symbolic link: what <see cref="PlainFile"/> says of its own status.
    /// </summary>
    private static bool Listed(ConcurrentDictionary<string, HashSet<string>> folders, string full)
    {
        var folder = Path.GetDirectoryName(full)!;
        if (!folders.TryGetValue(folder, out var names))
        {
            names = new HashSet<string>(StringComparer.Ordinal);
            try
            {
                foreach (var file in Directory.EnumerateFiles(folder, "*", PlainFiles))
                {
                    names.Add(Path.GetFileName(file));
                }
            }
            catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
            {
                // A folder that went away or cannot be listed keeps none of its files.
            }

            // Two threads listing the same folder keep one listing; each is complete, and neither is changed after.
            names = folders.GetOrAdd(folder, names);
        }

        return names.Contains(Path.GetFileName(full));
    }

    private static bool PlainFile(FileInfo info) =>
        info.Exists && (info.Attributes & (FileAttributes.ReparsePoint | FileAttributes.Directory)) == 0;

    /// <summary>Turns an id into a file-name part: lower-case letters, digits and hyphens only.</summary>
    public static string SafeName(string id)
    {
        var text = new StringBuilder(id.Length);
        foreach (var c in id.ToLowerInvariant())
        {
            text.Append(c is (>= 'a' and <= 'z') or (>= '0' and <= '9') or '-' ? c : '-');
        }

        var name = text.ToString().Trim('-');
        return name.Length == 0 ? "unnamed" : name;
    }

    /// <summary>Gathers a text file (with \n line ends) to be written by <see cref="Commit"/>.</summary>
    public void Write(string relative, string content)
    {
        relative = relative.Replace('\\', '/');
        if (Inside(relative) is null)
        {
            // Names are made by SafeName; reaching this is a programming error.
            throw new InvalidOperationException($"Refusing to write outside the output folder: {relative}");
        }

        pending[relative] = content.ReplaceLineEndings("\n");
    }

    /// <summary>
    /// Under the folder's lock: checks that nothing is in the way, writes every gathered file, removes files the previous
    /// run wrote and this one did not, and writes the new manifest. Returns the files removed.
    /// </summary>
    public IReadOnlyList<string> Commit(List<Diagnostic> diagnostics)
    {
        if (File.Exists(root))
        {
            throw new PagesFolderException(root, $"'{root}' is a file, not a folder; name a folder for the pages");
        }

        try
        {
            Directory.CreateDirectory(root);
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
        {
            throw new PagesFolderException(root, $"the pages folder '{root}' cannot be created ({ex.Message.TrimEnd('.')})");
        }

        using var held = Lock();
        linkFreeFolders.Clear();
        var listed = ReadManifest();
        foreach (var relative in pending.Keys)
        {
            var full = Refuse(relative, "write");
            if (File.Exists(full) && !listed.Contains(relative))
            {
                throw new PagesFolderException(full,
                    $"'{full}' is in the way: a page of this name is due, but the file is not one the tool wrote (the manifest {ManifestName} does not list it). Move or rename it, then check again");
            }

            if (Directory.Exists(full))
            {
                throw new PagesFolderException(full, $"'{full}' is a folder where a page is due; move or rename it, then check again");
            }
        }

        foreach (var (relative, content) in pending)
        {
            WriteWhole(Inside(relative)!, content);
        }

        var removed = new List<string>();
        // A kept file that vanished since it was vouched for is not listed again (the next run renders it). Whether each is
        // still a plain file is read from its folder's listing, one per folder (a design's plots share one), rather than
        // from a status call per file: the listing tells a link and a folder from a file without another look.
        var plainFiles = new ConcurrentDictionary<string, HashSet<string>>(StringComparer.Ordinal);
        // The folders of the kept files, each looked at once (the folders on its way, then its listing) by a file of it,
        // side by side: a large repository keeps hundreds of plot folders, and one at a time they leave a core idle. The
        // test below then finds every answer already there.
        var firstOfEachFolder = kept.GroupBy(k => k.LastIndexOf('/') is var slash and >= 0 ? k[..slash] : string.Empty, StringComparer.Ordinal)
            .Select(g => g.First()).ToList();
        Parallel.ForEach(firstOfEachFolder, new ParallelOptions { MaxDegreeOfParallelism = MaxParallel, TaskScheduler = TaskScheduler.Current }, k =>
        {
            if (LinkOnTheWay(k, foldersOnly: true) is null && Inside(k) is { } full)
            {
                Listed(plainFiles, full);
            }
        });
        kept.RemoveWhere(k => !listed.Contains(k) || LinkOnTheWay(k, foldersOnly: true) is not null || Inside(k) is not { } full || !Listed(plainFiles, full));
        foreach (var relative in listed.Where(l => !pending.ContainsKey(l) && !kept.Contains(l)))
        {
            var full = Inside(relative);
            if (full is null || LinkOnTheWay(relative) is not null || !File.Exists(full))
            {
                continue;
            }

            try
            {
                File.Delete(full);
                removed.Add(relative);
            }
            catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
            {
                diagnostics.Add(RuleCatalogue.Default[RuleIds.TemplateError].At(SourceSpan.WholeFile(full), ManifestName, $"the stale page {relative} cannot be removed ({ex.Message})"));
            }
        }

        Refuse(ManifestName, "write");
        WriteWhole(Path.Combine(root, ManifestName),
            "# Files written by DesignRules; only these are ever written over or removed by it.\n" + string.Concat(Written.Select(w => w + "\n")));
        return removed;
    }

    /// <summary>The full path of a relative name when it stays inside the folder; null otherwise.</summary>
    private string? Inside(string relative)
    {
        var full = Path.GetFullPath(Path.Combine(root, relative));
        return full.StartsWith(root + Path.DirectorySeparatorChar, StringComparison.Ordinal) ? full : null;
    }

    /// <summary>
    /// The first symbolic link on the way from the folder to <paramref name="relative"/>, or null; with
    /// <paramref name="foldersOnly"/> only the folders on the way are looked at (the caller looks at the file's own entry).
    /// </summary>
    private string? LinkOnTheWay(string relative, bool foldersOnly = false)
    {
        var path = root;
        var parts = relative.Split('/', StringSplitOptions.RemoveEmptyEntries);
        for (var i = 0; i < (foldersOnly ? parts.Length - 1 : parts.Length); i++)
        {
            path = Path.Combine(path, parts[i]);
            var folder = i < parts.Length - 1;
            if (folder && linkFreeFolders.ContainsKey(path))
            {
                continue;
            }

            // One status call on the entry itself (lstat on Unix, never through a link) says whether anything is there,
            // whether it is a folder and whether it is a reparse point; only a reparse point is asked for its link target
            // (every symbolic link and junction is one, and LinkTarget is null for anything else), so a plain folder costs
            // one call instead of three (exists, link target, exists again).
            var info = new FileInfo(path);
            var attributes = info.Attributes;
            if ((int)attributes == -1)
            {
                return null;
            }

            if ((attributes & FileAttributes.ReparsePoint) != 0 && info.LinkTarget is not null)
            {
                return path;
            }

            if (folder && (attributes & FileAttributes.Directory) != 0)
            {
                linkFreeFolders.TryAdd(path, true);
            }
        }

        return null;
    }

    private string Refuse(string relative, string what)
    {
        if (LinkOnTheWay(relative) is { } link)
        {
            throw new PagesFolderException(link,
                $"'{link}' is a symbolic link inside the pages folder, and the tool never follows links there (it would {what} through it). Replace the link with a real folder or file, or remove it");
        }

        return Inside(relative)!;
    }

    private HashSet<string> ReadManifest()
    {
        var manifest = Path.Combine(root, ManifestName);
        Refuse(ManifestName, "read");
        var listed = new HashSet<string>(StringComparer.Ordinal);
        if (!File.Exists(manifest))
        {
            return listed;
        }

        using var reader = new StreamReader(manifest, Encoding.UTF8);
        string? line;
        var characters = 0L;
        while ((line = reader.ReadLine()) is not null && (characters += line.Length) <= 4 << 20)
        {
            if (line.Length > 0 && !line.StartsWith('#'))
            {
                listed.Add(line.Replace('\\', '/'));
            }
        }

        return listed;
    }

    /// <summary>Writes a file whole: a hidden temporary name unique to this run, created new (never through a link), then renamed.</summary>
    private static void WriteWhole(string full, string content)
    {
        var folder = Path.GetDirectoryName(full)!;
        Directory.CreateDirectory(folder);
        var temporary = Path.Combine(folder, string.Create(CultureInfo.InvariantCulture,
            $".{Path.GetFileName(full)}.{Environment.ProcessId}-{Guid.NewGuid():N}.partial"));
        try
        {
            using (var stream = new FileStream(temporary, FileMode.CreateNew, FileAccess.Write, FileShare.None))
            {
                var bytes = new UTF8Encoding(encoderShouldEmitUTF8Identifier: false).GetBytes(content);
                stream.Write(bytes);
            }

            File.Move(temporary, full, overwrite: true);
        }
        finally
        {
            if (File.Exists(temporary))
            {
                File.Delete(temporary);
            }
        }
    }

    /// <summary>Takes the folder's lock, waiting a bounded time for another check that holds it.</summary>
    private FileStream Lock()
    {
        var path = Refuse(LockName, "lock");
        var clock = Stopwatch.StartNew();
        while (true)
        {
            try
            {
                // FileShare.None is an exclusive lock between processes (flock on Unix); the file itself stays.
                return new FileStream(path, FileMode.OpenOrCreate, FileAccess.ReadWrite, FileShare.None);
            }
            catch (IOException) when (clock.Elapsed < lockWait)
            {
                Thread.Sleep(50);
            }
            catch (IOException)
            {
                throw new PagesFolderException(root, string.Create(CultureInfo.InvariantCulture,
                    $"another check has been writing pages into '{root}' for {lockWait.TotalSeconds:0} s (it holds {LockName}); run the checks one after the other, or give each its own pages folder"));
            }
        }
    }
}

/// <summary>A pages folder the tool will not write into, with a plain sentence that names the path.</summary>
internal sealed class PagesFolderException(string path, string message) : IOException(message)
{
    public string Path { get; } = path;
}
