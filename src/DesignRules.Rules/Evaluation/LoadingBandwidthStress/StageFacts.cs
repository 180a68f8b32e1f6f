using DesignRules.Diagnostics;
using DesignRules.Elaboration;
using DesignRules.Model;
using DesignRules.Simulation;

namespace DesignRules.Rules.Evaluation.LoadingBandwidthStress;

/// <summary>Where a stage's parts are named, and the accuracy each stage must keep.</summary>
internal static class StageFacts
{
    /// <summary>The span of the part reference of an amplifier or diode slot (block) or of the element (netlist).</summary>
    public static SourceSpan PartSpan(Stage stage, string slot) => stage switch
    {
        BlockStage block when block.PartSpans.TryGetValue(slot, out var span) => span,
        NetlistStage netlist when netlist.Elements.FirstOrDefault(e => e.Id.Value == slot) is { } element => element.Span,
        _ => stage.Span,
    };

    /// <summary>The stage's stated accuracy, else the rule's default-accuracy threshold.</summary>
    public static double Accuracy(DesignEvaluation evaluation, DesignRules.Diagnostics.RuleId ruleId, Stage stage) =>
        stage.Requirements.Accuracy?.Value.Value ?? evaluation.Threshold(ruleId, "default-accuracy", stage.Id.Value);

    /// <summary>True for stages that rectify (a precision rectifier: its transfer passes one or both half-cycles).</summary>
    public static bool IsRectifier(StageProbe probe) => StageProperties.IsRectifying(probe);
}
