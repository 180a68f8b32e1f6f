using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;

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
/// <para>The replay and its solve index the storage through positions their analysis computed from the pattern, all
/// within the n × n storage: checked once per call instead of at every entry (the per-entry bounds checks were a
/// large share of a replay, which a transient runs at every Newton iteration).</para>
/// </summary>
internal sealed class SparseRefactor
{
    private readonly int n;
    private readonly bool[] loaded;
    private readonly bool[] structure;
    private readonly int[] pivotOf;
    private readonly int[] factorFirst;
    private readonly int[] factorLast;

    // The step lists of the recorded interchanges (Analyse). Kept and refilled at every analysis rather than allocated
    // anew: a transient records fresh interchanges about a hundred times (about 1 % of its factorisations), and each
    // analysis allocated some ten lists and arrays.
    private readonly int[] lowerStart;
    private readonly int[] upperStart;
    private readonly int[] swapStart;
    private readonly int[] solveLowerStart;
    private readonly int[] solveUpperStart;
    private readonly List<int> lowerRowBase = [];
    private readonly List<bool> lowerStrict = [];
    private readonly List<int> upperColumn = [];
    private readonly List<int> swapColumn = [];
    private readonly List<int> positions = [];
    private readonly List<int> positionColumn = [];
    private readonly List<int> factorPositions = [];
    private readonly List<int> solveLower = [];
    private readonly List<int> solveUpper = [];
    private readonly List<double> saved = [];
    private bool recorded;
    private bool analysed;

    public SparseRefactor(int size)
    {
        n = size;
        loaded = new bool[size * size];
        structure = new bool[size * size];
        pivotOf = new int[size];
        factorFirst = new int[size];
        factorLast = new int[size];
        lowerStart = new int[size + 1];
        upperStart = new int[size + 1];
        swapStart = new int[size + 1];
        solveLowerStart = new int[size + 1];
        solveUpperStart = new int[size + 1];
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
        CheckLengths(a, b, rowOfStep);
        for (int k = 0; k < size; k++)
        {
            int p = rowOfStep[k];
            if (p != k) (b[k], b[p]) = (b[p], b[k]);
        }

        // Columns below n and rows' bases below n·n (Analyse): within a and b, checked above.
        ref double entry = ref MemoryMarshal.GetArrayDataReference(a);
        ref double x = ref MemoryMarshal.GetArrayDataReference(b);
        ref int lStart = ref MemoryMarshal.GetArrayDataReference(solveLowerStart);
        ref int lower = ref MemoryMarshal.GetReference(CollectionsMarshal.AsSpan(solveLower));
        for (int r = 1; r < size; r++)
        {
            double sum = Unsafe.Add(ref x, r);
            int rowBase = r * size;
            int to = Unsafe.Add(ref lStart, r + 1);
            for (int e = Unsafe.Add(ref lStart, r); e < to; e++)
            {
                int c = Unsafe.Add(ref lower, e);
                sum -= Unsafe.Add(ref entry, rowBase + c) * Unsafe.Add(ref x, c);
            }

            Unsafe.Add(ref x, r) = sum;
        }

        ref int uStart = ref MemoryMarshal.GetArrayDataReference(solveUpperStart);
        ref int upper = ref MemoryMarshal.GetReference(CollectionsMarshal.AsSpan(solveUpper));
        for (int r = size - 1; r >= 0; r--)
        {
            double sum = Unsafe.Add(ref x, r);
            int rowBase = r * size;
            int to = Unsafe.Add(ref uStart, r + 1);
            for (int e = Unsafe.Add(ref uStart, r); e < to; e++)
            {
                int c = Unsafe.Add(ref upper, e);
                sum -= Unsafe.Add(ref entry, rowBase + c) * Unsafe.Add(ref x, c);
            }

            Unsafe.Add(ref x, r) = sum / Unsafe.Add(ref entry, rowBase + r);
        }
    }

