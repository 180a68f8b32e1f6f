using DesignRules.Model;
using DesignRules.Rules.Evaluation;
using DesignRules.Rules.Evaluation.Tolerance;

namespace DesignRules.Rules.Catalogue.Tolerance;

/// <summary>DR402: the seeded Monte Carlo yield of a stage with an accuracy requirement against its required yield.</summary>
internal sealed class MonteCarloYieldRule : Rule
{
    public override string Id => "DR402";

    public override void Evaluate(DesignEvaluation evaluation)
    {
        foreach (var stage in ToleranceAnalyses.Stages(evaluation))
        {
            string id = stage.StageId;
            if (ToleranceAnalyses.Accuracy(stage) is not { } accuracy || !evaluation.IsOn(Id, id))
            {
                continue;
            }

            var analysis = ToleranceAnalyses.WorstCase(evaluation, stage);
            if (ToleranceAnalyses.ReportFailure(evaluation, analysis) || analysis.Target.Kind == TransferKind.Average || !(analysis.Metric.FullScale > 0))
            {
                continue;
            }

            var monteCarlo = ToleranceAnalyses.MonteCarlo(evaluation, stage);
            double yield = monteCarlo.YieldWithin(accuracy);
            evaluation.Record(id, "Monte Carlo yield", yield, "%");
            evaluation.Record(id, "Monte Carlo samples", monteCarlo.Samples, "1");
            if (monteCarlo.Unsolved > 0) evaluation.Record(id, "Monte Carlo unsolved samples", monteCarlo.Unsolved, "1");
            evaluation.RecordDistribution(id, new SampleDistribution(
                "transfer error (%)", "%", monteCarlo.Errors.Where(double.IsFinite).Select(e => e * 100).ToArray(), null, accuracy * 100));
            var required = stage.Stage.Requirements.Yield;
            double limit = required?.Value.Value ?? evaluation.Threshold(Id, "min-yield", id);
            if (yield >= limit)
            {
                continue;
            }

            var (level, scale) = (analysis.TransferError.Index, analysis.Metric.FullScale);
            var (dominant, _) = ToleranceAnalyses.Breakdown(analysis, f => f.Deviations[level], scale, evaluation.Design);
            var fallback = required?.Span ?? stage.Stage.Requirements.Accuracy!.Span;
            evaluation.Report(Id, id, ToleranceAnalyses.Target(dominant, fallback), new Dictionary<string, string>
            {
                ["stage"] = id,
                ["accuracy"] = Say.Percent(accuracy),
                ["yield"] = Say.Percent(yield),
                ["samples"] = monteCarlo.Samples.ToString(System.Globalization.CultureInfo.InvariantCulture),
                ["seed"] = monteCarlo.Seed.ToString(System.Globalization.CultureInfo.InvariantCulture),
                ["limit"] = Say.Percent(limit),
                ["cause"] = dominant is null ? "the nominal transfer" : dominant.What,
            }, new Figure("Monte Carlo yield", yield, "%"), new Figure("required yield", limit, "1"));
        }
    }
}
