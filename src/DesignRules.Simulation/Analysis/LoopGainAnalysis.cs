using System.Numerics;

namespace DesignRules.Simulation.Analysis;

/// <summary>
/// Loop gain by Bode's return ratio in the MNA system: at each frequency the circuit's small-signal matrix is assembled
/// with one amplifier's drive fed by a unit injected differential input instead of v(+) − v(−); the differential input
/// that returns around every path of the circuit gives T = −(v(+) − v(−)). With a single controlled source inside the
/// loop this is the loop gain that Middlebrook's two-injection measurement yields at the same break point.
/// </summary>
internal sealed class LoopGainAnalysis(CompiledCircuit compiled, double[] operatingPoint, SolverLimits limits)
{
    private readonly AcLoadContext context = CreateContext(compiled, operatingPoint, limits);

    /// <summary>T of <paramref name="amplifier"/> at <paramref name="frequency"/>, or NaN when the small-signal equations are singular there.</summary>
    public Complex At(AmplifierDevice amplifier, double frequency)
    {
        context.Omega = 2 * Math.PI * frequency;
        context.BrokenAmplifier = amplifier.Id;
        context.System.Clear();
        foreach (var device in compiled.Devices) device.LoadAc(context);
        if (context.System.Factor() >= 0) return new Complex(double.NaN, double.NaN);
        context.System.Solve();
        var x = context.System.Rhs;
        var nodes = amplifier.Nodes;
        Complex vp = nodes.Plus >= 0 ? x[nodes.Plus] : Complex.Zero;
        Complex vm = nodes.Minus >= 0 ? x[nodes.Minus] : Complex.Zero;
        return -(vp - vm);
    }

    public LoopGain Run(AmplifierDevice amplifier, IReadOnlyList<double> frequencies)
    {
        var gain = new Complex[frequencies.Count];
        for (int i = 0; i < gain.Length; i++) gain[i] = At(amplifier, frequencies[i]);
        var margins = LoopMargins.Of(frequencies, gain, f => At(amplifier, f));
        return new LoopGain(amplifier.Id, gain, margins);
    }

    private static AcLoadContext CreateContext(CompiledCircuit compiled, double[] operatingPoint, SolverLimits limits)
    {
        var context = new AcLoadContext(compiled.Layout.Size) { JunctionShunt = limits.JunctionShunt, Temperature = compiled.Temperature };
        Array.Copy(operatingPoint, context.X, operatingPoint.Length);
        return context;
    }
}
