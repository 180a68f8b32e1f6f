using System.Collections.Concurrent;

namespace DesignRules.Run;

/// <summary>
/// Cache entries already parsed by this process, by the SHA-256 of their payload bytes. In a long-lived process (the warm
/// evaluation server) an unchanged design then costs reading and hashing its entry, not parsing it again. The memo never
/// decides whether an entry applies — the entry's key, checked on every run, does that — it only stands for the parse of
/// bytes with the same hash, so it cannot replay a stale result. Bounded: past <see cref="Capacity"/> entries it starts
/// afresh.
/// </summary>
internal static class DecodedEntries
{
    /// <summary>How many parsed entries a process keeps (a 500-design repository's, twice over; a few megabytes).</summary>
    public const int Capacity = 1024;

    private static readonly ConcurrentDictionary<string, ResultCodec.StoredResult> Parsed = new(StringComparer.Ordinal);

    /// <summary>The parsed form of <paramref name="payload"/>, whose verified SHA-256 is <paramref name="checksum"/>.</summary>
    public static ResultCodec.StoredResult Get(string checksum, ReadOnlySpan<byte> payload)
    {
        if (Parsed.TryGetValue(checksum, out var known))
        {
            return known;
        }

        var stored = ResultCodec.Read(payload);
        if (Parsed.Count >= Capacity)
        {
            Parsed.Clear();
        }

        Parsed[checksum] = stored;
        return stored;
    }

    /// <summary>How many parsed entries are kept now (tests).</summary>
    internal static int Count => Parsed.Count;
}
