using MathNet.Numerics.LinearAlgebra;

namespace DesignRules.Simulation.Tests;

/// <summary>
/// The replayed LU a transient's Newton iterations factor with (the last factorisation's row interchanges replayed on its
/// pattern), checked against MathNet.Numerics' dense LU solve and, to the bit, against the engine's own dense
/// partial-pivoting LU on the same loads. The matrices are shaped like modified nodal equations: conductance blocks
/// between nodes, and voltage-source (branch-current) rows and columns with a zero on the diagonal.
/// </summary>
public sealed class SparseRefactorTests
{
    [Fact]
    public void Refactoring_a_circuit_pattern_with_new_values_agrees_with_the_reference_and_the_dense_lu()
    {
        // Reference: MathNet.Numerics' dense LU solve (Matrix.Solve) of each matrix; the engine's dense LU solves the same
        // loads as a second reference (it pivots differently, so agreement is to rounding, not to the bit).
        const int n = 20;
        var random = new Random(5);
        var sparse = new DenseLu<double>(n) { PreferSparse = true };
        var dense = new DenseLu<double>(n);
        for (int round = 0; round < 6; round++)
        {
            sparse.Clear();
            dense.Clear();
            var reference = Matrix<double>.Build.Dense(n, n);
            void Load(int r, int c, double v)
            {
                sparse.Add(r, c, v);
                dense.Add(r, c, v);
                reference[r, c] += v;
            }

            LoadLadder(Load, n, round, random);
            SolveAndCompare(sparse, dense, reference, Vector<double>.Build.Dense(n, i => Math.Sin(i + round)), 1e-10);
        }

        // The first round was factored dense (nothing to replay yet); the values changed but not the interchanges, so every
        // later round was replayed.
        Assert.Equal(5, sparse.Sparse!.Replayed);
        Assert.Equal(0, sparse.Sparse.Fallbacks);
    }

    [Fact]
    public void A_load_on_which_partial_pivoting_chooses_another_row_is_factored_dense_and_still_solves()
    {
        // Reference: MathNet.Numerics' dense LU solve, and the dense LU to the bit. The first load fixes the interchanges
        // (none: 4 leads its column); the second makes the first pivot tiny (1e-9 against 1, near-singular), so partial
        // pivoting takes row 1: the replay must see it and leave that load to the dense LU; the third ties the first
        // column (1 against 1), where the dense LU keeps the row it meets first (row 0, as recorded from the second
        // load's interchange the other way round: the replay must not keep row 1); the fourth repeats the third's
        // interchanges and is replayed.
        const int n = 3;
        var sparse = new DenseLu<double>(n) { PreferSparse = true };
        var dense = new DenseLu<double>(n);
        double[][] loads =
        [
            [4, 1, 0, 1, 3, 1, 0, 1, 2],
            [1e-9, 1, 0, 1, 3, 1, 0, 1, 2],
            [1, 1, 0, 1, 3, 1, 0, 1, 2],
            [1, 2, 0, 1, 3, 1, 0, 1, 2],
        ];
        bool[] replayed = [false, false, false, true];
        for (int round = 0; round < loads.Length; round++)
        {
            sparse.Clear();
            dense.Clear();
            var reference = Matrix<double>.Build.Dense(n, n);
            for (int r = 0; r < n; r++)
            {
                for (int c = 0; c < n; c++)
                {
                    double v = loads[round][(r * n) + c];
                    if (v == 0) continue;
                    sparse.Add(r, c, v);
                    dense.Add(r, c, v);
                    reference[r, c] = v;
                }
            }

            var b = Vector<double>.Build.Dense([1.0, -2.0, 0.5]);
            for (int i = 0; i < n; i++)
            {
                sparse.Rhs[i] = b[i];
                dense.Rhs[i] = b[i];
            }

            int before = sparse.Sparse?.Replayed ?? 0;
            Assert.Equal(-1, sparse.Factor());
            Assert.Equal(-1, dense.Factor());
            sparse.Solve();
            dense.Solve();
            var expected = reference.Solve(b);
            for (int i = 0; i < n; i++)
            {
                Assert.Equal(expected[i], sparse.Rhs[i], 1e-12);
                Assert.Equal(BitConverter.DoubleToInt64Bits(dense.Rhs[i]), BitConverter.DoubleToInt64Bits(sparse.Rhs[i]));
            }

            Assert.Equal(replayed[round], sparse.Sparse!.Replayed > before);
        }

        Assert.Equal(1, sparse.Sparse!.Replayed);
        Assert.Equal(2, sparse.Sparse.Fallbacks);
    }

