using DesignRules.Rules.Evaluation;
using DesignRules.Rules.Evaluation.LoadingBandwidthStress;

namespace DesignRules.Rules.Catalogue.Loading;

/// <summary>
/// DR301: the peak current each amplifier output is asked for in the transient (load, feedback network and next stage
/// together) at each band end, against the part's rated output current derated. A current-limited output delivers only its
/// limit, so the demand comes from a run without the limit (<see cref="OutputCurrentDemand"/>); where the limit is what
/// clips the output, this finding says so and DR201 stays silent about it (one cause, one finding).
/// </summary>
internal sealed class OutputCurrentRule : Rule
{
    public override string Id => "DR301";

    public override void Evaluate(DesignEvaluation evaluation)
    {
        var peaks = new Dictionary<string, (AmplifierDemand Demand, Elaboration.StageProbe Stage, Elaboration.AmplifierProbe Amplifier)>(StringComparer.Ordinal);
        foreach (var (end, chain, _) in TransientRuns.Of(evaluation))
        {
            var demands = OutputCurrentDemand.At(evaluation.Analyses, end);
            foreach (var stage in chain.Stages)
            {
                foreach (var amp in stage.Amplifiers)
                {
                    if (!demands.TryGetValue(amp.ElementId, out var demand))
                    {
                        continue;
                    }

                    if (!peaks.TryGetValue(amp.ElementId, out var known) || demand.Demanded > known.Demand.Demanded)
                    {
                        peaks[amp.ElementId] = (demand, stage, amp);
                    }
                }
            }
        }

        foreach (var (id, (demand, stage, amp)) in peaks.OrderBy(p => p.Key, StringComparer.Ordinal))
        {
            var stageId = stage.StageId;
            double peak = demand.Demanded;
            double rating = amp.Part.OutputCurrent.Value.Value;
            double derating = evaluation.Threshold(Id, "derating", stageId);
            double limit = rating * derating;
            evaluation.Record(stageId, new Figure($"peak output current {amp.Slot}", peak, "A").AtMost(limit));
            if (peak <= limit)
            {
                continue;
            }

            string consequence = demand.ClipsOnlyByCurrent
                ? $"; the output current-limits at {Say.Amps(demand.Delivered)} and clips at {Say.Volts(demand.OutputReached)} where the stage asks {Say.Volts(demand.OutputAsked)}"
                : demand.CurrentLimited ? $"; the output current-limits at {Say.Amps(demand.Delivered)}" : string.Empty;
            evaluation.Report(Id, stageId, StageFacts.PartSpan(stage.Stage, amp.Slot), new Dictionary<string, string>
            {
                ["amplifier"] = id,
                ["current"] = Say.Amps(peak),
                ["rating"] = Say.Amps(rating),
                ["limit"] = $"{Say.Amps(limit)} ({Say.Percent(derating)})",
                ["margin"] = Say.Amps(peak - limit),
                ["consequence"] = consequence,
            }, new Figure("peak output current", peak, "A"), new Figure("derated output current", limit, "A"),
               new Figure("delivered output current", demand.Delivered, "A"));
        }
    }
}
