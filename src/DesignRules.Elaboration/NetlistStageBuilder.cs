using DesignRules.Model;
using DesignRules.Simulation;

namespace DesignRules.Elaboration;

/// <summary>
/// Elaborates an explicit netlist stage. Node names map as follows: the netlist's input node is the node feeding the
/// stage; <see cref="NetlistStage.Ground"/> is the engine's reference <see cref="Circuit.Ground"/>; "vpos" and "vneg" are the supply nodes; every other node
/// becomes <c>stageId.name</c>. Element ids become <c>stageId.elementId</c>; amplifiers are powered from the chain's rails.
/// The tool cannot derive a netlist's ideal transfer; it is taken from the stage's requirements (a gain, or a transfer
/// kind with unit gain) and is a unity gain when none is given.
/// </summary>
internal static class NetlistStageBuilder
{
    public static StageProbe Build(StageBuilder s, NetlistStage netlist)
    {
        string Map(string node) =>
            node == netlist.Input.Value ? s.Input
            : node == NetlistStage.Ground ? Circuit.Ground
            : node is NetlistStage.PositiveRail or NetlistStage.NegativeRail ? node
            : s.Node(node);

        foreach (var e in netlist.Elements)
        {
            var nodes = e.Nodes.Select(n => Map(n.Value)).ToArray();
            string name = e.Id.Value;
            switch (e.Kind)
            {
                case ElementKind.Resistor or ElementKind.Capacitor or ElementKind.Inductor when nodes.Length == 2 && e.Value is not null:
                    s.Passive(name, e.Kind, nodes[0], nodes[1], e.Value.Si(), e.ResistorFamily, e.CapacitorFamily, e.Value.Span);
                    break;
                case ElementKind.Diode when nodes.Length == 2 && e.Diode is not null:
                    s.Diode(name, e.Diode, nodes[0], nodes[1], e.Span);
                    break;
                case ElementKind.Amplifier when nodes.Length == 3 && e.Amplifier is not null:
                    s.Amplifier(name, e.Amplifier, nodes[0], nodes[1], nodes[2], e.Span);
                    break;
                default:
                    s.ReportProblem($"netlist element '{name}' of stage '{s.Id}' is incomplete (its nodes, value or part are missing)", e.Span, $"{s.Id}.{name}");
                    break;
            }
        }

        return s.Finish(Map(netlist.Output.Value), FromRequirements(netlist.Requirements));
    }

    private static IdealTransfer FromRequirements(Requirements requirements)
    {
        if (requirements.Gain is { } gain) return IdealTransfer.Linear(gain.Value.Value);
        return requirements.Transfer?.Value switch
        {
            TransferKind.AbsoluteValue => new IdealTransfer(TransferKind.AbsoluteValue, 1, -1, 0),
            TransferKind.HalfWavePositive => new IdealTransfer(TransferKind.HalfWavePositive, 1, 0, 0),
            TransferKind.HalfWaveNegative => new IdealTransfer(TransferKind.HalfWaveNegative, 0, 1, 0),
            TransferKind.Peak => new IdealTransfer(TransferKind.Peak, 1, 1, 0),
            TransferKind.Average => new IdealTransfer(TransferKind.Average, 1, 1, 0),
            _ => IdealTransfer.Linear(1),
        };
    }
}