    [Fact]
    public void Loads_that_change_their_interchanges_back_and_forth_are_recorded_afresh_and_replayed_bit_for_bit()
    {
        // Reference: the engine's dense partial-pivoting LU on the same loads, to the bit, and MathNet.Numerics' dense LU
        // solve to rounding. Rounds come in pairs: a large entry below the first pivot in one pair of rounds and none in the
        // next moves the first column's pivot row back and forth, so the first round of each pair leaves a replay given up
        // (the storage restored as loaded, factored dense, its interchanges recorded and analysed afresh into the lists the
        // last analysis filled) and the second replays them, row interchanges and all; every round starts from a storage
        // cleared after either kind of factorisation.
        const int n = 14;
        var random = new Random(11);
        var sparse = new DenseLu<double>(n) { PreferSparse = true };
        var dense = new DenseLu<double>(n);
        const int rounds = 12;
        for (int round = 0; round < rounds; round++)
        {
            sparse.Clear();
            dense.Clear();
            var reference = Matrix<double>.Build.Dense(n, n);
            void Load(int r, int c, double v)
            {
                sparse.Add(r, c, v);
                dense.Add(r, c, v);
                reference[r, c] += v;
            }

            LoadLadder(Load, n, round, random);
            Load(1, 0, (round / 2) % 2 == 1 ? 5.0 : 0.0);
            SolveAndCompare(sparse, dense, reference, Vector<double>.Build.Dense(n, i => Math.Cos(i + round)), 1e-9);
        }

        // Round 0 has nothing to replay, round 1 replays it; from then on the first round of each pair gives up (5 times)
        // and the second replays (6 in all).
        Assert.Equal(rounds / 2, sparse.Sparse!.Replayed);
        Assert.Equal((rounds / 2) - 1, sparse.Sparse.Fallbacks);
    }

    [Fact]
    public void A_singular_system_is_reported_at_the_same_unknown_as_the_dense_lu_reports_it()
    {
        // Textbook: a node joined to nothing but a current source has an all-zero column (a floating node); partial
        // pivoting finds no pivot in it. The sparse path leaves the verdict to the dense LU, so both name column 2.
        const int n = 3;
        var sparse = new DenseLu<double>(n) { PreferSparse = true };
        var dense = new DenseLu<double>(n);
        foreach (var system in new[] { sparse, dense })
        {
            system.Clear();
            system.Add(0, 0, 2);
            system.Add(0, 1, -1);
            system.Add(1, 0, -1);
            system.Add(1, 1, 2);
            system.Add(2, 2, 0);
            system.Rhs[2] = 1e-3;
        }

        int singular = sparse.Factor();
        Assert.Equal(dense.Factor(), singular);
        Assert.Equal(2, singular);
    }

    [Fact]
    public void A_replay_whose_factor_right_of_the_diagonal_overflows_is_left_to_the_dense_lu()
    {
        // IEEE 754 double precision: the largest finite value is about 1.8e308, so 1e308 + 1e308 overflows to infinity.
        // The first load records its interchanges (none: 2 leads its column). The second ties the first column (1 against
        // −1, where partial pivoting keeps the row it meets first, as recorded) and its elimination makes row 1's entry
        // right of the diagonal 1e308 − (−1)·1e308 = +∞: neither a pivot nor a multiplier, so only the replay's final test
        // can see it (the last pivot, 1e300, passes the singularity test against its column's 1e308). The replay must give
        // that load up to the dense LU, and both solve it to the same bits.
        const int n = 3;
        var sparse = new DenseLu<double>(n) { PreferSparse = true };
        var dense = new DenseLu<double>(n);
        double[][] loads =
        [
            [2, 0, 1, -1, 1, 1, 0, 0, 1],
            [1, 0, 1e308, -1, 1, 1e308, 0, 0, 1e300],
        ];
        for (int round = 0; round < loads.Length; round++)
        {
            foreach (var system in new[] { sparse, dense })
            {
                system.Clear();
                for (int r = 0; r < n; r++)
                {
                    for (int c = 0; c < n; c++)
                    {
                        double v = loads[round][(r * n) + c];
                        if (v != 0) system.Add(r, c, v);
                    }
                }

                system.Rhs[0] = 1;
                system.Rhs[1] = 2;
                system.Rhs[2] = 3;
            }

            Assert.Equal(-1, sparse.Factor());
            Assert.Equal(-1, dense.Factor());
            sparse.Solve();
            dense.Solve();
            for (int i = 0; i < n; i++) Assert.Equal(BitConverter.DoubleToInt64Bits(dense.Rhs[i]), BitConverter.DoubleToInt64Bits(sparse.Rhs[i]));
        }

        // The overflow reached the solution (the dense LU factors it as it is); the replay gave the load up.
        Assert.False(double.IsFinite(sparse.Rhs[0]));
        Assert.Equal(0, sparse.Sparse!.Replayed);
        Assert.Equal(1, sparse.Sparse.Fallbacks);
    }

