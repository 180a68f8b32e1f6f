using DesignRules.Rules.Evaluation;
using DesignRules.Rules.Evaluation.LoadingBandwidthStress;
using DesignRules.Simulation;

namespace DesignRules.Rules.Catalogue.Loading;

/// <summary>
/// DR301: the peak current each amplifier delivers in the transient (load, feedback network and next stage together, as
/// the engine's output-current trace has it) at each band end, against the part's rated output current derated.
/// </summary>
internal sealed class OutputCurrentRule : Rule
{
    public override string Id => "DR301";

    public override void Evaluate(DesignEvaluation evaluation)
    {
        var peaks = new Dictionary<string, (double Current, Elaboration.StageProbe Stage, Elaboration.AmplifierProbe Amplifier)>(StringComparer.Ordinal);
        foreach (var (_, chain, result) in TransientRuns.Of(evaluation))
        {
            foreach (var stage in chain.Stages)
            {
                foreach (var amp in stage.Amplifiers)
                {
                    double peak = AmplifierStress.Measure(result, amp.ElementId, chain.Window.MeasureFrom).PeakOutputCurrent;
                    if (!peaks.TryGetValue(amp.ElementId, out var known) || peak > known.Current)
                    {
                        peaks[amp.ElementId] = (peak, stage, amp);
                    }
                }
            }
        }

        foreach (var (id, (peak, stage, amp)) in peaks.OrderBy(p => p.Key, StringComparer.Ordinal))
        {
            var stageId = stage.StageId;
            double rating = amp.Part.OutputCurrent.Value.Value;
            double derating = evaluation.Threshold(Id, "derating", stageId);
            double limit = rating * derating;
            evaluation.Record(stageId, new Figure($"peak output current {amp.Slot}", peak, "A").AtMost(limit));
            if (peak <= limit)
            {
                continue;
            }

            evaluation.Report(Id, stageId, StageFacts.PartSpan(stage.Stage, amp.Slot), new Dictionary<string, string>
            {
                ["amplifier"] = id,
                ["current"] = Say.Amps(peak),
                ["rating"] = Say.Amps(rating),
                ["limit"] = $"{Say.Amps(limit)} ({Say.Percent(derating)})",
                ["margin"] = Say.Amps(peak - limit),
            }, new Figure("peak output current", peak, "A"), new Figure("derated output current", limit, "A"));
        }
    }
}
