using MathNet.Numerics.LinearAlgebra;

namespace DesignRules.Simulation.Tests;

/// <summary>Large systems solved as a band after reordering, and circuits re-solved warm after their values change.</summary>
public sealed class LargeAndVariedSystemTests
{
    [Fact]
    public void A_banded_solve_of_a_scattered_sparse_system_agrees_with_a_dense_reference_solve()
    {
        // Reference: MathNet.Numerics' dense LU solve of the same matrix.
        const int n = 300;
        var random = new Random(7);
        var entries = new Dictionary<(int, int), double>();
        var scramble = Enumerable.Range(0, n).OrderBy(_ => random.Next()).ToArray();
        for (int i = 0; i < n; i++)
        {
            // A chain (each unknown coupled to the next) whose numbering is scrambled, plus a strong diagonal.
            entries[(scramble[i], scramble[i])] = 4 + random.NextDouble();
            if (i + 1 < n)
            {
                entries[(scramble[i], scramble[i + 1])] = -1 - random.NextDouble();
                entries[(scramble[i + 1], scramble[i])] = -1 + random.NextDouble();
            }
        }

        var ordering = BandOrdering.Compute(n, entries.Keys);
        Assert.True(ordering.Lower <= 2 && ordering.Upper <= 2, $"bandwidths {ordering.Lower}, {ordering.Upper}");
        var system = new DenseLu<double>(n, ordering);
        var dense = Matrix<double>.Build.Dense(n, n);
        foreach (var ((r, c), v) in entries)
        {
            system.Add(r, c, v);
            dense[r, c] += v;
        }

        // One entry outside the pattern the ordering was made for (the band must widen, not drop it).
        system.Add(scramble[0], scramble[n / 2], 0.5);
        dense[scramble[0], scramble[n / 2]] += 0.5;
        var b = Vector<double>.Build.Dense(n, i => Math.Sin(i));
        for (int i = 0; i < n; i++) system.Rhs[i] = b[i];
        Assert.Equal(-1, system.Factor());
        system.Solve();
        var expected = dense.Solve(b);
        for (int i = 0; i < n; i++) Assert.Equal(expected[i], system.Rhs[i], 1e-10);
    }

    [Fact]
    public void A_dense_system_reused_after_pivoting_and_fill_in_solves_each_new_load_as_the_reference_does()
    {
        // Reference: MathNet.Numerics' dense LU solve of each matrix. The dense system skips the zeros outside each row's
        // loaded and filled-in columns; a second system whose storage was read directly (so it works over every entry)
        // must give the very same bits, and a load after Clear must not see any entry of the factors before it.
        const int n = 24;
        var random = new Random(11);
        var skipping = new DenseLu<double>(n);
        var full = new DenseLu<double>(n);
        _ = full.Matrix;
        for (int round = 0; round < 3; round++)
        {
            skipping.Clear();
            full.Clear();
            var dense = Matrix<double>.Build.Dense(n, n);
            void Load(int r, int c, double v)
            {
                skipping.Add(r, c, v);
                full.Add(r, c, v);
                dense[r, c] += v;
            }

            // Each round a different scattered pattern: a weak diagonal (so rows are interchanged) and a few
            // couplings per row far from it (so the factors fill in).
            for (int r = 0; r < n; r++)
            {
                Load(r, r, round == 1 && r % 3 == 0 ? 1e-3 : 0.5 + random.NextDouble());
                for (int k = 0; k < 2; k++) Load(r, random.Next(n), random.NextDouble() - 0.5);
            }

            var b = Vector<double>.Build.Dense(n, i => Math.Cos(i + round));
            for (int i = 0; i < n; i++)
            {
                skipping.Rhs[i] = b[i];
                full.Rhs[i] = b[i];
            }

            Assert.Equal(-1, skipping.Factor());
            Assert.Equal(-1, full.Factor());
            skipping.Solve();
            full.Solve();
            var expected = dense.Solve(b);
            for (int i = 0; i < n; i++)
            {
                Assert.Equal(expected[i], skipping.Rhs[i], 1e-9);
                Assert.Equal(BitConverter.DoubleToInt64Bits(full.Rhs[i]), BitConverter.DoubleToInt64Bits(skipping.Rhs[i]));
            }
        }
    }

    [Fact]
    public void A_divider_of_a_thousand_resistors_gives_each_node_its_share_of_the_source()
    {
        // textbook: N equal resistors in series across V: node k (k resistors above it) sits at V·(N − k)/N.
        const int count = 1000;
        var circuit = new Circuit().AddVoltageSource("v", "n0", Circuit.Ground, 10);
        for (int i = 0; i < count; i++) circuit.AddResistor($"r{i}", $"n{i}", i + 1 == count ? Circuit.Ground : $"n{i + 1}", 1e3);
        var op = Simulate.OperatingPoint(circuit);
        Assert.True(op.Succeeded, op.Failure?.ToString());
        foreach (int k in new[] { 1, 250, 500, 999 })
        {
            Assert.Equal(10.0 * (count - k) / count, op.Voltage($"n{k}"), 1e-9);
        }
    }

