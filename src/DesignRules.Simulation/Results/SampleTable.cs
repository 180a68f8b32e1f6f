using System.Runtime.CompilerServices;

namespace DesignRules.Simulation.Results;

/// <summary>Growable row-major table of recorded samples (one row per time point, sweep value or frequency).</summary>
/// <typeparam name="T">Sample value type.</typeparam>
/// <remarks>
/// The rows are kept in chunks of at most <see cref="ChunkBytes"/> each, never in one array: a settled transient records
/// thousands of rows of some forty values (1.4 MB), and one array that size lives on the large-object heap, which only a
/// full (generation 2) collection reclaims; a check of one design that ran sixteen such transients spent a tenth of its
/// processor time in those collections and in what runs after each (the shared array pools' trimming). Chunks are
/// ordinary small objects, collected young, and a table that grows allocates one more chunk instead of copying all its
/// rows into an array twice the size. Only storage changes: every value read back is the one stored.
/// </remarks>
/// <param name="width">Values per row.</param>
/// <param name="rows">Rows to make room for at once: the count where it is known (an AC sweep's frequencies), so that
/// the table is allocated once at its size rather than grown by doubling (up to one chunk).</param>
internal sealed class SampleTable<T>(int width, int rows = 64)
{
    /// <summary>The most bytes one chunk holds: below the runtime's 85,000-byte threshold of the large-object heap.</summary>
    internal const int ChunkBytes = 64 * 1024;

    // Rows per chunk: a power of two (row → chunk by a shift), at least one, as many as fit in ChunkBytes.
    private readonly int shift = ChunkShift(width);
    private readonly List<T[]> chunks = [];
    private readonly int firstRows = Math.Max(rows, 1);

    public int Width { get; } = width;

    public int Count { get; private set; }

    /// <summary>Rows per chunk (for tests).</summary>
    internal int RowsPerChunk => 1 << shift;

    /// <summary>Appends a row and returns it for filling.</summary>
    public Span<T> AddRow()
    {
        int row = Count;
        int chunk = row >> shift;
        int offset = (row & (RowsPerChunk - 1)) * Width;
        if (chunk == chunks.Count)
        {
            // A new chunk: the first sized for the rows asked for (at most a chunk), every later one full.
            int chunkRows = chunk == 0 ? Math.Min(firstRows, RowsPerChunk) : RowsPerChunk;
            chunks.Add(new T[Math.Max(Width, 1) * chunkRows]);
        }
        else if (offset + Width > chunks[chunk].Length)
        {
            // Only the first chunk can be short (sized for fewer rows than a chunk holds): grow it by doubling, up to a chunk.
            var data = chunks[chunk];
            int grown = Math.Min(RowsPerChunk, Math.Max(2 * (data.Length / Math.Max(Width, 1)), (offset / Math.Max(Width, 1)) + 1));
            Array.Resize(ref data, Math.Max(Width, 1) * grown);
            chunks[chunk] = data;
        }

        Count++;
        return chunks[chunk].AsSpan(offset, Width);
    }

    /// <summary>Removes the last row.</summary>
    public void RemoveLast() => Count--;

    /// <summary>One value.</summary>
    public T this[int row, int column] => chunks[row >> shift][((row & (RowsPerChunk - 1)) * Width) + column];

    /// <summary>A column as a fresh array; column −1 (the reference) gives zeros.</summary>
    public T[] Column(int column)
    {
        var result = new T[Count];
        if (column < 0) return result;
        int perChunk = RowsPerChunk;
        for (int c = 0, r = 0; r < Count; c++)
        {
            var data = chunks[c];
            int end = Math.Min(Count, r + perChunk);
            for (int at = column; r < end; r++, at += Width) result[r] = data[at];
        }

        return result;
    }

    private static int ChunkShift(int width)
    {
        long rowBytes = (long)Math.Max(width, 1) * Unsafe.SizeOf<T>();
        int shift = 0;
        while (shift < 30 && rowBytes << (shift + 1) <= ChunkBytes) shift++;
        return shift;
    }
}
