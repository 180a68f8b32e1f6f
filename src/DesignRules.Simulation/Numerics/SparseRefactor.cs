namespace DesignRules.Simulation.Numerics;

/// <summary>
/// The dense partial-pivoting LU of <see cref="DenseLu{T}"/> (real, dense storage) replayed on its pattern: a transient's
/// Newton iterations factor one circuit tens of thousands of times, and nearly always with the same row interchanges.
/// After a dense factorisation this records its interchanges and, from the positions loaded, the fill they make; later
/// factorisations run only the multipliers and updates of that pattern, in the dense LU's order, so the factors are the
/// same bits (an update skipped is x − m·0, which is x). Each step checks that partial pivoting would choose the same
/// row (no other candidate larger, none as large that the dense LU meets first) and that the pivot passes the dense LU's
/// singularity test; any entry not finite, a new position loaded, or a check failing restores the loaded matrix and
/// leaves the factorisation to the dense LU, whose interchanges are then recorded afresh. So every system is factored
/// exactly as the dense LU factors it, and only the time differs.
/// </summary>
internal sealed class SparseRefactor
{
    private readonly int n;
    private readonly bool[] loaded;
    private readonly bool[] structure;
    private readonly int[] pivotOf;
    private readonly int[] savedFirst;
    private readonly int[] savedLast;
    private readonly int[] factorFirst;
    private readonly int[] factorLast;
    private int[] lowerStart = [];
    private int[] lowerRow = [];
    private bool[] lowerStrict = [];
    private int[] upperStart = [];
    private int[] upperColumn = [];
    private int[] positions = [];
    private int[] positionColumn = [];
    private int[] factorPositions = [];
    private int[] solveLowerStart = [];
    private int[] solveLower = [];
    private int[] solveUpperStart = [];
    private int[] solveUpper = [];
    private double[] saved = [];
    private bool recorded;
    private bool analysed;

    public SparseRefactor(int size)
    {
        n = size;
        loaded = new bool[size * size];
        structure = new bool[size * size];
        pivotOf = new int[size];
        savedFirst = new int[size];
        savedLast = new int[size];
        factorFirst = new int[size];
        factorLast = new int[size];
    }

    /// <summary>Factorisations replayed (for tests).</summary>
    public int Replayed { get; private set; }

    /// <summary>Factorisations left to the dense LU after the pattern was known (for tests).</summary>
    public int Fallbacks { get; private set; }

    /// <summary>True when the factors in the storage are a replay's (solve them with <see cref="Solve"/>).</summary>
    public bool Factored { get; private set; }

    /// <summary>
    /// Solves with replayed factors as the dense LU's solve does (the interchanges, then each row's sum in column order),
    /// over the factors' non-zero positions only; the solution replaces <paramref name="b"/>. Reads the factors only.
    /// </summary>
    public void Solve(double[] a, double[] b, int[] rowOfStep)
    {
        int size = n;
        for (int k = 0; k < size; k++)
        {
            int p = rowOfStep[k];
            if (p != k) (b[k], b[p]) = (b[p], b[k]);
        }

        var lStart = solveLowerStart;
        var lower = solveLower;
        for (int r = 1; r < size; r++)
        {
            double sum = b[r];
            int rowBase = r * size;
            for (int e = lStart[r]; e < lStart[r + 1]; e++) sum -= a[rowBase + lower[e]] * b[lower[e]];
            b[r] = sum;
        }

        var uStart = solveUpperStart;
        var upper = solveUpper;
        for (int r = size - 1; r >= 0; r--)
        {
            double sum = b[r];
            int rowBase = r * size;
            for (int e = uStart[r]; e < uStart[r + 1]; e++) sum -= a[rowBase + upper[e]] * b[upper[e]];
            b[r] = sum / a[rowBase + r];
        }
    }

    /// <summary>The storage no longer holds replayed factors (cleared, or factored dense).</summary>
    public void Unfactored() => Factored = false;

    /// <summary>Notes a position loaded (flat row-major index); a new one makes the next factorisation dense.</summary>
    public void Loaded(int index)
    {
        if (loaded[index]) return;
        loaded[index] = true;
        analysed = false;
    }

