using System.Numerics;
using System.Runtime.CompilerServices;

namespace DesignRules.Simulation.Numerics;

/// <summary>
/// In-place LU factorisation with partial (row) pivoting, allocation-free after construction (the engine factors a fresh
/// matrix at every Newton iteration, so it keeps its own buffers). Small systems are stored dense (flat row-major);
/// a large one is stored as a band after a bandwidth-reducing renumbering (<see cref="BandOrdering"/>): row pivoting
/// within the band (as in LINPACK's banded factorisation) widens the upper band by the lower bandwidth, and an entry
/// loaded outside the band widens the band, so any pattern is solved exactly. Unknowns keep their own numbers in every
/// call: the renumbering is internal. Works for real and complex matrices.
/// </summary>
/// <typeparam name="T">double or <see cref="Complex"/>.</typeparam>
internal sealed class DenseLu<T>
    where T : struct, INumberBase<T>
{
    /// <summary>Largest order stored dense; above it a system with an ordering is banded.</summary>
    public const int DenseLimit = 32;

    private readonly int[] rowOfStep;
    private readonly double[] columnScale;
    private readonly BandOrdering? ordering;
    private readonly T[] work;
    private readonly HashSet<(int, int)>? recorded;

    // Dense storage only: per row, the first and last column that may hold a non-zero since the last Clear (loaded by Add
    // or filled in by Factor); every entry outside is exactly zero. A circuit's rows are short (a node meets a few
    // elements), so Clear, Factor and Solve skip the long runs of zeros: skipping them changes no bit of a finite
    // result (x − 0·y is x), only the time.
    private readonly int[] rowFirst;
    private readonly int[] rowLast;
    private bool tracked;
    private SparseRefactor? sparse;
    private bool patternKnown;
    private T[] matrix;
    private int lower;
    private int upper;
    private int width;

    public DenseLu(int size, BandOrdering? ordering = null)
    {
        Size = size;
        rowOfStep = new int[size];
        columnScale = new double[size];
        Rhs = new T[size];
        this.ordering = ordering;
        work = ordering is null ? [] : new T[size];
        rowFirst = new int[ordering is null ? size : 0];
        rowLast = new int[ordering is null ? size : 0];
        if (ordering is null)
        {
            matrix = new T[size * size];
            tracked = true;
            ResetExtents();
        }
        else
        {
            lower = ordering.Lower;
            upper = ordering.Upper;
            width = (2 * lower) + upper + 1;
            matrix = new T[size * width];
        }
    }

    private DenseLu(int size, HashSet<(int, int)> recorded)
    {
        Size = size;
        rowOfStep = [];
        columnScale = [];
        work = [];
        rowFirst = [];
        rowLast = [];
        Rhs = new T[size];
        matrix = [];
        this.recorded = recorded;
    }

    /// <summary>Order of the system.</summary>
    public int Size { get; }

    /// <summary>True when the system is stored as a band.</summary>
    public bool IsBanded => ordering is not null;

    /// <summary>The storage (row-major dense, or the band); overwritten by the factors. Copy it only between systems of one ordering.</summary>
    public T[] Matrix
    {
        get
        {
            // A caller that reads or writes the storage itself bypasses the row extents: from then on this system clears,
            // factors and solves over every entry.
            tracked = false;
            sparse?.Unfactored();
            return matrix;
        }
    }

    /// <summary>Right-hand side; overwritten by the solution in <see cref="Solve()"/>.</summary>
    public T[] Rhs { get; }

    /// <summary>
    /// Replays the last factorisation's row interchanges on its pattern (<see cref="SparseRefactor"/>) where it can: a real
    /// system stored dense whose storage no caller reads directly, factored many times with one pattern. The factors are
    /// the same bits as the dense LU's; a factorisation where partial pivoting would choose another row is left to the
    /// dense LU. Set it before loading: the pattern is learned from the loads after the next <see cref="Clear"/>.
    /// </summary>
    public bool PreferSparse
    {
        get => sparse is not null;
        set
        {
            if (value && sparse is null && ordering is null && recorded is null && typeof(T) == typeof(double))
            {
                sparse = new SparseRefactor(Size);
                patternKnown = false;
            }
            else if (!value)
            {
                sparse = null;
            }
        }
    }

    /// <summary>The sparse LU in use, if any (for tests).</summary>
    internal SparseRefactor? Sparse => sparse;

    /// <summary>A system that only records where entries are added (to compute an ordering), storing nothing.</summary>
    public static DenseLu<T> Recorder(int size, HashSet<(int, int)> into) => new(size, into);

    /// <summary>Zeroes matrix and right-hand side.</summary>
    public void Clear()
    {
        if (tracked)
        {
            if (sparse is { Factored: true })
            {
                // Replayed factors lie on the replay's pattern only (the rows' extents cover it and more).
                sparse.ClearFactors((double[])(object)matrix);
            }
            else
            {
                int n = Size;
                for (int r = 0; r < n; r++)
                {
                    if (rowLast[r] >= rowFirst[r]) Array.Clear(matrix, (r * n) + rowFirst[r], rowLast[r] - rowFirst[r] + 1);
                }
            }

            ResetExtents();
            patternKnown = true;
            sparse?.Unfactored();
        }
        else
        {
            Array.Clear(matrix);
        }

        Array.Clear(Rhs);
    }

    private void ResetExtents()
    {
        Array.Fill(rowFirst, Size);
        Array.Fill(rowLast, -1);
    }

    /// <summary>Every row may hold a non-zero anywhere (after a copy of another system's entries).</summary>
    private void FullExtents()
    {
        Array.Fill(rowFirst, 0);
        Array.Fill(rowLast, Size - 1);
    }

    /// <summary>Adds <paramref name="value"/> at (row, column), both unknowns (not the reference).</summary>
    public void Add(int row, int column, T value)
    {
        if (recorded is not null)
        {
            recorded.Add((row, column));
            return;
        }

        if (ordering is null)
        {
            int at = (row * Size) + column;
            matrix[at] += value;
            sparse?.Loaded(at);

            // Untracked (a caller reads the storage itself), the extents are never read before FactorDense sets them full.
            if (!tracked) return;
            if (column < rowFirst[row]) rowFirst[row] = column;
            if (column > rowLast[row]) rowLast[row] = column;
            return;
        }

        int r = ordering.NewOf[row], c = ordering.NewOf[column];
        int d = c - r;
        if (d < -lower || d > upper) Widen(Math.Max(lower, -d), Math.Max(upper, d));
        matrix[(r * width) + d + lower] += value;
    }

    /// <summary>rhs − A·x, with the matrix as loaded (before <see cref="Factor"/>), into <paramref name="result"/>.</summary>
    public void Residual(T[] x, T[] result)
    {
        int n = Size;
        if (ordering is null)
        {
            for (int r = 0; r < n; r++)
            {
                T sum = Rhs[r];
                int row = r * n;
                for (int c = 0; c < n; c++) sum -= matrix[row + c] * x[c];
                result[r] = sum;
            }

            return;
        }

        for (int r = 0; r < n; r++)
        {
            int old = ordering.OldOf[r];
            T sum = Rhs[old];
            int row = r * width;
            int from = Math.Max(0, r - lower), to = Math.Min(n - 1, r + upper);
            for (int c = from; c <= to; c++) sum -= matrix[row + c - r + lower] * x[ordering.OldOf[c]];
            result[old] = sum;
        }
    }

    /// <summary>Copies the loaded matrix of <paramref name="other"/> (a system of the same order and ordering).</summary>
    public void CopyMatrixFrom(DenseLu<T> other)
    {
        if (other.matrix.Length != matrix.Length)
        {
            lower = other.lower;
            upper = other.upper;
            width = other.width;
            matrix = new T[other.matrix.Length];
        }

        Array.Copy(other.matrix, matrix, matrix.Length);
        if (rowFirst.Length > 0) FullExtents();
        patternKnown = false;
        sparse?.Unfactored();
    }

    /// <summary>Factors the matrix in place. Returns −1 on success or the index of the unknown (column) found singular.</summary>
    public int Factor()
    {
        if (ordering is not null) return FactorBand();
        if (sparse is null) return FactorDense();
        sparse.Unfactored();
        if (!tracked || !patternKnown)
        {
            sparse.Forget();
            return FactorDense();
        }

        if (sparse.TryFactor((double[])(object)matrix, columnScale, rowOfStep, rowFirst, rowLast)) return -1;
        int singular = FactorDense();
        if (singular < 0)
        {
            sparse.Record(rowOfStep);
        }
        else
        {
            sparse.Forget();
        }

        return singular;
    }

    /// <summary>Solves with the factors; the solution replaces <see cref="Rhs"/>.</summary>
    public void Solve() => Solve(Rhs, work);

    /// <summary>
    /// Solves with the factors for the right-hand side <paramref name="b"/>, which the solution replaces; reads the factors
    /// only, so several threads may solve with one factored system at once, each with its own <paramref name="b"/> and
    /// <paramref name="scratch"/> (of the system's order).
    /// </summary>
    public void Solve(T[] b, T[] scratch)
    {
        if (sparse is { Factored: true })
        {
            sparse.Solve((double[])(object)matrix, (double[])(object)b, rowOfStep);
        }
        else if (ordering is null)
        {
            SolveDense(b);
        }
        else
        {
            SolveBand(b, scratch);
        }
    }

    private int FactorDense()
    {
        int n = Size;
        var a = matrix;
        for (int c = 0; c < n; c++) columnScale[c] = 0;
        if (!tracked) FullExtents();
        var first = rowFirst;
        var last = rowLast;
        for (int r = 0; r < n; r++)
        {
            int row = r * n;
            for (int c = first[r]; c <= last[r]; c++)
            {
                double m = Magnitude(a[row + c]);
                if (m > columnScale[c]) columnScale[c] = m;
            }
        }

        for (int k = 0; k < n; k++)
        {
            int pivotRow = k;
            double best = Magnitude(a[(k * n) + k]);
            for (int r = k + 1; r < n; r++)
            {
                double m = Magnitude(a[(r * n) + k]);
                if (m > best)
                {
                    best = m;
                    pivotRow = r;
                }
            }

            if (!(best > 1e-14 * columnScale[k]) || !double.IsFinite(best)) return k;
            rowOfStep[k] = pivotRow;
            if (pivotRow != k)
            {
                var s1 = a.AsSpan(k * n, n);
                var s2 = a.AsSpan(pivotRow * n, n);
                for (int c = 0; c < n; c++) (s1[c], s2[c]) = (s2[c], s1[c]);
                (first[k], first[pivotRow]) = (first[pivotRow], first[k]);
                (last[k], last[pivotRow]) = (last[pivotRow], last[k]);
            }

            T pivot = a[(k * n) + k];
            int pivotBase = k * n;
            int pivotLast = last[k];
            for (int r = k + 1; r < n; r++)
            {
                int rowBase = r * n;
                T factor = a[rowBase + k];
                if (T.IsZero(factor)) continue;
                factor /= pivot;
                a[rowBase + k] = factor;
                for (int c = k + 1; c <= pivotLast; c++) a[rowBase + c] -= factor * a[pivotBase + c];
                if (pivotLast > last[r]) last[r] = pivotLast;
            }
        }

        return -1;
    }

    private void SolveDense(T[] b)
    {
        int n = Size;
        var a = matrix;
        for (int k = 0; k < n; k++)
        {
            int p = rowOfStep[k];
            if (p != k) (b[k], b[p]) = (b[p], b[k]);
        }

        // The factors' rows span rowFirst..rowLast (Factor keeps them; an untracked system spans every column).
        var first = rowFirst;
        var last = rowLast;
        for (int r = 1; r < n; r++)
        {
            T sum = b[r];
            int rowBase = r * n;
            for (int c = first[r]; c < r; c++) sum -= a[rowBase + c] * b[c];
            b[r] = sum;
        }

        for (int r = n - 1; r >= 0; r--)
        {
            T sum = b[r];
            int rowBase = r * n;
            for (int c = r + 1; c <= last[r]; c++) sum -= a[rowBase + c] * b[c];
            b[r] = sum / a[rowBase + r];
        }
    }

    /// <summary>
    /// Banded elimination with row interchanges (LINPACK's banded scheme): row r holds columns r − lower … r + upper + lower
    /// at offsets 0 … width − 1; the multipliers of step k stay in column k of the rows below it; a swap exchanges only
    /// columns k onwards, and the solve applies the interchanges step by step.
    /// </summary>
    private int FactorBand()
    {
        int n = Size, kl = lower, ku = upper, w = width;
        var a = matrix;
        for (int c = 0; c < n; c++) columnScale[c] = 0;
        for (int r = 0; r < n; r++)
        {
            int from = Math.Max(0, r - kl), to = Math.Min(n - 1, r + ku);
            for (int c = from; c <= to; c++)
            {
                double m = Magnitude(a[(r * w) + c - r + kl]);
                if (m > columnScale[c]) columnScale[c] = m;
            }
        }

        for (int k = 0; k < n; k++)
        {
            int last = Math.Min(n - 1, k + kl);
            int pivotRow = k;
            double best = Magnitude(a[(k * w) + kl]);
            for (int r = k + 1; r <= last; r++)
            {
                double m = Magnitude(a[(r * w) + k - r + kl]);
                if (m > best)
                {
                    best = m;
                    pivotRow = r;
                }
            }

            if (!(best > 1e-14 * columnScale[k]) || !double.IsFinite(best)) return ordering!.OldOf[k];
            rowOfStep[k] = pivotRow;
            int right = Math.Min(n - 1, k + ku + kl);
            if (pivotRow != k)
            {
                for (int c = k; c <= right; c++)
                {
                    ref T x = ref a[(k * w) + c - k + kl];
                    ref T y = ref a[(pivotRow * w) + c - pivotRow + kl];
                    (x, y) = (y, x);
                }
            }

            T pivot = a[(k * w) + kl];
            for (int r = k + 1; r <= last; r++)
            {
                int rowBase = (r * w) - r + kl;
                T factor = a[rowBase + k];
                if (T.IsZero(factor)) continue;
                factor /= pivot;
                a[rowBase + k] = factor;
                int pivotBase = (k * w) - k + kl;
                for (int c = k + 1; c <= right; c++) a[rowBase + c] -= factor * a[pivotBase + c];
            }
        }

        return -1;
    }

    private void SolveBand(T[] rhs, T[] b)
    {
        int n = Size, kl = lower, ku = upper, w = width;
        var a = matrix;
        var order = ordering!;
        for (int i = 0; i < n; i++) b[i] = rhs[order.OldOf[i]];
        for (int k = 0; k < n; k++)
        {
            int p = rowOfStep[k];
            if (p != k) (b[k], b[p]) = (b[p], b[k]);
            T bk = b[k];
            if (T.IsZero(bk)) continue;
            int last = Math.Min(n - 1, k + kl);
            for (int r = k + 1; r <= last; r++) b[r] -= a[(r * w) + k - r + kl] * bk;
        }

        for (int r = n - 1; r >= 0; r--)
        {
            T sum = b[r];
            int rowBase = (r * w) - r + kl;
            int right = Math.Min(n - 1, r + ku + kl);
            for (int c = r + 1; c <= right; c++) sum -= a[rowBase + c] * b[c];
            b[r] = sum / a[rowBase + r];
        }

        for (int i = 0; i < n; i++) rhs[order.OldOf[i]] = b[i];
    }

    /// <summary>Re-lays the band for wider bandwidths, keeping the entries loaded so far.</summary>
    private void Widen(int newLower, int newUpper)
    {
        int n = Size, newWidth = (2 * newLower) + newUpper + 1;
        var band = new T[n * newWidth];
        for (int r = 0; r < n; r++)
        {
            for (int d = -lower; d <= upper + lower; d++)
            {
                band[(r * newWidth) + d + newLower] = matrix[(r * width) + d + lower];
            }
        }

        lower = newLower;
        upper = newUpper;
        width = newWidth;
        matrix = band;
    }

    private static double Magnitude(T value) => typeof(T) == typeof(double)
        ? Math.Abs(Unsafe.As<T, double>(ref value))
        : Complex.Abs(Unsafe.As<T, Complex>(ref value));
}
