using DesignRules.Diagnostics;
using DesignRules.Model;

namespace DesignRules.Figures;

/// <summary>An amplifier of a stage as the design names it: slot or element id, part, and where the part is named.</summary>
internal sealed record StageAmplifier(Stage Stage, string Slot, AmplifierPart Part, SourceSpan PartSpan);

/// <summary>A resistor of a stage: its name, value, family, and where the value is written.</summary>
internal sealed record StageResistor(Stage Stage, string Name, double Value, ResistorFamily? Family, SourceSpan ValueSpan);

/// <summary>Walks the parts of a design's stages, blocks and netlists alike.</summary>
internal static class StageParts
{
    public static IEnumerable<StageAmplifier> Amplifiers(Design design)
    {
        foreach (var stage in design.Stages)
        {
            switch (stage)
            {
                case BlockStage block:
                    foreach (var (slot, part) in block.Amplifiers.OrderBy(a => a.Key, StringComparer.Ordinal))
                    {
                        yield return new StageAmplifier(stage, slot, part, block.PartSpans.TryGetValue(slot, out var span) ? span : block.Span);
                    }

                    break;
                case NetlistStage netlist:
                    foreach (var element in netlist.Elements.Where(e => e.Amplifier is not null))
                    {
                        yield return new StageAmplifier(stage, element.Id.Value, element.Amplifier!, element.Span);
                    }

                    break;
            }
        }
    }

    public static IEnumerable<StageResistor> Resistors(Design design)
    {
        foreach (var stage in design.Stages)
        {
            switch (stage)
            {
                case BlockStage block:
                    foreach (var (name, value) in block.Values.Where(v => v.Value.Quantity.Dimension == Quantities.Dimension.Resistance)
                                 .OrderBy(v => v.Key, StringComparer.Ordinal))
                    {
                        yield return new StageResistor(stage, name, value.Si, value.ResistorFamily, value.Value.Span);
                    }

                    break;
                case NetlistStage netlist:
                    foreach (var element in netlist.Elements.Where(e => e.Kind == ElementKind.Resistor && e.Value is not null))
                    {
                        yield return new StageResistor(stage, element.Id.Value, element.Value!.Value.Value, element.ResistorFamily, element.Value.Span);
                    }

                    break;
            }
        }
    }

    /// <summary>A block value in ohms (or farads, volts), or null when the block has no such value.</summary>
    public static double? Value(BlockStage stage, string name) =>
        stage.Values.TryGetValue(name, out var v) ? v.Si : null;
}
