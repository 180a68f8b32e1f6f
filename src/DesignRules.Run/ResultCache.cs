using System.Buffers;
using System.Collections.Concurrent;
using System.Globalization;
using System.Security.Cryptography;
using System.Text;
using DesignRules.Loading;
using DesignRules.Model;
using DesignRules.Pages;
using DesignRules.Rules;

namespace DesignRules.Run;

/// <summary>
/// The per-design results cache. An entry holds one design's result under a key made from the content of everything
/// the result depends on: the design file, every parts file the design uses, the rule-set sections that apply to it
/// (Monte Carlo settings, the rules for every design, its own section), the date when it has waivers, the tool's
/// identity and the codec's format. A green replayed from a stale entry is the worst defect this tool could have, so the
/// key errs on the side of re-evaluating: any doubt is a miss. An entry is written only after a check of its design
/// completed and only when no file it depends on changed during the check; a damaged or foreign entry is ignored and
/// written again.
/// </summary>
internal sealed class ResultCache : IDesignResultStore, IDisposable
{
    private const string Magic = "designrules-results";

    /// <summary>An entry larger than this is not one this tool wrote (the largest design's is a few hundred kilobytes).</summary>
    private const int MaxEntryBytes = 64 << 20;
    private readonly string folder;
    private readonly string tool;
    private readonly ConcurrentDictionary<string, string?> contentHashes = new(StringComparer.Ordinal);
    private readonly ConcurrentDictionary<string, string> keys = new(StringComparer.Ordinal);

    // Each file's content hash taken again after loading, once per run (a parts file is shared by many designs).
    private readonly ConcurrentDictionary<string, Lazy<string?>> loadedHashes = new(StringComparer.Ordinal);
    private readonly ConcurrentBag<string> designFiles = [];
    private readonly ConcurrentBag<string> stored = [];
    private readonly ConcurrentBag<string> found = [];
    private readonly ConcurrentDictionary<string, EvaluationClaims.Claim> claims = new(StringComparer.Ordinal);
    // The hashes taken in the constructor, before anything was read (contentHashes also gains hashes taken later).
    private readonly Dictionary<string, string?> hashedFirst;
    private readonly int? maxParallel;
    private int hits;

    /// <summary>A cache in <paramref name="folder"/>; <paramref name="files"/> are hashed now, before they are loaded.</summary>
    public ResultCache(string folder, IEnumerable<string> files, string? toolIdentity = null, int? maxParallel = null)
    {
        this.folder = folder;
        tool = toolIdentity ?? ToolIdentity.Text;
        // Hashing the given files before the loader reads them means that a file saved during the check makes the key
        // (taken before) disagree with the content after the check, and the entry is not written. Each file's hash is its
        // own, so they are taken side by side (a large repository's hundreds of files lie on a served run's critical path:
        // a build's head start hashes them before it can start evaluating the changed design).
        Parallel.ForEach(files, new ParallelOptions { MaxDegreeOfParallelism = maxParallel ?? -1, TaskScheduler = TaskScheduler.Current }, file =>
            contentHashes[Path.GetFullPath(file)] = HashFile(file));
        hashedFirst = new Dictionary<string, string?>(contentHashes, StringComparer.Ordinal);
        this.maxParallel = maxParallel;
    }

    /// <summary>
    /// True for a build's head start: the run only fills the cache ahead of the build's own check, and the designs it
    /// evaluates are remembered so that the check's progress says where their results came from.
    /// </summary>
    public bool HeadStart { get; init; }

    /// <summary>Told each time this run claims a design to evaluate it (a head start's progress, see <see cref="HeadStartChecks"/>).</summary>
    public Action? Claimed { get; init; }

    /// <summary>
    /// The content hashes, taken before anything was read, of <paramref name="files"/>; null when one of them was not
    /// hashed then (a file the check found on its way, such as a parts library outside the given files) or cannot be read.
    /// </summary>
    public IReadOnlyDictionary<string, string>? HashesBeforeLoading(IEnumerable<string> files)
    {
        var hashes = new Dictionary<string, string>(StringComparer.Ordinal);
        foreach (var file in files.Select(Path.GetFullPath).Distinct(StringComparer.Ordinal))
        {
            if (hashedFirst.GetValueOrDefault(file) is not { } hash)
            {
                return null;
            }

            hashes[file] = hash;
        }

        return hashes;
    }

