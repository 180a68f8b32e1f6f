using DesignRules.Diagnostics;
using System.Globalization;
using DesignRules.Loading;
using DesignRules.Rules.Evaluation;
using DesignRules.Rules.Evaluation.Tolerance;

namespace DesignRules.Rules.Catalogue.Tolerance;

/// <summary>
/// DR406: the Monte Carlo samples neither show nor refute a stage's required yield — the two-sided Clopper–Pearson
/// interval straddles it. Says how many samples would show it if the observed failure rate held, and where to ask for them.
/// </summary>
internal sealed class YieldNotShownRule : Rule
{
    public override RuleId Id => RuleIds.YieldNotShown;

    public override void Evaluate(DesignEvaluation evaluation)
    {
        foreach (var stage in ToleranceAnalyses.Stages(evaluation))
        {
            string id = stage.StageId;
            if (!evaluation.IsOn(Id, id) || YieldJudgement.Of(evaluation, stage) is not { } judgement)
            {
                continue;
            }

            var estimate = judgement.Estimate;
            if (estimate.Verdict != YieldVerdict.NotShown)
            {
                continue;
            }

            var file = evaluation.RuleSetFile is null
                ? $"a rule-set file `{RuleSetLoader.DefaultFileName}` at the repository root"
                : $"`{Path.GetFileName(evaluation.RuleSetFile)}`";
            string advice;
            if (estimate.SamplesNeeded is { } needed)
            {
                var count = needed.ToString(CultureInfo.InvariantCulture);
                advice = needed <= 1_000_000
                    ? $"If the observed failure rate held, {needed.ToString("N0", CultureInfo.InvariantCulture)} samples would show it: set `samples: {count}` under `rule-set: monte-carlo:` in {file}, or `sequential: true` there to draw batches until the yield is shown or refuted."
                    : $"If the observed failure rate held, {needed.ToString("N0", CultureInfo.InvariantCulture)} samples would show it, more than a rule-set file allows (1,000,000); widen the margin between the transfer error and the accuracy instead.";
            }
            else
            {
                advice = "The observed yield does not exceed the requirement, so more samples would not show it; reduce the largest contributor to the transfer error.";
            }

            var span = stage.Stage.Requirements.Yield?.Span ?? stage.Stage.Requirements.Accuracy!.Span;
            evaluation.Report(Id, id, span, new Dictionary<string, string>
            {
                ["stage"] = id,
                ["accuracy"] = Say.Percent(estimate.Accuracy),
                ["yield"] = YieldEstimate.Pct(estimate.Yield),
                ["samples"] = estimate.Samples.ToString("N0", CultureInfo.InvariantCulture),
                ["seed"] = estimate.Seed.ToString(CultureInfo.InvariantCulture),
                ["confidence"] = YieldEstimate.Pct(estimate.Confidence),
                ["lower"] = YieldEstimate.Pct(estimate.Lower),
                ["upper"] = YieldEstimate.Pct(estimate.Upper),
                ["limit"] = YieldEstimate.Pct(estimate.Required),
                ["advice"] = advice,
            }, YieldFigures.Of(estimate));
        }
    }
}