    /// <summary>
    /// Zeroes the replayed factors in <paramref name="a"/> (only while <see cref="Factored"/>): every other entry of the
    /// storage is an exact zero already, so this leaves the storage as clearing all of it would, in a fraction of the stores.
    /// </summary>
    public void ClearFactors(double[] a)
    {
        var factors = CollectionsMarshal.AsSpan(factorPositions);
        for (int t = 0; t < factors.Length; t++) a[factors[t]] = 0;
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
        CheckLengths(a, columnScale, rowOfStep);

        // Every position and row base below was numbered by Analyse within the n × n storage (checked above).
        ref double entry = ref MemoryMarshal.GetArrayDataReference(a);
        ref double scale = ref MemoryMarshal.GetArrayDataReference(columnScale);
        var at = CollectionsMarshal.AsSpan(positions);
        var keep = CollectionsMarshal.AsSpan(saved);
        var atColumn = CollectionsMarshal.AsSpan(positionColumn);
        for (int c = 0; c < n; c++) Unsafe.Add(ref scale, c) = 0;
        for (int t = 0; t < at.Length; t++)
        {
            double v = Unsafe.Add(ref entry, at[t]);
            if (!double.IsFinite(v)) return false;
            keep[t] = v;
            double m = Math.Abs(v);
            ref double columnMaximum = ref Unsafe.Add(ref scale, atColumn[t]);
            if (m > columnMaximum) columnMaximum = m;
        }

        // The row extents are left as they are until the replay succeeds (then set to the factors'), so a replay given up
        // leaves them as loaded without a copy to restore.
        var lStart = lowerStart;
        ref int lRowBase = ref MemoryMarshal.GetReference(CollectionsMarshal.AsSpan(lowerRowBase));
        var lStrict = CollectionsMarshal.AsSpan(lowerStrict);
        var uStart = upperStart;
        ref int uColumn = ref MemoryMarshal.GetReference(CollectionsMarshal.AsSpan(upperColumn));
        var sStart = swapStart;
        ref int sColumn = ref MemoryMarshal.GetReference(CollectionsMarshal.AsSpan(swapColumn));
        for (int k = 0; k < n; k++)
        {
            int p = pivotOf[k];
            if (p != k)
            {
                // The dense LU exchanges the whole rows; outside the pattern both hold exact zeros, so exchanging the
                // pattern's columns of either row leaves the same bits.
                int kBase = k * n, pBase = p * n;
                for (int e = sStart[k]; e < sStart[k + 1]; e++)
                {
                    int c = Unsafe.Add(ref sColumn, e);
                    ref double first = ref Unsafe.Add(ref entry, kBase + c);
                    ref double second = ref Unsafe.Add(ref entry, pBase + c);
                    (first, second) = (second, first);
                }
            }

            int pivotBase = k * n;
            double pivot = Unsafe.Add(ref entry, pivotBase + k);
            double magnitude = Math.Abs(pivot);
            bool usable = magnitude > 1e-14 * Unsafe.Add(ref scale, k) && double.IsFinite(magnitude);
            int lFrom = lStart[k], lTo = lStart[k + 1];
            for (int e = lFrom; usable && e < lTo; e++)
            {
                double m = Math.Abs(Unsafe.Add(ref entry, Unsafe.Add(ref lRowBase, e) + k));
                if (m > magnitude || (m == magnitude && lStrict[e]) || !double.IsFinite(m)) usable = false;
            }

            if (!usable)
            {
                Restore(a);
                return false;
            }

            rowOfStep[k] = p;
            int uFrom = uStart[k], uTo = uStart[k + 1];
            for (int e = lFrom; e < lTo; e++)
            {
                int rowBase = Unsafe.Add(ref lRowBase, e);
                ref double multiplier = ref Unsafe.Add(ref entry, rowBase + k);
                double factor = multiplier;
                if (factor == 0) continue;
                factor /= pivot;
                multiplier = factor;
                for (int u = uFrom; u < uTo; u++)
                {
                    int c = Unsafe.Add(ref uColumn, u);
                    Unsafe.Add(ref entry, rowBase + c) -= factor * Unsafe.Add(ref entry, pivotBase + c);
                }
            }
        }

        // A value that overflowed on the way would have met zeros the dense LU multiplies and this one skips. Only the
        // factors right of the diagonal are looked at here: every multiplier and pivot passed the finite test of its step
        // (a multiplier is at most 1 in size, as no candidate exceeds its pivot), and none changes after it.
        var uStartSolve = solveUpperStart;
        var upper = CollectionsMarshal.AsSpan(solveUpper);
        for (int r = 0; r < n; r++)
        {
            int rowBase = r * n;
            for (int e = uStartSolve[r]; e < uStartSolve[r + 1]; e++)
            {
                if (!double.IsFinite(Unsafe.Add(ref entry, rowBase + upper[e])))
                {
                    Restore(a);
                    return false;
                }
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

    /// <summary>The storage, the vector and the step list a replay or its solve indexes without a check per entry.</summary>
    private void CheckLengths(double[] a, double[] vector, int[] rowOfStep)
    {
        if (a.Length < n * n || vector.Length < n || rowOfStep.Length < n) throw new ArgumentException("the system's arrays are smaller than its order");
    }

    private void Restore(double[] a)
    {
        Array.Clear(a, 0, n * n);
        for (int t = 0; t < positions.Count; t++) a[positions[t]] = saved[t];
        Fallbacks++;
        recorded = false;
        analysed = false;
    }

    /// <summary>The fill and the step lists of the recorded interchanges on the loaded pattern (a boolean elimination).</summary>
    private void Analyse()
    {
        int size = n;
        Array.Copy(loaded, structure, size * size);
        var lStart = lowerStart;
        var uStart = upperStart;
        var sStart = swapStart;
        var lRowBase = lowerRowBase;
        var lStrict = lowerStrict;
        var uColumn = upperColumn;
        var sColumn = swapColumn;
        lRowBase.Clear();
        lStrict.Clear();
        uColumn.Clear();
        sColumn.Clear();
        for (int k = 0; k < size; k++)
        {
            int p = pivotOf[k];
            sStart[k] = sColumn.Count;
            if (p != k)
            {
                // The columns either row may hold a non-zero in when they are exchanged (see TryFactor).
                for (int c = 0; c < size; c++)
                {
                    if (structure[(k * size) + c] || structure[(p * size) + c]) sColumn.Add(c);
                }

                Swap(structure, k * size, p * size, size);
            }

            lStart[k] = lRowBase.Count;
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
                lRowBase.Add(r * size);
                lStrict.Add(before < p);
                for (int u = uStart[k]; u < uColumn.Count; u++) structure[(r * size) + uColumn[u]] = true;
            }
        }

        lStart[size] = lRowBase.Count;
        uStart[size] = uColumn.Count;
        sStart[size] = sColumn.Count;
        var at = positions;
        var atColumn = positionColumn;
        var factors = factorPositions;
        var sLower = solveLower;
        var sUpper = solveUpper;
        at.Clear();
        atColumn.Clear();
        factors.Clear();
        sLower.Clear();
        sUpper.Clear();
        var sLowerStart = solveLowerStart;
        var sUpperStart = solveUpperStart;
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
        CollectionsMarshal.SetCount(saved, at.Count);
        analysed = true;
    }
}
