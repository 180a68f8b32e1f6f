using DesignRules.Diagnostics;
using DesignRules.Rules.Evaluation;
using DesignRules.Rules.Evaluation.Tolerance;
using DesignRules.Figures.Stability;

namespace DesignRules.Rules.Catalogue.Stability;

/// <summary>
/// DR514: a stage output must not overshoot a small step by more than the threshold. Records the overshoot and the 1 %
/// settling time of every stage output that settles within the step record.
/// </summary>
internal sealed class StepOvershootRule : Rule
{
    public override RuleId Id => RuleIds.StepOvershoot;

    public override void Evaluate(DesignEvaluation evaluation)
    {
        var steps = evaluation.Analyses.Steps;
        if (steps.Failure is { } failure)
        {
            evaluation.ReportFailure("the step-response analysis", failure, steps.Chain);
            return;
        }

        // Where a part's gbw-derating raises its GBW at an end of the operating range, the loop rings more there (its
        // crossover moves up towards the second pole and a load's pole), so the step is also taken with that end's GBWs
        // and the larger overshoot counts, as DR510 judges the margin.
        var candidates = new List<(StepFigures Steps, double? At)> { (steps, null) };
        foreach (var end in evaluation.Analyses.GbwEnds.Where(e => e.Raises))
        {
            var atEnd = evaluation.Analyses.StepsAt(end);
            if (atEnd.Failure is null)
            {
                candidates.Add((atEnd, end.Celsius));
            }
        }

        foreach (var stage in evaluation.Design.Stages)
        {
            var stageId = stage.Id.Value;
            var judged = candidates.Select(c => (Answer: c.Steps.Of(stageId), Size: c.Steps.Step, c.At)).Where(c => c.Answer is not null)
                .OrderByDescending(c => c.Answer!.Response.Overshoot).FirstOrDefault();
            if (judged.Answer is not { } step)
            {
                continue;
            }

            var at = judged.At;
            var limit = evaluation.Threshold(Id, "max-overshoot", stageId);
            var r = step.Response;
            evaluation.Record(stageId, FigureKinds.StepOvershoot.Of(r.Overshoot).AtMost(limit).AtTemperature(at));
            if (r.SettlingTime is { } settling)
            {
                evaluation.Record(stageId, FigureKinds.StepSettling.Of(settling).AtTemperature(at));
            }

            if (r.Overshoot <= limit)
            {
                continue;
            }

            evaluation.Report(Id, stageId, stage.Id.Span, new Dictionary<string, string>
            {
                ["stage"] = stageId,
                ["step"] = Say.Volts(judged.Size),
                ["at"] = ToleranceAnalyses.AtTemperature(at),
                ["overshoot"] = Say.Percent(r.Overshoot),
                ["time"] = Say.Seconds(r.PeakTime),
                ["settling"] = r.SettlingTime is { } s ? Say.Seconds(s) : "longer than the record",
                ["limit"] = Say.Percent(limit),
            }, FigureKinds.StepOvershoot.Of(r.Overshoot).AtMost(limit).AtTemperature(at));
        }
    }
}
