using DesignRules.Elaboration;
using DesignRules.Model;
using DesignRules.Simulation;

namespace DesignRules.Figures.SlewSaturation;

/// <summary>
/// How far each amplifier's output may move from its nominal level when the amplifiers' input offset voltages sit at
/// the part's maximum: for a built-in block |Vos,max| times the amplifier's noise gain (textbook: output offset
/// Vos·(1 + Rf/Rg)); for an explicit netlist the change of the DC operating point between the nominal circuit and the
/// circuits with every offset at +maximum and at −maximum (each computed once per design).
/// </summary>
internal static class OffsetShift
{
    internal sealed record Corners(OperatingPointResult? Nominal, OperatingPointResult? Positive, OperatingPointResult? Negative);

    /// <summary>The upward and downward shift (both zero or positive), V.</summary>
    public static (double Up, double Down) Of(DesignAnalyses analyses, AmplifierWaveform a)
    {
        double vos = Math.Abs(a.Probe.Part.OffsetVoltage.Maximum.Value.Value);
        if (a.Stage.Stage is BlockStage)
        {
            double shift = vos * (NoiseGain.Of(a.Stage.Stage, a.Probe.Slot) ?? 1);
            return (shift, shift);
        }

        var corners = analyses.OffsetCorners;
        if (corners.Nominal is not { Succeeded: true } nominal)
        {
            return (vos, vos);
        }

        double v0 = nominal.Voltage(a.Node), up = 0, down = 0;
        foreach (var corner in new[] { corners.Positive, corners.Negative })
        {
            if (corner is not { Succeeded: true })
            {
                continue;
            }

            // A corner that drives an output onto a rail is a nonlinear stage at rest, not an offset to add to a swing.
            if (corner.Amplifier(a.Name).AtSwingLimit || nominal.Amplifier(a.Name).AtSwingLimit)
            {
                continue;
            }

            double d = corner.Voltage(a.Node) - v0;
            up = Math.Max(up, d);
            down = Math.Max(down, -d);
        }

        return (up, down);
    }

    internal static Corners Compute(DesignAnalyses analyses)
    {
        OperatingPointResult? Run(OffsetCorner corner)
        {
            var chain = ChainElaborator.Elaborate(analyses.Design, ElaborationOptions.Default with { Offset = corner });
            return chain.Succeeded ? Simulate.OperatingPoint(chain.Circuit) : null;
        }

        return new Corners(analyses.OperatingPoint(), Run(OffsetCorner.MaximumPositive), Run(OffsetCorner.MaximumNegative));
    }
}