    /// <summary>
    /// True when every file had, after the check read it, the content hashed before: the hash this run took after loading
    /// where it took one (every design's file and parts files, once each, see <see cref="SameAsBefore"/>), else one taken now,
    /// side by side. Either is taken after the file was read, so the check read exactly the content hashed before.
    /// </summary>
    public bool StillTheSame(IReadOnlyDictionary<string, string> hashes)
    {
        var same = true;
        Parallel.ForEach(hashes, new ParallelOptions { MaxDegreeOfParallelism = maxParallel ?? -1, TaskScheduler = TaskScheduler.Current }, pair =>
        {
            var after = loadedHashes.TryGetValue(pair.Key, out var loaded) ? loaded.Value : HashFile(pair.Key);
            if (after != pair.Value)
            {
                same = false;
            }
        });
        return same;
    }

    /// <summary>True when every file of <paramref name="hashes"/> had exactly that content when this run hashed it, before reading anything.</summary>
    public bool HasHashes(IReadOnlyDictionary<string, string> hashes) =>
        hashes.All(pair => hashedFirst.TryGetValue(pair.Key, out var hash) && hash == pair.Value);

    /// <summary>
    /// True when every design of <paramref name="check"/> (each id once) has a result this run found or wrote under its key;
    /// <paramref name="results"/> then holds what a later run that looks them all up would hold.
    /// </summary>
    public bool EveryDesignHasAResult(CheckReport check, out Results results)
    {
        var ids = check.Designs.Select(d => d.Design.Id.Value).ToList();
        var withResult = found.Concat(stored).ToHashSet(StringComparer.Ordinal);
        results = new Results(new Dictionary<string, string>(keys, StringComparer.Ordinal), [.. designFiles.Distinct(StringComparer.Ordinal)], ids.Count);
        return ids.Distinct(StringComparer.Ordinal).Count() == ids.Count && ids.All(id => withResult.Contains(id) && keys.ContainsKey(id));
    }

    /// <summary>Holds the keys, design files and hits of a run that looked up every design and found each (see <see cref="HeadStartChecks"/>).</summary>
    public void Adopt(Results results)
    {
        foreach (var (id, key) in results.Keys)
        {
            keys[id] = key;
        }

        foreach (var file in results.DesignFiles)
        {
            designFiles.Add(file);
        }

        hits = results.Hits;
    }

    /// <summary>The result key of a design this run found or wrote; null for none.</summary>
    public string? KeyOf(string designId) => keys.GetValueOrDefault(designId);

    /// <summary>How many designs came from the cache.</summary>
    public int Hits => hits;

    /// <inheritdoc />
    public DesignResult? Find(Design design, RuleSet ruleSet, DateOnly today)
    {
        designFiles.Add(Path.GetFullPath(design.File));
        var key = Key(design, ruleSet, today, fresh: false);
        // The key from the content hashed before loading must be the key of the content now: a file saved in between may
        // have been loaded in either version, and a result of the other version must never stand for it. The key is the
        // same text with the same hashes, so comparing each file's hash now with its hash before is the same test; a
        // parts file many designs share is hashed again once per run, after loading (see SameAsBefore).
        if (key is null || !Unchanged(design))
        {
            return null;
        }

        keys[design.Id.Value] = key;
        var entry = EntryPath(design.File);
        // Another run of this process evaluating exactly this content now (a build's head start): wait for it and read
        // the entry it writes.
        EvaluationClaims.WaitFor(key, EvaluationClaims.WaitLimit);
        if (Read(entry, key, design) is { } result)
        {
            found.Add(design.Id.Value);
            Interlocked.Increment(ref hits);
            return result with { JustEvaluated = !HeadStart && EvaluationClaims.TakeEvaluatedByHeadStart(key) };
        }

        // About to evaluate: claim the key, so that another run of this process waits instead of evaluating it too.
        var claim = EvaluationClaims.TryClaim(key, ClaimName(design));
        if (claim is null)
        {
            // Claimed meanwhile by another run: wait for its entry; without one (it failed), evaluate here.
            EvaluationClaims.WaitFor(key, EvaluationClaims.WaitLimit);
        }
        else
        {
            claims[ClaimName(design)] = claim;
            Claimed?.Invoke();
        }

        // Once more: the other run may have written its entry and left between the first look and now.
        if (Read(entry, key, design) is { } written)
        {
            if (claims.TryRemove(ClaimName(design), out var mine))
            {
                mine.Release();
            }

            found.Add(design.Id.Value);
            Interlocked.Increment(ref hits);
            return written with { JustEvaluated = !HeadStart && EvaluationClaims.TakeEvaluatedByHeadStart(key) };
        }

        return null;
    }

