using DesignRules.Diagnostics;
using DesignRules.Elaboration;
using DesignRules.Model;

namespace DesignRules.Figures.Tolerance;

/// <summary>Where the parts of a stage are named in the design file, for findings to point at.</summary>
internal static class ToleranceSpans
{
    public static SourceSpan Amplifier(Design design, StageProbe stage, string slot) =>
        StageParts.Amplifiers(design).FirstOrDefault(a => a.Stage.Id.Value == stage.StageId && a.Slot == slot)?.PartSpan ?? stage.Stage.Span;

    public static SourceSpan Diode(StageProbe stage, string slot) => stage.Stage switch
    {
        BlockStage block when block.PartSpans.TryGetValue(slot, out var span) => span,
        NetlistStage netlist => netlist.Elements.FirstOrDefault(e => e.Id.Value == slot)?.Span ?? stage.Stage.Span,
        _ => stage.Stage.Span,
    };
}
