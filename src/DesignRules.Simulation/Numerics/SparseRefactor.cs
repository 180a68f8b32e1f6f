namespace DesignRules.Simulation.Numerics;

/// <summary>
/// A sparse LU of a small real system kept in <see cref="DenseLu{T}"/>'s dense row-major storage, for the many
/// factorisations of one circuit's Newton iterations (a transient factors the same pattern tens of thousands of times).
/// A circuit's rows are short, so a dense elimination spends most of its time on zeros and on the fill a natural order
/// makes. The analysis, once per pattern, picks the pivots by Markowitz's rule (fewest (row count − 1)·(column count − 1)
/// of the active submatrix) among entries passing a threshold of partial pivoting on the values then loaded (at least
/// <see cref="AnalysisThreshold"/> of their column's largest: the threshold pivoting of Duff, Erisman and Reid, "Direct
/// Methods for Sparse Matrices", ch. 7), records the fill it makes and lists, per step, the multipliers to form and the
/// updates to make. Every later factorisation runs those lists only. Its pivots are checked as they are formed: a pivot
/// below <see cref="RefactorThreshold"/> of its column's largest remaining entry, below the dense solver's singularity
/// test or not finite, or any entry not finite, restores the loaded values and leaves the factorisation to the dense
/// partial-pivoting LU (which also decides singularity, exactly as without this), and the next factorisation analyses
/// afresh. So every system the dense LU solves is still solved; only the order of the arithmetic (and so the last bits)
/// differs. An entry loaded outside the analysed pattern makes the next factorisation analyse afresh as well.
/// </summary>
internal sealed class SparseRefactor
{
    /// <summary>Threshold of the analysis' pivot choice: 0.1, the value Duff, Erisman and Reid recommend (common practice).</summary>
    public const double AnalysisThreshold = 0.1;

    /// <summary>Smallest pivot a refactorisation accepts, relative to its column's largest remaining entry.</summary>
    public const double RefactorThreshold = 0.01;

    private readonly int n;
    private readonly bool[] loaded;
    private readonly double[] work;
    private readonly bool[] structure;
    private readonly int[] rowCount;
    private readonly int[] columnCount;
    private readonly bool[] rowDone;
    private readonly bool[] columnDone;
    private readonly int[] rowOf;
    private readonly int[] columnOf;
    private readonly int[] diagonal;
    private readonly double[] scratch;
    private readonly int[] fillFirst;
    private readonly int[] fillLast;
    private int[] lowerStart = [];
    private int[] lowerIndex = [];
    private int[] lowerStep = [];
    private int[] upperStart = [];
    private int[] upperIndex = [];
    private int[] upperStep = [];
    private int[] updateTarget = [];
    private int[] filled = [];
    private int[] filledColumn = [];
    private double[] saved = [];
    private bool analysed;

    public SparseRefactor(int size)
    {
        n = size;
        loaded = new bool[size * size];
        work = new double[size * size];
        structure = new bool[size * size];
        rowCount = new int[size];
        columnCount = new int[size];
        rowDone = new bool[size];
        columnDone = new bool[size];
        rowOf = new int[size];
        columnOf = new int[size];
        diagonal = new int[size];
        scratch = new double[size];
        fillFirst = new int[size];
        fillLast = new int[size];
    }

    /// <summary>Analyses made (for tests).</summary>
    public int Analyses { get; private set; }

    /// <summary>Factorisations left to the dense LU because a pivot failed its check (for tests).</summary>
    public int Fallbacks { get; private set; }

    /// <summary>True when the last <see cref="TryFactor"/> factored (its factors are in the storage, to solve with <see cref="Solve"/>).</summary>
    public bool Factored { get; private set; }

    /// <summary>Notes a position loaded (flat row-major index); a new one invalidates the analysis.</summary>
    public void Loaded(int index)
    {
        if (loaded[index]) return;
        loaded[index] = true;
        analysed = false;
    }

    /// <summary>Forgets the last factors (the storage was cleared or overwritten).</summary>
    public void Forget() => Factored = false;

