using DesignRules.Diagnostics;
using System.Globalization;
using DesignRules.Rules.Evaluation;
using DesignRules.Rules.Evaluation.Tolerance;

namespace DesignRules.Rules.Catalogue.Tolerance;

/// <summary>
/// DR402: the seeded Monte Carlo yield of a stage with an accuracy requirement refutes its required yield — the upper
/// bound of the two-sided Clopper–Pearson interval stays below it. (A yield the samples neither show nor refute is DR406.)
/// </summary>
internal sealed class MonteCarloYieldRule : Rule
{
    public override RuleId Id => RuleIds.MonteCarloYield;

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
            evaluation.Judged(id, "yield", Id);
            if (estimate.Verdict != YieldVerdict.Failed)
            {
                continue;
            }

            var analysis = judgement.Analysis;
            var (level, scale) = (analysis.TransferError.Index, analysis.Metric.FullScale);
            var (dominant, _) = ToleranceAnalyses.Breakdown(analysis, f => f.Deviations[level], scale, evaluation.Design, also: ToleranceAnalyses.HoldDroop(analysis));
            var fallback = stage.Stage.Requirements.Yield?.Span ?? stage.Stage.Requirements.Accuracy!.Span;
            evaluation.Report(Id, id, ToleranceAnalyses.Target(dominant, fallback), new Dictionary<string, string>
            {
                ["stage"] = id,
                ["accuracy"] = Say.Percent(estimate.Accuracy),
                ["yield"] = YieldEstimate.Pct(estimate.Yield),
                ["samples"] = estimate.Samples.ToString("N0", CultureInfo.InvariantCulture),
                ["seed"] = estimate.Seed.ToString(CultureInfo.InvariantCulture),
                ["confidence"] = YieldEstimate.Pct(estimate.Confidence),
                ["upper"] = YieldEstimate.Pct(estimate.Upper),
                ["limit"] = YieldEstimate.Pct(estimate.Required),
                ["cause"] = dominant is null ? "the nominal transfer" : dominant.What,
            }, YieldFigures.Of(estimate));
        }
    }
}

/// <summary>The figures both yield findings carry: the yield, its interval, the level, the samples and the requirement.</summary>
internal static class YieldFigures
{
    public static Figure[] Of(YieldEstimate e) =>
    [
        FigureKinds.Yield.Of(e.Yield),
        FigureKinds.YieldLower.Of(e.Lower),
        FigureKinds.YieldUpper.Of(e.Upper),
        FigureKinds.YieldConfidence.Of(e.Confidence),
        FigureKinds.Samples.Of(e.Samples),
        FigureKinds.RequiredYield.Of(e.Required),
    ];
}
