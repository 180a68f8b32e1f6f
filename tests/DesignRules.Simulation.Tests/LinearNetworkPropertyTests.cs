using CsCheck;
using MathNet.Numerics.LinearAlgebra;

namespace DesignRules.Simulation.Tests;

public sealed class LinearNetworkPropertyTests
{
    private sealed record Branch(int A, int B, double Value);

    private sealed record Network(int Nodes, Branch[] Resistors, Branch[] CurrentSources, Branch[] VoltageSources);

    /// <summary>Random resistor networks: a spanning tree to ground (so no node floats), extra random resistors, current sources anywhere and voltage sources to ground (at most one per node, so they form no loop).</summary>
    private static readonly Gen<Network> Networks =
        from n in Gen.Int[2, 12]
        from parents in Gen.Double[0, 0.999999].Array[n]
        from treeValues in Gen.Double[1, 6].Array[n]
        from extra in Gen.Select(Gen.Int[0, n], Gen.Int[0, n], Gen.Double[1, 6]).Array[0, 2 * n]
        from currents in Gen.Select(Gen.Int[0, n], Gen.Int[0, n], Gen.Double[-1e-3, 1e-3]).Array[0, 3]
        from volts in Gen.Select(Gen.Int[1, n], Gen.Double[-10, 10]).Array[0, 3]
        select Build(n, parents, treeValues, extra, currents, volts);

    private static Network Build(int n, double[] parents, double[] treeValues, (int, int, double)[] extra, (int, int, double)[] currents, (int, double)[] volts)
    {
        var resistors = new List<Branch>();
        for (int node = 1; node <= n; node++) resistors.Add(new Branch(node, (int)(parents[node - 1] * node), Math.Pow(10, treeValues[node - 1])));
        foreach (var (a, b, logR) in extra)
        {
            if (a != b) resistors.Add(new Branch(a, b, Math.Pow(10, logR)));
        }

        var sources = currents.Where(c => c.Item1 != c.Item2).Select(c => new Branch(c.Item1, c.Item2, c.Item3)).ToArray();
        var voltages = volts.DistinctBy(v => v.Item1).Select(v => new Branch(v.Item1, 0, v.Item2)).ToArray();
        return new Network(n, [.. resistors], sources, voltages);
    }

    private static string Name(int node) => node == 0 ? Circuit.Ground : "n" + node.ToString(System.Globalization.CultureInfo.InvariantCulture);

    [Fact]
    public void Operating_point_of_random_resistor_networks_matches_a_direct_dense_nodal_solve()
    {
        Networks.Sample(network =>
        {
            var circuit = new Circuit();
            int id = 0;
            foreach (var r in network.Resistors) circuit.AddResistor("r" + id++, Name(r.A), Name(r.B), r.Value);
            foreach (var i in network.CurrentSources) circuit.AddCurrentSource("i" + id++, Name(i.A), Name(i.B), i.Value);
            foreach (var v in network.VoltageSources) circuit.AddVoltageSource("v" + id++, Name(v.A), Circuit.Ground, v.Value);
            var op = Simulate.OperatingPoint(circuit);
            Assert.True(op.Succeeded, op.Failure?.ToString());

            // Reference: the same nodal equations (G·v = i, plus one row per voltage source) solved densely by MathNet.Numerics.
            int n = network.Nodes, m = network.VoltageSources.Length;
            var a = Matrix<double>.Build.Dense(n + m, n + m);
            var b = Vector<double>.Build.Dense(n + m);
            foreach (var r in network.Resistors)
            {
                double g = 1 / r.Value;
                if (r.A > 0) a[r.A - 1, r.A - 1] += g;
                if (r.B > 0) a[r.B - 1, r.B - 1] += g;
                if (r.A > 0 && r.B > 0)
                {
                    a[r.A - 1, r.B - 1] -= g;
                    a[r.B - 1, r.A - 1] -= g;
                }
            }

            foreach (var i in network.CurrentSources)
            {
                if (i.A > 0) b[i.A - 1] -= i.Value;
                if (i.B > 0) b[i.B - 1] += i.Value;
            }

            for (int k = 0; k < m; k++)
            {
                int node = network.VoltageSources[k].A - 1;
                a[node, n + k] = 1;
                a[n + k, node] = 1;
                b[n + k] = network.VoltageSources[k].Value;
            }

            var x = a.Solve(b);
            double scale = Math.Max(x.SubVector(0, n).AbsoluteMaximum(), 1e-12);
            for (int node = 1; node <= n; node++)
            {
                if (!circuit.ContainsNode(Name(node))) continue;
                double engine = op.Voltage(Name(node));
                Assert.True(Math.Abs(engine - x[node - 1]) <= 1e-9 * scale, $"node {node}: {engine} vs {x[node - 1]}");
            }
        }, iter: 300, threads: 1, seed: "7e_xvcf8Rfb1");
    }
}