    /// <summary>A claim is this run's by the design file it was made for (one design per file; ids may collide, DR909).</summary>
    private static string ClaimName(Design design) => Path.GetFullPath(design.File);

    /// <summary>The result stored in <paramref name="entry"/> under exactly <paramref name="key"/>; null when there is none.</summary>
    private static DesignResult? Read(string entry, string key, Design design)
    {
        byte[]? buffer = null;
        var length = 0;
        try
        {
            // Read into a rented buffer: an entry is tens of kilobytes (the plots' numbers), hundreds of them are read on
            // every run, and as fresh arrays most of them went to the large-object heap. A missing entry throws
            // FileNotFoundException, an IOException like any unreadable one.
            using (var handle = File.OpenHandle(entry, FileMode.Open, FileAccess.Read, FileShare.Read))
            {
                var size = RandomAccess.GetLength(handle);
                if (size > MaxEntryBytes)
                {
                    return null;
                }

                length = (int)size;
                buffer = ArrayPool<byte>.Shared.Rent(length);
                var read = 0;
                while (read < length && RandomAccess.Read(handle, buffer.AsSpan(read, length - read), read) is var n and > 0)
                {
                    read += n;
                }

                if (read != length)
                {
                    return null;
                }
            }

            ReadOnlySpan<byte> bytes = buffer.AsSpan(0, length);
            var payload = Payload(bytes, key, out var checksum);
            if (payload < 0)
            {
                return null;
            }

            // The payload's checksum (just verified against the bytes) names its content exactly: a warm process that read
            // the same bytes before reuses their parsed form instead of parsing the JSON again.
            return ResultCodec.Decode(DecodedEntries.Get(checksum, bytes[payload..]), design);
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException or System.Text.Json.JsonException
            or NotSupportedException or InvalidOperationException or ArgumentException or FormatException or OverflowException)
        {
            // Damaged, foreign or unreadable: never trusted; the design is evaluated and its entry written again.
            return null;
        }
        finally
        {
            if (buffer is not null)
            {
                ArrayPool<byte>.Shared.Return(buffer);
            }
        }
    }

    /// <inheritdoc />
    public void Keep(Design design, RuleSet ruleSet, DateOnly today, DesignResult result)
    {
        try
        {
            if (Store(design, ruleSet, today, result) is { } key)
            {
                stored.Add(design.Id.Value);
                if (HeadStart)
                {
                    EvaluationClaims.EvaluatedByHeadStart(key);
                }
            }
        }
        finally
        {
            // Written (or not): a run waiting for this design now reads the entry, or evaluates the design itself.
            if (claims.TryRemove(ClaimName(design), out var claim))
            {
                claim.Release();
            }
        }
    }

    /// <summary>Ends every claim this run still holds (a design whose check failed): waiting runs evaluate it themselves.</summary>
    public void Dispose()
    {
        foreach (var name in claims.Keys)
        {
            if (claims.TryRemove(name, out var claim))
            {
                claim.Release();
            }
        }
    }

