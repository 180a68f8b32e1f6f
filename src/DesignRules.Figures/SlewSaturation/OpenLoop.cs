using DesignRules.Elaboration;
using DesignRules.Model;
using DesignRules.Simulation;

namespace DesignRules.Figures.SlewSaturation;

/// <summary>
/// Amplifiers whose feedback loop opens by design (a diode in the loop turns off for part of each cycle), and what it
/// costs them to close it again.
/// </summary>
internal static class OpenLoop
{
    /// <summary>Current at which the diode drop of a recovery estimate is taken, A (small-signal rectifier currents).</summary>
    private const double DiodeCurrent = 1e-3;

    /// <summary>
    /// True when the loop of <paramref name="amplifier"/> opens by design: for a block, as its descriptor says (the
    /// single-diode follower rectifier's and the peak detector's u1); in an explicit netlist, an amplifier whose output reaches the rest of the circuit only through
    /// diodes that all point the same way (so one polarity of error leaves it with no feedback). The two-diode inverting
    /// form, with one diode each way, keeps its loop closed.
    /// </summary>
    public static bool ByDesign(StageProbe stage, AmplifierProbe amplifier) => stage.Stage switch
    {
        BlockStage block => block.Block.OpensLoopByDesign(amplifier.Slot),
        NetlistStage => ByStructure(stage, amplifier),
        _ => false,
    };

    private static bool ByStructure(StageProbe stage, AmplifierProbe amplifier)
    {
        string output = amplifier.OutputNode;
        if (output == amplifier.InvertingNode || output == stage.OutputNode)
        {
            return false;
        }

        if (stage.Components.Any(c => c.NodeA == output || c.NodeB == output)
            || stage.Amplifiers.Any(a => a != amplifier && (a.NonInvertingNode == output || a.InvertingNode == output || a.OutputNode == output)))
        {
            return false;
        }

        var diodes = stage.Diodes.Where(d => d.Anode == output || d.Cathode == output).ToList();
        return diodes.Count > 0 && (diodes.All(d => d.Anode == output) || diodes.All(d => d.Cathode == output));
    }

    /// <summary>The forward drop of the diode on the amplifier's output at 1 mA (Shockley law with series resistance), V; 0 when there is none.</summary>
    public static double DiodeDrop(StageProbe stage, AmplifierProbe amplifier)
    {
        var diode = stage.Diodes.FirstOrDefault(d => d.Anode == amplifier.OutputNode || d.Cathode == amplifier.OutputNode);
        if (diode is null)
        {
            return 0;
        }

        return diode.Model.ForwardVoltage(DiodeCurrent, PhysicalConstants.DefaultTemperature);
    }

    /// <summary>
    /// How far the output must come back after running open-loop to <paramref name="towardsLow"/>'s limit, the time it
    /// takes ((excursion + Vf)/SR plus the part's overload recovery), and the excursion itself: from the extreme to the
    /// level of the feedback node at that moment.
    /// </summary>
    public static (double Excursion, double Recovery, double Extreme) RecoveryCost(AmplifierWaveform a, bool towardsLow)
    {
        double extreme = towardsLow ? a.Minimum : a.Maximum;
        double feedback = towardsLow ? a.FeedbackAtMinimum : a.FeedbackAtMaximum;
        double excursion = Math.Abs(feedback - extreme);
        double vf = DiodeDrop(a.Stage, a.Probe);
        double slew = towardsLow ? a.SlewRising : a.SlewFalling;
        double recovery = ((excursion + vf) / slew) + a.Probe.Model.OverloadRecoveryTime;
        return (excursion, recovery, extreme);
    }
}
