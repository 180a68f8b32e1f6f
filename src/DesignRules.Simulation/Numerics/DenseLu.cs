using System.Numerics;
using System.Runtime.CompilerServices;

namespace DesignRules.Simulation.Numerics;

/// <summary>
/// In-place dense LU factorisation with partial (row) pivoting on a flat row-major matrix, allocation-free after
/// construction. The engine factors a fresh matrix at every Newton iteration, so it keeps its own buffers
/// instead of creating new matrix objects. Works for real and complex matrices.
/// </summary>
/// <typeparam name="T">double or <see cref="Complex"/>.</typeparam>
internal sealed class DenseLu<T>
    where T : struct, INumberBase<T>
{
    private readonly int[] rowOfStep;
    private readonly double[] columnScale;

    public DenseLu(int size)
    {
        Size = size;
        Matrix = new T[size * size];
        Rhs = new T[size];
        rowOfStep = new int[size];
        columnScale = new double[size];
    }

    /// <summary>Order of the system.</summary>
    public int Size { get; }

    /// <summary>Row-major matrix; overwritten by the factors.</summary>
    public T[] Matrix { get; }

    /// <summary>Right-hand side; overwritten by the solution in <see cref="Solve"/>.</summary>
    public T[] Rhs { get; }

    /// <summary>Zeroes matrix and right-hand side.</summary>
    public void Clear()
    {
        Array.Clear(Matrix);
        Array.Clear(Rhs);
    }

    /// <summary>Factors the matrix in place. Returns −1 on success or the index of the unknown (column) found singular.</summary>
    public int Factor()
    {
        int n = Size;
        var a = Matrix;
        for (int c = 0; c < n; c++) columnScale[c] = 0;
        for (int r = 0; r < n; r++)
        {
            int row = r * n;
            for (int c = 0; c < n; c++)
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
            }

            T pivot = a[(k * n) + k];
            int pivotBase = k * n;
            for (int r = k + 1; r < n; r++)
            {
                int rowBase = r * n;
                T factor = a[rowBase + k];
                if (T.IsZero(factor)) continue;
                factor /= pivot;
                a[rowBase + k] = factor;
                for (int c = k + 1; c < n; c++) a[rowBase + c] -= factor * a[pivotBase + c];
            }
        }

        return -1;
    }

    /// <summary>Solves with the factors; the solution replaces <see cref="Rhs"/>.</summary>
    public void Solve()
    {
        int n = Size;
        var a = Matrix;
        var b = Rhs;
        for (int k = 0; k < n; k++)
        {
            int p = rowOfStep[k];
            if (p != k) (b[k], b[p]) = (b[p], b[k]);
        }

        for (int r = 1; r < n; r++)
        {
            T sum = b[r];
            int rowBase = r * n;
            for (int c = 0; c < r; c++) sum -= a[rowBase + c] * b[c];
            b[r] = sum;
        }

        for (int r = n - 1; r >= 0; r--)
        {
            T sum = b[r];
            int rowBase = r * n;
            for (int c = r + 1; c < n; c++) sum -= a[rowBase + c] * b[c];
            b[r] = sum / a[rowBase + r];
        }
    }

    private static double Magnitude(T value) => typeof(T) == typeof(double)
        ? Math.Abs(Unsafe.As<T, double>(ref value))
        : Complex.Abs(Unsafe.As<T, Complex>(ref value));
}
