using DesignRules.Rules.Evaluation;
using DesignRules.Rules.Evaluation.Stability;
using DesignRules.Rules.Evaluation.Tolerance;
using DesignRules.Diagnostics;
using DesignRules.Figures.Stability;

namespace DesignRules.Rules.Catalogue.Stability;

/// <summary>
/// DR510: every amplifier's loop gain (its return ratio, with the second pole, output resistance, loads, feedback and
/// junction capacitances in place) must keep a phase margin of at least the threshold at its crossover. Records the
/// crossover, phase margin and gain margin of every closed loop. Where a part states a <c>gbw-derating</c> and the design a
/// temperature range, the loop is judged at the end where its GBW is highest when that is worse (<see cref="LoopsOverTemperature"/>).
/// </summary>
internal sealed class PhaseMarginRule : Rule
{
    public override RuleId Id => RuleIds.PhaseMargin;

    public override void Evaluate(DesignEvaluation evaluation)
    {
        var figures = evaluation.Analyses.LoopGains;
        if (figures.Failure is { } failure)
        {
            evaluation.ReportFailure("the loop-gain analysis", failure, figures.Chain);
            return;
        }

        foreach (var amp in StageParts.Amplifiers(evaluation.Design))
        {
            var stageId = amp.Stage.Id.Value;
            if (LoopsOverTemperature.Worst(evaluation, stageId, amp.Slot, m => -(m.PhaseMargin ?? double.PositiveInfinity)) is not { } judged
                || judged.Margins is not { PhaseMargin: { } margin } m)
            {
                continue;
            }

            var (loop, at) = (judged.Loop, judged.At);

            var limit = evaluation.Threshold(Id, "min-phase-margin", stageId);
            evaluation.Record(stageId, FigureKinds.Crossover.Of(amp.Slot, m.Crossover!.Value).AtTemperature(at));
            evaluation.Record(stageId, FigureKinds.PhaseMargin.Of(amp.Slot, margin).AtLeast(limit).AtTemperature(at));
            if (m.GainMargin is { } gm)
            {
                evaluation.Record(stageId, FigureKinds.GainMargin.Of(amp.Slot, 20 * Math.Log10(gm)).AtTemperature(at));
            }

            if (margin >= limit)
            {
                continue;
            }

            var loads = figures.Chain.Circuit.CapacitorsToFixedNodes(loop.OutputNode);
            evaluation.Report(Id, stageId, amp.PartSpan, new Dictionary<string, string>
            {
                ["amplifier"] = $"{stageId}.{amp.Slot}",
                ["margin"] = StabilityWords.Degrees(margin),
                ["crossover"] = Say.Hertz(m.Crossover.Value),
                ["point"] = loop.OperatingPoint() + ToleranceAnalyses.AtTemperature(at),
                ["limit"] = StabilityWords.Degrees(limit),
                ["shortfall"] = StabilityWords.Degrees(limit - margin),
                ["fix"] = (at is null ? string.Empty : "the part's GBW is highest at that end of the range (its gbw-derating), which moves the crossover up; ") + (loads.Count > 0
                    ? "its output drives a capacitance to ground: isolate it with a series resistor (DR512 gives the value) or make it smaller"
                    : "raise the noise gain, choose a part with a higher second pole for this gain, or add a feedback capacitor that cancels the input capacitance's pole"),
            }, FigureKinds.PhaseMargin.Of(amp.Slot, margin).AtLeast(limit).AtTemperature(at), FigureKinds.Crossover.Of(amp.Slot, m.Crossover.Value).AtTemperature(at));
        }
    }
}
