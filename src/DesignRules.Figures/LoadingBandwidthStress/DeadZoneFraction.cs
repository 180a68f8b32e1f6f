using DesignRules.Elaboration;
using DesignRules.Simulation;

namespace DesignRules.Figures.LoadingBandwidthStress;

/// <summary>
/// How much of a small signal at a precision rectifier's input reaches its amplifier's inputs while the amplifier sits in
/// its dead zone, both diodes off and the loop open. The amplifier's output must move by a diode drop before either diode
/// conducts, which takes (offset + Vf/A)/f at the stage input, f this fraction. In the follower form the input is on the
/// non-inverting input and f = 1; in the inverting forms the input reaches the inverting input through the input resistor,
/// divided against whatever holds the other end of the feedback resistor (the load, the next stage's virtual ground), so
/// f &lt; 1 and the dead zone at the input is wider than the offset and drop over the gain alone.
/// <para>Measured, not assumed: the nominal chain with the amplifier and the diodes on its output left out, the source moved
/// by a small step from its quiescent value, and the change of v+ − v− over the change of the stage input (Kirchhoff's
/// laws on the remaining linear network; the rest of the chain keeps its own amplifiers).</para>
/// </summary>
internal static class DeadZoneFraction
{
    /// <summary>The source step, V: small against every other stage's range, large against the solver's tolerance.</summary>
    private const double Step = 1e-3;

    /// <summary>The fraction f, or null when it cannot be measured (the chain does not solve, or the stage input does not move).</summary>
    public static double? Of(ElaboratedChain chain, StageProbe stage, AmplifierProbe amplifier)
    {
        if (!chain.Succeeded)
        {
            return null;
        }

        var open = chain.Circuit.Without([amplifier.ElementId, .. stage.Diodes.Where(d => d.Anode == amplifier.OutputNode || d.Cathode == amplifier.OutputNode).Select(d => d.ElementId)]);
        double v0 = chain.SourceWaveform.DcValue;
        var sweep = Simulate.DcSweep(open, chain.SourceId, [v0, v0 + Step]);
        if (!sweep.Succeeded || !sweep.HasNode(stage.InputNode))
        {
            return null;
        }

        double Change(string node) => !sweep.HasNode(node) || Circuit.IsReference(node) ? 0 : sweep.Voltage(node)[1] - sweep.Voltage(node)[0];
        double input = Change(stage.InputNode);
        if (Math.Abs(input) < Step * 1e-6)
        {
            return null;
        }

        double fraction = Math.Abs(Change(amplifier.NonInvertingNode) - Change(amplifier.InvertingNode)) / Math.Abs(input);
        return fraction > 1e-9 ? fraction : null;
    }
}
