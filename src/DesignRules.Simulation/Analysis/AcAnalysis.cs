using System.Numerics;

namespace DesignRules.Simulation.Analysis;

/// <summary>
/// AC small-signal analysis: at each frequency the devices stamp their admittances linearised at the operating point
/// (G + jωC), the complex MNA system is factored and solved.
/// </summary>
internal static class AcAnalysis
{
    public static AcResult Run(CompiledCircuit compiled, double[] operatingPoint, AcSweep sweep, SolverLimits limits, OperatingPointResult op)
    {
        var layout = compiled.Layout;
        var context = new AcLoadContext(layout.Size, compiled.Ordering)
        {
            JunctionShunt = limits.JunctionShunt, Temperature = compiled.Temperature, Stimulus = sweep.Source, StimulusAmplitude = sweep.Amplitude,
        };
        var frequencies = sweep.Frequencies;
        Array.Copy(operatingPoint, context.X, operatingPoint.Length);
        var map = new SignalMap(compiled);
        var table = new SampleTable<Complex>(map.Width, frequencies.Count);
        var conductances = compiled.Amplifiers.Select(a => a.Evaluate(operatingPoint, dc: true).OutputConductance).ToArray();
        var solved = new List<double>(frequencies.Count);
        foreach (double f in frequencies)
        {
            context.Omega = 2 * Math.PI * f;
            context.System.Clear();
            foreach (var device in compiled.Devices) device.LoadAc(context);
            int singular = context.System.Factor();
            if (singular >= 0)
            {
                string? owner = layout.Owners[singular];
                var failure = new SimulationFailure(FailureKind.Undetermined, $"the small-signal equations leave '{layout.Names[singular]}' undetermined")
                {
                    Node = owner is null ? layout.Names[singular] : null,
                    ElementId = owner,
                    SweepValue = f,
                };
                return new AcResult(map, table, [.. solved], op, failure);
            }

            context.System.Solve();
            var row = table.AddRow();
            var x = context.System.Rhs;
            x.AsSpan().CopyTo(row);
            for (int i = 0; i < compiled.Amplifiers.Length; i++)
            {
                var nodes = compiled.Amplifiers[i].Nodes;
                Complex vo = nodes.Output >= 0 ? x[nodes.Output] : Complex.Zero;
                row[layout.Size + i] = conductances[i] * (x[nodes.Stage] - vo);
            }

            solved.Add(f);
        }

        return new AcResult(map, table, [.. solved], op, null);
    }
}
