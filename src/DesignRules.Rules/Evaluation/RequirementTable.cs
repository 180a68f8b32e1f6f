using DesignRules.Diagnostics;
using DesignRules.Elaboration;
using DesignRules.Model;

namespace DesignRules.Rules.Evaluation;

/// <summary>
/// The one table of which rules judge which requirement. A requirement's verdict comes only from the rules that judged
/// it (<see cref="DesignEvaluation.Judged"/>): "not met" when one of them reported it, "met" when one judged it and none
/// reported it, and "not checked" when none judged it.
/// </summary>
public static class RequirementTable
{
    /// <summary>Rule ids that may judge each requirement key.</summary>
    public static IReadOnlyDictionary<string, IReadOnlyList<string>> Rules { get; } = new Dictionary<string, IReadOnlyList<string>>(StringComparer.Ordinal)
    {
        ["transfer"] = [RuleIds.WorstCaseTransfer, RuleIds.HalfCycleSymmetry, RuleIds.AverageTransfer],
        ["gain"] = [RuleIds.WorstCaseTransfer, RuleIds.MonteCarloYield, RuleIds.ClosedLoopBandwidth],
        ["accuracy"] = [RuleIds.SourceImpedance, RuleIds.HighImpedanceOutput, RuleIds.InterstageLoading, RuleIds.WorstCaseTransfer, RuleIds.MonteCarloYield, RuleIds.CommonModeRejection, RuleIds.HalfCycleSymmetry, RuleIds.AverageTransfer, RuleIds.ClosedLoopBandwidth, RuleIds.RectifierLoopGain],
        ["glitch"] = [RuleIds.SlewDemand, RuleIds.ZeroCrossingGlitch],
        ["yield"] = [RuleIds.MonteCarloYield, RuleIds.YieldNotShown],
        ["bandwidth"] = [RuleIds.ClosedLoopBandwidth],
        ["output-offset"] = [RuleIds.OutputOffset],
        ["min-signal"] = [RuleIds.RectifierLoopGain],
        ["cmrr"] = [RuleIds.CommonModeRejection],
    };
}

/// <summary>
/// The one definition of each property of a stage that rules, hygiene checks and pages ask about. Every caller uses
/// these, so that "is this a rectifying stage" has one answer.
/// </summary>
internal static class StageProperties
{
    /// <summary>
    /// True for a stage that rectifies: it holds a diode and its transfer (the one required, else the block's ideal one)
    /// passes one or both half-cycles. A netlist gain stage with a clamp diode does not rectify.
    /// </summary>
    public static bool IsRectifying(StageProbe probe) =>
        probe.Diodes.Count > 0 && probe.Transfer.Kind is TransferKind.AbsoluteValue or TransferKind.HalfWavePositive or TransferKind.HalfWaveNegative;
}