    /// <summary>
    /// Replays the recorded factorisation on <paramref name="a"/> (loaded only at noted positions, row extents
    /// <paramref name="rowFirst"/>..<paramref name="rowLast"/>). True when done (the factors, <paramref name="rowOfStep"/>
    /// and the extents then are what the dense LU leaves for its solve); false with everything as loaded otherwise.
    /// </summary>
    public bool TryFactor(double[] a, double[] columnScale, int[] rowOfStep, int[] rowFirst, int[] rowLast)
    {
        Factored = false;
        if (!recorded) return false;
        if (!analysed) Analyse();
        var at = positions;
        var keep = saved;
        for (int c = 0; c < n; c++) columnScale[c] = 0;
        for (int t = 0; t < at.Length; t++)
        {
            double v = a[at[t]];
            if (!double.IsFinite(v)) return false;
            keep[t] = v;
            double m = Math.Abs(v);
            int c = positionColumn[t];
            if (m > columnScale[c]) columnScale[c] = m;
        }

        Array.Copy(rowFirst, savedFirst, n);
        Array.Copy(rowLast, savedLast, n);
        var lStart = lowerStart;
        var lRow = lowerRow;
        var lStrict = lowerStrict;
        var uStart = upperStart;
        var uColumn = upperColumn;
        for (int k = 0; k < n; k++)
        {
            int p = pivotOf[k];
            if (p != k)
            {
                Swap(a, k * n, p * n, n);
            }

            int pivotBase = k * n;
            double pivot = a[pivotBase + k];
            double magnitude = Math.Abs(pivot);
            bool usable = magnitude > 1e-14 * columnScale[k] && double.IsFinite(magnitude);
            for (int e = lStart[k]; usable && e < lStart[k + 1]; e++)
            {
                double m = Math.Abs(a[(lRow[e] * n) + k]);
                if (m > magnitude || (m == magnitude && lStrict[e]) || !double.IsFinite(m)) usable = false;
            }

            if (!usable)
            {
                Restore(a, rowFirst, rowLast);
                return false;
            }

            rowOfStep[k] = p;
            int uFrom = uStart[k], uTo = uStart[k + 1];
            for (int e = lStart[k]; e < lStart[k + 1]; e++)
            {
                int rowBase = lRow[e] * n;
                double factor = a[rowBase + k];
                if (factor == 0) continue;
                factor /= pivot;
                a[rowBase + k] = factor;
                for (int u = uFrom; u < uTo; u++)
                {
                    int c = uColumn[u];
                    a[rowBase + c] -= factor * a[pivotBase + c];
                }
            }
        }

        // A value that overflowed on the way would have met zeros the dense LU multiplies and this one skips.
        var factors = factorPositions;
        for (int t = 0; t < factors.Length; t++)
        {
            if (!double.IsFinite(a[factors[t]]))
            {
                Restore(a, rowFirst, rowLast);
                return false;
            }
        }

        Array.Copy(factorFirst, rowFirst, n);
        Array.Copy(factorLast, rowLast, n);
        Replayed++;
        Factored = true;
        return true;
    }

    /// <summary>Records the interchanges of a dense factorisation that succeeded, to replay from the next one on.</summary>
    public void Record(int[] rowOfStep)
    {
        Array.Copy(rowOfStep, pivotOf, n);
        recorded = true;
        analysed = false;
    }

    /// <summary>Forgets the recorded interchanges (the dense LU failed or the storage was overwritten).</summary>
    public void Forget()
    {
        recorded = false;
        analysed = false;
    }

    private static void Swap<TValue>(TValue[] array, int first, int second, int length)
    {
        for (int i = 0; i < length; i++) (array[first + i], array[second + i]) = (array[second + i], array[first + i]);
    }

    private void Restore(double[] a, int[] rowFirst, int[] rowLast)
    {
        Array.Clear(a, 0, n * n);
        for (int t = 0; t < positions.Length; t++) a[positions[t]] = saved[t];
        Array.Copy(savedFirst, rowFirst, n);
        Array.Copy(savedLast, rowLast, n);
        Fallbacks++;
        recorded = false;
        analysed = false;
    }

    /// <summary>The fill and the step lists of the recorded interchanges on the loaded pattern (a boolean elimination).</summary>
    private void Analyse()
    {
        int size = n;
        Array.Copy(loaded, structure, size * size);
        var lStart = new int[size + 1];
        var uStart = new int[size + 1];
        var lRow = new List<int>();
        var lStrict = new List<bool>();
        var uColumn = new List<int>();
        for (int k = 0; k < size; k++)
        {
            int p = pivotOf[k];
            if (p != k)
            {
                Swap(structure, k * size, p * size, size);
            }

            lStart[k] = lRow.Count;
            uStart[k] = uColumn.Count;
            for (int c = k + 1; c < size; c++)
            {
                if (structure[(k * size) + c]) uColumn.Add(c);
            }

            for (int r = k + 1; r < size; r++)
            {
                if (!structure[(r * size) + k]) continue;

                // Where the row stood when the dense LU searched the column (before the interchange): one met before the
                // chosen row must be strictly smaller for the dense LU to pass it by.
                int before = r == p ? k : r;
                lRow.Add(r);
                lStrict.Add(before < p);
                for (int u = uStart[k]; u < uColumn.Count; u++) structure[(r * size) + uColumn[u]] = true;
            }
        }

        lStart[size] = lRow.Count;
        uStart[size] = uColumn.Count;
        lowerStart = lStart;
        upperStart = uStart;
        lowerRow = [.. lRow];
        lowerStrict = [.. lStrict];
        upperColumn = [.. uColumn];
        var at = new List<int>();
        var atColumn = new List<int>();
        var factors = new List<int>();
        var sLowerStart = new int[size + 1];
        var sUpperStart = new int[size + 1];
        var sLower = new List<int>();
        var sUpper = new List<int>();
        for (int r = 0; r < size; r++)
        {
            factorFirst[r] = size;
            factorLast[r] = -1;
            sLowerStart[r] = sLower.Count;
            sUpperStart[r] = sUpper.Count;
            for (int c = 0; c < size; c++)
            {
                if (loaded[(r * size) + c])
                {
                    at.Add((r * size) + c);
                    atColumn.Add(c);
                }

                if (!structure[(r * size) + c]) continue;
                factors.Add((r * size) + c);
                if (c < r) sLower.Add(c);
                if (c > r) sUpper.Add(c);
                factorFirst[r] = Math.Min(factorFirst[r], c);
                factorLast[r] = Math.Max(factorLast[r], c);
            }
        }

        sLowerStart[size] = sLower.Count;
        sUpperStart[size] = sUpper.Count;
        solveLowerStart = sLowerStart;
        solveUpperStart = sUpperStart;
        solveLower = [.. sLower];
        solveUpper = [.. sUpper];
        factorPositions = [.. factors];
        positionColumn = [.. atColumn];
        positions = [.. at];
        saved = new double[positions.Length];
        analysed = true;
    }
}
