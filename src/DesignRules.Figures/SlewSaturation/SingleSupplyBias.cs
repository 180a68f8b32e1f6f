using DesignRules.Elaboration;
using DesignRules.Simulation;

namespace DesignRules.Figures.SlewSaturation;

/// <summary>How low a single-supply stage's input signal goes, and how low its amplifiers allow.</summary>
/// <param name="Stage">The stage.</param>
/// <param name="Minimum">Lowest input voltage over the band ends, V.</param>
/// <param name="Limit">
/// The lowest input its amplifiers can handle: the negative rail plus the larger of the input common-mode headroom and
/// the output swing headroom to that rail (a follower-like stage needs both), V.
/// </param>
/// <param name="Frequency">The frequency the minimum was seen at, Hz; null for a DC source.</param>
internal sealed record SingleSupplyBias(StageProbe Stage, double Minimum, double Limit, double? Frequency)
{
    /// <summary>True when the signal swings below what the amplifiers allow.</summary>
    public bool NeedsBias => Minimum < Limit;
}

/// <summary>DR205's measurement, shared with DR203 (which leaves the negative side of such stages to DR205).</summary>
internal static class SingleSupply
{
    /// <summary>True when the design runs from a single supply (negative rail 0 V).</summary>
    public static bool IsSingleSupply(DesignAnalyses analyses) => analyses.Design.Supplies.Negative.Value.Value == 0;

    /// <summary>Every stage with amplifiers of a single-supply design, with its input minimum and limit; empty otherwise.</summary>
    public static IReadOnlyList<SingleSupplyBias> Stages(DesignAnalyses analyses) =>
        analyses.SingleSupplyStages;

    /// <summary>True when <paramref name="stageId"/> is a single-supply stage whose signal needs a bias point it lacks.</summary>
    public static bool NeedsBias(DesignAnalyses analyses, string stageId) =>
        Stages(analyses).Any(s => s.Stage.StageId == stageId && s.NeedsBias);

    internal static List<SingleSupplyBias> Compute(DesignAnalyses analyses)
    {
        var result = new List<SingleSupplyBias>();
        if (!IsSingleSupply(analyses))
        {
            return result;
        }

        var worst = new Dictionary<string, SingleSupplyBias>(StringComparer.Ordinal);
        var order = new List<string>();
        foreach (var band in AmplifierWaveforms.AtEveryEnd(analyses))
        {
            foreach (var stage in band.Chain.Stages.Where(s => s.Amplifiers.Count > 0))
            {
                double rail = stage.Amplifiers[0].Rails.Negative;
                double limit = rail + stage.Amplifiers.Max(a => Math.Max(a.Part.InputRange.Negative.Value.Value, a.Part.OutputHeadroom.Negative.Value.Value));
                double minimum = Minimum(band, stage.InputNode);
                if (!Circuit.IsReference(stage.ReferenceInputNode))
                {
                    minimum = Math.Min(minimum, Minimum(band, stage.ReferenceInputNode));
                }

                var current = new SingleSupplyBias(stage, minimum, limit, band.Frequency);
                if (!worst.TryGetValue(stage.StageId, out var previous))
                {
                    order.Add(stage.StageId);
                    worst[stage.StageId] = current;
                }
                else if (current.Minimum - current.Limit < previous.Minimum - previous.Limit)
                {
                    worst[stage.StageId] = current;
                }
            }
        }

        result.AddRange(order.Select(id => worst[id]));
        return result;
    }

    private static double Minimum(BandWaveforms band, string node)
    {
        if (!band.Transient.HasNode(node))
        {
            return 0;
        }

        var time = band.Transient.Time;
        var v = band.Transient.Voltage(node);
        double min = double.PositiveInfinity;
        for (int i = 0; i < time.Count; i++)
        {
            if (time[i] >= band.From)
            {
                min = Math.Min(min, v[i]);
            }
        }

        return double.IsFinite(min) ? min : 0;
    }
}
