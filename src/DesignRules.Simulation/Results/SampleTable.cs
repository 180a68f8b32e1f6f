namespace DesignRules.Simulation.Results;

/// <summary>Growable row-major table of recorded samples (one row per time point, sweep value or frequency).</summary>
/// <typeparam name="T">Sample value type.</typeparam>
/// <param name="width">Values per row.</param>
/// <param name="rows">Rows to make room for at once: the count where it is known (an AC sweep's frequencies), so that
/// the table is allocated once at its size rather than grown by doubling.</param>
internal sealed class SampleTable<T>(int width, int rows = 64)
{
    private T[] data = new T[Math.Max(width, 1) * Math.Max(rows, 1)];

    public int Width { get; } = width;

    public int Count { get; private set; }

    /// <summary>Appends a row and returns it for filling.</summary>
    public Span<T> AddRow()
    {
        int needed = (Count + 1) * Width;
        if (needed > data.Length) Array.Resize(ref data, Math.Max(needed, data.Length * 2));
        Count++;
        return data.AsSpan((Count - 1) * Width, Width);
    }

    /// <summary>Removes the last row.</summary>
    public void RemoveLast() => Count--;

    /// <summary>One value.</summary>
    public T this[int row, int column] => data[(row * Width) + column];

    /// <summary>A column as a fresh array; column −1 (the reference) gives zeros.</summary>
    public T[] Column(int column)
    {
        var result = new T[Count];
        if (column < 0) return result;
        for (int r = 0; r < Count; r++) result[r] = data[(r * Width) + column];
        return result;
    }
}
