using DesignRules.Diagnostics;
using DesignRules.Rules.Evaluation;
using DesignRules.Rules.Evaluation.LoadingBandwidthStress;

namespace DesignRules.Rules.Catalogue.Loading;

/// <summary>
/// DR301: the peak current each amplifier output is asked for in the transient (load, feedback network and next stage
/// together) at each band end, against the part's rated output current derated. A current-limited output delivers only its
/// limit, so the demand comes from a run without the limit (<see cref="OutputCurrentDemand"/>); where the limit is what
/// clips the output, this finding says so and DR201 stays silent about it (one cause, one finding). Judged at the nominal
/// values and at every resistor-tolerance corner of <see cref="ToleranceCorners"/>; the worst is reported with its corner.
/// </summary>
internal sealed class OutputCurrentRule : Rule
{
    public override RuleId Id => RuleIds.OutputCurrent;

    public override void Evaluate(DesignEvaluation evaluation)
    {
        var peaks = new Dictionary<string, (AmplifierDemand Demand, Elaboration.StageProbe Stage, Elaboration.AmplifierProbe Amplifier, ToleranceCorner? Corner)>(StringComparer.Ordinal);
        var runs = evaluation.Analyses.SettledTransients.Select(r => (Corner: (ToleranceCorner?)null, r.Chain, Demands: OutputCurrentDemand.At(evaluation.Analyses, r.End)))
            .Concat(evaluation.Analyses.CornerDemands.Select(c => ((ToleranceCorner?)c.Corner, c.Chain, c.Demands)));
        foreach (var (corner, chain, demands) in runs)
        {
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
                        peaks[amp.ElementId] = (demand, stage, amp, corner);
                    }
                }
            }
        }

        var filling = evaluation.Analyses.FillingHolds;
        foreach (var (id, (demand, stage, amp, corner)) in peaks.OrderBy(p => p.Key, StringComparer.Ordinal))
        {
            // The amplifier charging a hold capacitor that is still filling: DR305 reports the charge current it needs.
            if (filling.TryGetValue(stage.StageId, out var hold) && hold.Amplifier.ElementId == amp.ElementId)
            {
                continue;
            }

            var stageId = stage.StageId;
            double peak = demand.Demanded;
            double rating = amp.Part.OutputCurrent.Value.Value;
            double derating = evaluation.Threshold(Id, "derating", stageId);
            double limit = rating * derating;
            evaluation.Record(stageId, FigureKinds.OutputCurrent.Of(amp.Slot, peak).AtMost(limit));
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
                ["current"] = corner is null ? Say.Amps(peak) : $"{Say.Amps(peak)} ({corner.Phrase})",
                ["rating"] = Say.Amps(rating),
                ["limit"] = $"{Say.Amps(limit)} ({Say.Percent(derating)})",
                ["margin"] = Say.Amps(peak - limit),
                ["consequence"] = consequence,
            }, FixHints.ConfirmAmplifier(evaluation, this, FixHints.MinimumOutputCurrent(evaluation, id, peak / derating), FixHints.WithOutputCurrent), FigureKinds.OutputCurrent.Of(amp.Slot, peak), FigureKinds.DeratedOutputCurrent.Of(limit),
               FigureKinds.DeliveredOutputCurrent.Of(demand.Delivered));
        }
    }
}
