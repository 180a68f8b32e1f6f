using DesignRules.Elaboration;
using DesignRules.Model;

namespace DesignRules.Figures;

/// <summary>
/// The one definition of each property of a stage that rules, hygiene checks and pages ask about. Every caller uses
/// these, so that "is this a rectifying stage" has one answer.
/// </summary>
internal static class StageProperties
{
    /// <summary>
    /// True for a stage that rectifies: a block whose descriptor says so; a netlist that holds a diode and is required to
    /// pass one or both half-cycles (a netlist gain stage with a clamp diode does not rectify).
    /// </summary>
    public static bool IsRectifying(StageProbe probe) => probe.Stage is BlockStage block
        ? block.Block.Rectifies
        : probe.Diodes.Count > 0 && probe.Transfer.Kind is TransferKind.AbsoluteValue or TransferKind.HalfWavePositive or TransferKind.HalfWaveNegative;
}