    [Fact]
    public void A_load_outside_the_analysed_pattern_is_analysed_afresh_and_solved()
    {
        // Reference: MathNet.Numerics' dense LU solve. A coupling appears after the first factorisation (an element whose
        // stamp reaches a new position, e.g. a clamp that engages): it must not be dropped.
        const int n = 12;
        var random = new Random(3);
        var sparse = new DenseLu<double>(n) { PreferSparse = true };
        for (int round = 0; round < 2; round++)
        {
            sparse.Clear();
            var reference = Matrix<double>.Build.Dense(n, n);
            void Load(int r, int c, double v)
            {
                sparse.Add(r, c, v);
                reference[r, c] += v;
            }

            LoadLadder(Load, n, 0, random);
            if (round == 1) Load(3, n - 2, 0.3);
            var b = Vector<double>.Build.Dense(n, i => 1.0 / (i + 1));
            for (int i = 0; i < n; i++) sparse.Rhs[i] = b[i];
            Assert.Equal(-1, sparse.Factor());
            sparse.Solve();
            var expected = reference.Solve(b);
            for (int i = 0; i < n; i++) Assert.Equal(expected[i], sparse.Rhs[i], 1e-10 * expected.AbsoluteMaximum());
        }

        // The first round had nothing to replay; the second met a new position, analysed afresh with it (not dropped) and
        // replayed with the same interchanges.
        Assert.Equal(1, sparse.Sparse!.Replayed);
    }

    /// <summary>
    /// Factors and solves <paramref name="b"/> with the replayed and the dense LU: the replayed one agrees with
    /// MathNet.Numerics' solve within <paramref name="relativeTolerance"/> of the largest unknown, and with the dense LU to the bit.
    /// </summary>
    private static void SolveAndCompare(DenseLu<double> sparse, DenseLu<double> dense, Matrix<double> reference, Vector<double> b, double relativeTolerance)
    {
        for (int i = 0; i < b.Count; i++)
        {
            sparse.Rhs[i] = b[i];
            dense.Rhs[i] = b[i];
        }

        Assert.Equal(-1, sparse.Factor());
        Assert.Equal(-1, dense.Factor());
        sparse.Solve();
        dense.Solve();
        var expected = reference.Solve(b);
        double scale = expected.AbsoluteMaximum();
        for (int i = 0; i < b.Count; i++)
        {
            Assert.Equal(expected[i], sparse.Rhs[i], relativeTolerance * scale);
            Assert.Equal(BitConverter.DoubleToInt64Bits(dense.Rhs[i]), BitConverter.DoubleToInt64Bits(sparse.Rhs[i]));
        }
    }

    /// <summary>
    /// A resistor ladder with a grounded voltage source at its head (branch-current unknown in the last row and column, a
    /// zero on its diagonal), an amplifier-like controlled source from node 2 to node n − 3, and a capacitor-like diagonal
    /// term; values vary per round as a transient's companion stamps do.
    /// </summary>
    private static void LoadLadder(Action<int, int, double> load, int n, int round, Random random)
    {
        int nodes = n - 1, branch = n - 1;
        for (int i = 0; i + 1 < nodes; i++)
        {
            double g = 1e-3 * (1 + random.NextDouble());
            load(i, i, g);
            load(i + 1, i + 1, g);
            load(i, i + 1, -g);
            load(i + 1, i, -g);
        }

        for (int i = 0; i < nodes; i++) load(i, i, 1e-6 * (1 + round) * (1 + random.NextDouble()));

        // Voltage source at node 0: KCL of node 0 gets the branch current, the branch row fixes V(0).
        load(0, branch, 1);
        load(branch, 0, 1);

        // A transconductance from node 2 into node n − 3, large as an amplifier's (the matrix is not symmetric).
        load(nodes - 2, 2, 1e2 * (1 + round));
    }
}
