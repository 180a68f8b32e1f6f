using DesignRules.Diagnostics;
using DesignRules.Rules.Evaluation;

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

        foreach (var stage in evaluation.Design.Stages)
        {
            var stageId = stage.Id.Value;
            if (steps.Of(stageId) is not { } step)
            {
                continue;
            }

            var limit = evaluation.Threshold(Id, "max-overshoot", stageId);
            var r = step.Response;
            evaluation.Record(stageId, FigureKinds.StepOvershoot.Of(r.Overshoot).AtMost(limit));
            if (r.SettlingTime is { } settling)
            {
                evaluation.Record(stageId, FigureKinds.StepSettling.Of(settling));
            }

            if (r.Overshoot <= limit)
            {
                continue;
            }

            evaluation.Report(Id, stageId, stage.Id.Span, new Dictionary<string, string>
            {
                ["stage"] = stageId,
                ["step"] = Say.Volts(steps.Step),
                ["overshoot"] = Say.Percent(r.Overshoot),
                ["time"] = Say.Seconds(r.PeakTime),
                ["settling"] = r.SettlingTime is { } s ? Say.Seconds(s) : "longer than the record",
                ["limit"] = Say.Percent(limit),
            }, FigureKinds.StepOvershoot.Of(r.Overshoot).AtMost(limit));
        }
    }
}