    /// <summary>
    /// Factors <paramref name="a"/> (loaded only at noted positions) in place on the analysed pattern. Returns false, with
    /// <paramref name="a"/> as loaded, when the dense LU must factor it instead.
    /// </summary>
    public bool TryFactor(double[] a, double[] columnScale, int[] rowFirst, int[] rowLast)
    {
        Factored = false;
        if (!analysed && !Analyse(a)) return false;
        var positions = filled;
        var columns = filledColumn;
        var keep = saved;
        for (int c = 0; c < n; c++) columnScale[c] = 0;
        for (int t = 0; t < positions.Length; t++)
        {
            double v = a[positions[t]];
            keep[t] = v;
            double m = Math.Abs(v);
            if (!double.IsFinite(v)) return false;
            if (m > columnScale[columns[t]]) columnScale[columns[t]] = m;
        }

        var lStart = lowerStart;
        var lIndex = lowerIndex;
        var uStart = upperStart;
        var uIndex = upperIndex;
        var targets = updateTarget;
        int op = 0;
        for (int k = 0; k < n; k++)
        {
            double pivot = a[diagonal[k]];
            double magnitude = Math.Abs(pivot);
            double largest = 0;
            for (int e = lStart[k]; e < lStart[k + 1]; e++) largest = Math.Max(largest, Math.Abs(a[lIndex[e]]));
            if (!(magnitude > 1e-14 * columnScale[columnOf[k]]) || !double.IsFinite(magnitude) || !double.IsFinite(largest) || magnitude < RefactorThreshold * largest)
            {
                for (int t = 0; t < positions.Length; t++) a[positions[t]] = keep[t];
                Fallbacks++;
                analysed = false;
                return false;
            }

            int uFrom = uStart[k], uTo = uStart[k + 1];
            for (int e = lStart[k]; e < lStart[k + 1]; e++)
            {
                double factor = a[lIndex[e]];
                if (factor == 0)
                {
                    op += uTo - uFrom;
                    continue;
                }

                factor /= pivot;
                a[lIndex[e]] = factor;
                for (int u = uFrom; u < uTo; u++) a[targets[op++]] -= factor * a[uIndex[u]];
            }
        }

        // Clearing the storage must reach the fill as well.
        for (int r = 0; r < n; r++)
        {
            if (fillFirst[r] < rowFirst[r]) rowFirst[r] = fillFirst[r];
            if (fillLast[r] > rowLast[r]) rowLast[r] = fillLast[r];
        }

        Factored = true;
        return true;
    }

    /// <summary>Solves with the factors in <paramref name="a"/>; the solution replaces <paramref name="b"/>.</summary>
    public void Solve(double[] a, double[] b, double[] buffer)
    {
        var z = buffer.Length >= n ? buffer : scratch;
        for (int k = 0; k < n; k++) z[k] = b[rowOf[k]];
        var lStart = lowerStart;
        var lIndex = lowerIndex;
        var lStep = lowerStep;
        for (int k = 0; k < n; k++)
        {
            double zk = z[k];
            if (zk == 0) continue;
            for (int e = lStart[k]; e < lStart[k + 1]; e++) z[lStep[e]] -= a[lIndex[e]] * zk;
        }

        var uStart = upperStart;
        var uIndex = upperIndex;
        var uStep = upperStep;
        for (int k = n - 1; k >= 0; k--)
        {
            double sum = z[k];
            for (int u = uStart[k]; u < uStart[k + 1]; u++) sum -= a[uIndex[u]] * z[uStep[u]];
            z[k] = sum / a[diagonal[k]];
        }

        for (int k = 0; k < n; k++) b[columnOf[k]] = z[k];
    }