    /// <summary>Writes the design's entry; its key when written, else null.</summary>
    private string? Store(Design design, RuleSet ruleSet, DateOnly today, DesignResult result)
    {
        if (!keys.TryGetValue(design.Id.Value, out var before) || Key(design, ruleSet, today, fresh: true) != before)
        {
            // A file the design depends on changed while it was checked: the result is of neither version; keep nothing.
            keys.TryRemove(design.Id.Value, out _);
            return null;
        }

        try
        {
            var payload = ResultCodec.Encode(result);
            var header = Encoding.UTF8.GetBytes($"{Magic} {ResultCodec.FormatVersion.ToString(CultureInfo.InvariantCulture)}\n{before}\n{Convert.ToHexString(SHA256.HashData(payload))}\n" +
                $"design {Convert.ToBase64String(Encoding.UTF8.GetBytes(Path.GetFullPath(design.File)))}\n");
            Directory.CreateDirectory(folder);
            var entry = EntryPath(design.File);
            var temporary = Path.Combine(folder, $".{Path.GetFileName(entry)}.{Environment.ProcessId}-{Guid.NewGuid():N}.partial");
            using (var stream = new FileStream(temporary, FileMode.CreateNew, FileAccess.Write, FileShare.None))
            {
                stream.Write(header);
                stream.Write(payload);
            }

            File.Move(temporary, entry, overwrite: true);
            return before;
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
        {
            // A cache that cannot be written costs time next run, never a result.
            return null;
        }
    }

    /// <summary>Removes the entries of design files that no longer exist, so that a deleted design leaves nothing behind.</summary>
    public void RemoveEntriesOfMissingDesigns()
    {
        if (!Directory.Exists(folder))
        {
            return;
        }

        var current = designFiles.Select(EntryPath).ToHashSet(StringComparer.Ordinal);
        foreach (var entry in Directory.EnumerateFiles(folder, "*.result"))
        {
            if (current.Contains(entry))
            {
                continue;
            }

            try
            {
                using var reader = new StreamReader(entry, Encoding.UTF8);
                reader.ReadLine();
                reader.ReadLine();
                reader.ReadLine();
                var design = reader.ReadLine();
                if (design is not null && design.StartsWith("design ", StringComparison.Ordinal))
                {
                    // Only an entry whose design file is gone: another repository sharing the folder keeps its own.
                    var file = Encoding.UTF8.GetString(Convert.FromBase64String(design["design ".Length..]));
                    if (!File.Exists(file))
                    {
                        reader.Dispose();
                        File.Delete(entry);
                    }
                }
            }
            catch (Exception ex) when (ex is IOException or UnauthorizedAccessException or FormatException)
            {
                // Left for the next run.
            }
        }
    }

    /// <summary>The page keys of the designs whose results have keys: a page is kept only while its key is unchanged.</summary>
    public PageReuse PageReuse(CheckReport report, RunRequest request)
    {
        var templates = new StringBuilder();
        if (request.TemplateFolder is { } templateFolder && Directory.Exists(templateFolder))
        {
            foreach (var template in Directory.EnumerateFiles(templateFolder).Order(StringComparer.Ordinal))
            {
                templates.Append(template).Append(' ').Append(HashFile(template)).Append('\n');
            }
        }

        // Each design's findings in the report's order, gathered in one pass (not a scan of every finding per design).
        var byDesign = report.Findings.Where(f => f.DesignId is not null).ToLookup(f => f.DesignId!, StringComparer.Ordinal);
        var templateText = templates.ToString();
        // Each design's key is its own (encoding and hashing its findings): taken side by side, on the build's critical path.
        var made = new string?[report.Designs.Count];
        Parallel.For(0, report.Designs.Count, new ParallelOptions { MaxDegreeOfParallelism = maxParallel ?? -1, TaskScheduler = TaskScheduler.Current }, i =>
        {
            var id = report.Designs[i].Design.Id.Value;
            if (keys.TryGetValue(id, out var key))
            {
                var text = new StringBuilder("result ").Append(key).Append('\n')
                    .Append("root ").Append(request.Root).Append('\n')
                    .Append("help ").Append(request.HelpUriBase).Append('\n')
                    .Append("templates\n").Append(templateText)
                    .Append("findings ").Append(Convert.ToHexString(SHA256.HashData(ResultCodec.EncodeFindings(byDesign[id])))).Append('\n');
                made[i] = Hash(text.ToString());
            }
        });

        var pageKeys = new Dictionary<string, string>(StringComparer.Ordinal);
        for (var i = 0; i < made.Length; i++)
        {
            if (made[i] is { } pageKey)
            {
                // In the designs' order, as before: of two designs with one id (DR909), the later one's key stands.
                pageKeys[report.Designs[i].Design.Id.Value] = pageKey;
            }
        }

        return new PageReuse(Path.Combine(folder, "pages.state"), pageKeys);
    }

    /// <summary>
    /// True when every file the design's key names has now, after loading, the content it had when the run began (so the
    /// design as loaded is the design the key names). Checked only after loading: the store is asked once every file is
    /// read, so one hash per file per run, taken on first need, stands for every design that uses the file.
    /// </summary>
    private bool Unchanged(Design design)
    {
        var designFile = Path.GetFullPath(design.File);
        if (!SameAsBefore(designFile))
        {
            return false;
        }

        foreach (var library in design.Libraries.Where(l => l.File != DesignLoader.BuiltinLibraryFile))
        {
            if (!SameAsBefore(Path.GetFullPath(library.File)))
            {
                return false;
            }
        }

        return true;
    }

    private bool SameAsBefore(string file)
    {
        var before = contentHashes.GetOrAdd(file, HashFile);
        return before is not null && loadedHashes.GetOrAdd(file, f => new Lazy<string?>(() => HashFile(f))).Value == before;
    }

    /// <summary>The key of a design's result; null when a file it depends on cannot be read.</summary>
    internal string? Key(Design design, RuleSet ruleSet, DateOnly today, bool fresh)
    {
        var text = new StringBuilder();
        text.Append(Magic).Append(' ').Append(ResultCodec.FormatVersion.ToString(CultureInfo.InvariantCulture)).Append('\n');
        // The design file's path leads the key text: findings name it, and a stale entry is found by it.
        var designFile = Path.GetFullPath(design.File);
        var designHash = fresh ? HashFile(designFile) : contentHashes.GetOrAdd(designFile, HashFile);
        if (designHash is null)
        {
            return null;
        }

        text.Append("design ").Append(designFile).Append(' ').Append(designHash).Append('\n');
        foreach (var library in design.Libraries.Where(l => l.File != DesignLoader.BuiltinLibraryFile))
        {
            var file = Path.GetFullPath(library.File);
            var hash = fresh ? HashFile(file) : contentHashes.GetOrAdd(file, HashFile);
            if (hash is null)
            {
                return null;
            }

            text.Append("parts ").Append(file).Append(' ').Append(hash).Append('\n');
        }

        if (design.Waivers.Count > 0)
        {
            text.Append("today ").Append(today.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture)).Append('\n');
        }

        RuleSetSections.Append(text, ruleSet, design.Id.Value);
        text.Append("tool\n").Append(tool);
        return Hash(text.ToString());
    }