    [Fact]
    public void Forty_inverting_stages_in_a_row_multiply_their_closed_loop_gains()
    {
        // textbook: inverting stage with finite open-loop gain A0: G = −(Rf/Rin) / (1 + (1 + Rf/Rin)/A0); the stages are
        // driven from each other's outputs (output resistance 0 here), so the chain's gain is the product.
        var model = Stages.GeneralPurpose;
        const int stages = 40;
        var circuit = new Circuit().AddVoltageSource("vin", "s0", Circuit.Ground, new DcWaveform(0));
        for (int i = 0; i < stages; i++)
        {
            circuit.AddResistor($"rin{i}", $"s{i}", $"sum{i}", 10e3)
                .AddResistor($"rf{i}", $"sum{i}", $"s{i + 1}", 10e3)
                .AddAmplifier($"u{i}", Circuit.Ground, $"sum{i}", $"s{i + 1}", model, Stages.Rails);
        }

        var sweep = Simulate.DcSweep(circuit, "vin", [0.0, 0.1]);
        Assert.True(sweep.Succeeded, sweep.Failure?.ToString());
        double stage = -1 / (1 + (2 / model.OpenLoopGain));
        double expected = 0.1 * Math.Pow(stage, stages);
        var output = sweep.Voltage($"s{stages}");
        Assert.Equal(expected, output[1] - output[0], 1e-6);
    }

    [Fact]
    public void A_warm_solve_after_a_value_change_agrees_with_a_cold_solve_of_the_changed_circuit()
    {
        // Reference: the engine's own cold sweep of a circuit built with the changed values, and the textbook inverting
        // gain −Rf/Rin (within the finite open-loop gain's 1e-4).
        var nominal = Stages.Inverting(new DcWaveform(0), Stages.GeneralPurpose, 20e3, 10e3).AddResistor("load", "out", Circuit.Ground, 10e3);
        var changed = Stages.Inverting(new DcWaveform(0), Stages.GeneralPurpose with { InputOffsetVoltage = 1e-3 }, 20e3 * 1.01, 10e3)
            .AddResistor("load", "out", Circuit.Ground, 10e3);
        double[] levels = [-1, 0, 0.5, 1];
        var solver = VariedDcSolver.Compile(nominal, out _);
        Assert.NotNull(solver);
        var reference = solver.Sweep("vin", levels);
        Assert.True(reference.Succeeded, reference.Failure?.ToString());
        solver.SetResistance("rf", 20e3 * 1.01);
        solver.SetAmplifierInputs("u1", 1e-3, 0, 0);
        var warm = solver.Sweep("vin", levels, reference);
        var cold = Simulate.DcSweep(changed, "vin", levels);
        Assert.True(warm.Succeeded && cold.Succeeded);
        var w = warm.Voltage("out");
        var c = cold.Voltage("out");
        for (int i = 0; i < levels.Length; i++) Assert.Equal(c[i], w[i], 1e-8);
        Assert.Equal(-2.02, (w[3] - w[0]) / 2, 1e-3);
    }

    [Fact]
    public void A_warm_solve_of_a_diode_that_changes_state_falls_back_and_still_converges()
    {
        // textbook: a precision half-wave rectifier (diode in the follower's loop) passes positive inputs and blocks negative ones.
        var circuit = new Circuit()
            .AddVoltageSource("vin", "in", Circuit.Ground, new DcWaveform(0))
            .AddAmplifier("u1", "in", "out", "o1", Stages.GeneralPurpose, Stages.Rails)
            .AddDiode("d1", "o1", "out")
            .AddResistor("load", "out", Circuit.Ground, 10e3);
        double[] levels = [-1, 0, 1];
        var solver = VariedDcSolver.Compile(circuit, out _)!;
        var reference = solver.Sweep("vin", levels);
        Assert.True(reference.Succeeded, reference.Failure?.ToString());
        solver.SetDiodeSaturationCurrent("d1", solver.DiodeSaturationCurrent("d1") * 0.25);
        var warm = solver.Sweep("vin", levels, reference);
        Assert.True(warm.Succeeded, warm.Failure?.ToString());
        var v = warm.Voltage("out");
        Assert.Equal(1.0, v[2], 1e-3);
        Assert.True(Math.Abs(v[0]) < 1e-3, $"blocked output {v[0]}");
    }
}