    /// <summary>Markowitz pivot order with threshold pivoting on the values loaded now; false when no usable pivot is left.</summary>
    private bool Analyse(double[] a)
    {
        Analyses++;
        int size = n;
        Array.Copy(a, work, size * size);
        Array.Copy(loaded, structure, size * size);
        Array.Clear(rowDone);
        Array.Clear(columnDone);
        Array.Clear(rowCount);
        Array.Clear(columnCount);
        for (int r = 0; r < size; r++)
        {
            for (int c = 0; c < size; c++)
            {
                if (!structure[(r * size) + c]) continue;
                rowCount[r]++;
                columnCount[c]++;
            }
        }

        for (int k = 0; k < size; k++)
        {
            int pivotRow = -1, pivotColumn = -1;
            long bestCost = long.MaxValue;
            double bestMagnitude = 0;
            for (int c = 0; c < size; c++)
            {
                if (columnDone[c]) continue;
                double largest = 0;
                for (int r = 0; r < size; r++)
                {
                    if (!rowDone[r] && structure[(r * size) + c]) largest = Math.Max(largest, Math.Abs(work[(r * size) + c]));
                }

                if (!(largest > 0) || !double.IsFinite(largest)) continue;
                for (int r = 0; r < size; r++)
                {
                    if (rowDone[r] || !structure[(r * size) + c]) continue;
                    double m = Math.Abs(work[(r * size) + c]);
                    if (m < AnalysisThreshold * largest) continue;
                    long cost = (long)(rowCount[r] - 1) * (columnCount[c] - 1);
                    if (cost < bestCost || (cost == bestCost && m > bestMagnitude))
                    {
                        bestCost = cost;
                        bestMagnitude = m;
                        pivotRow = r;
                        pivotColumn = c;
                    }
                }
            }

            if (pivotRow < 0) return false;
            rowOf[k] = pivotRow;
            columnOf[k] = pivotColumn;
            rowDone[pivotRow] = true;
            columnDone[pivotColumn] = true;
            double pivot = work[(pivotRow * size) + pivotColumn];
            for (int r = 0; r < size; r++)
            {
                if (rowDone[r] || !structure[(r * size) + pivotColumn]) continue;
                double factor = work[(r * size) + pivotColumn] / pivot;
                rowCount[r]--;
                for (int c = 0; c < size; c++)
                {
                    if (columnDone[c] || !structure[(pivotRow * size) + c]) continue;
                    int at = (r * size) + c;
                    if (!structure[at])
                    {
                        structure[at] = true;
                        rowCount[r]++;
                        columnCount[c]++;
                    }

                    work[at] -= factor * work[(pivotRow * size) + c];
                }
            }

            for (int c = 0; c < size; c++)
            {
                if (!columnDone[c] && structure[(pivotRow * size) + c]) columnCount[c]--;
            }
        }

        BuildLists();
        analysed = true;
        return true;
    }

    private void BuildLists()
    {
        int size = n;
        var lStart = new int[size + 1];
        var uStart = new int[size + 1];
        var lIndex = new List<int>();
        var lStep = new List<int>();
        var uIndex = new List<int>();
        var uStep = new List<int>();
        for (int k = 0; k < size; k++)
        {
            int pr = rowOf[k], pc = columnOf[k];
            diagonal[k] = (pr * size) + pc;
            lStart[k] = lIndex.Count;
            uStart[k] = uIndex.Count;
            for (int j = k + 1; j < size; j++)
            {
                int below = (rowOf[j] * size) + pc;
                if (structure[below])
                {
                    lIndex.Add(below);
                    lStep.Add(j);
                }

                int right = (pr * size) + columnOf[j];
                if (structure[right])
                {
                    uIndex.Add(right);
                    uStep.Add(j);
                }
            }
        }

        lStart[size] = lIndex.Count;
        uStart[size] = uIndex.Count;
        var targets = new List<int>();
        for (int k = 0; k < size; k++)
        {
            for (int e = lStart[k]; e < lStart[k + 1]; e++)
            {
                int row = lIndex[e] / size;
                for (int u = uStart[k]; u < uStart[k + 1]; u++) targets.Add((row * size) + (uIndex[u] % size));
            }
        }

        var positions = new List<int>();
        var columns = new List<int>();
        Array.Fill(fillFirst, size);
        Array.Fill(fillLast, -1);
        for (int at = 0; at < size * size; at++)
        {
            if (!structure[at]) continue;
            positions.Add(at);
            int r = at / size, c = at % size;
            columns.Add(c);
            if (c < fillFirst[r]) fillFirst[r] = c;
            if (c > fillLast[r]) fillLast[r] = c;
        }

        lowerStart = lStart;
        upperStart = uStart;
        lowerIndex = [.. lIndex];
        lowerStep = [.. lStep];
        upperIndex = [.. uIndex];
        upperStep = [.. uStep];
        updateTarget = [.. targets];
        filled = [.. positions];
        filledColumn = [.. columns];
        saved = new double[filled.Length];
    }
}