    /// <summary>What a run that looked up every design holds: each design's result key by id, the design files, and the hits.</summary>
    internal sealed record Results(IReadOnlyDictionary<string, string> Keys, IReadOnlyList<string> DesignFiles, int Hits);

    /// <summary>Where the entry of a design file is kept: one entry per design file, named by a hash of its full path.</summary>
    private string EntryPath(string designFile) =>
        Path.Combine(folder, Hash(Path.GetFullPath(designFile))[..32] + ".result");

    /// <summary>The offset of the payload when the header is this format, this key and the payload's checksum holds; else -1.</summary>
    private static int Payload(ReadOnlySpan<byte> bytes, string key, out string checksum)
    {
        checksum = string.Empty;
        Span<int> lines = stackalloc int[4];
        var at = 0;
        for (var i = 0; i < 4; i++)
        {
            var end = bytes[at..].IndexOf((byte)'\n');
            if (end < 0)
            {
                return -1;
            }

            lines[i] = at + end;
            at = at + end + 1;
        }

        var magic = Encoding.UTF8.GetString(bytes[..lines[0]]);
        var storedKey = Encoding.UTF8.GetString(bytes[(lines[0] + 1)..lines[1]]);
        checksum = Encoding.UTF8.GetString(bytes[(lines[1] + 1)..lines[2]]);
        if (magic != $"{Magic} {ResultCodec.FormatVersion.ToString(CultureInfo.InvariantCulture)}" || storedKey != key
            || checksum != Convert.ToHexString(SHA256.HashData(bytes[at..])))
        {
            return -1;
        }

        return at;
    }

    private static string? HashFile(string file)
    {
        try
        {
            // Only regular files are cached by content; anything else (a pipe, a device) is never a key.
            var info = new FileInfo(file);
            if (!info.Exists || info.LinkTarget is not null && info.ResolveLinkTarget(true) is not FileInfo)
            {
                return null;
            }

            if (info.Length == 0)
            {
                // Never opened, as the loader never opens a file that reports no size (a pipe would block the run).
                return "empty";
            }

            return Convert.ToHexString(SHA256.HashData(File.ReadAllBytes(file)));
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException or ArgumentException or NotSupportedException)
        {
            return null;
        }
    }

    private static string Hash(string text) => Convert.ToHexString(SHA256.HashData(Encoding.UTF8.GetBytes(text)));
}
