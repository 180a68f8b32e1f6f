using DesignRules.Diagnostics;
using DesignRules.Elaboration;
using DesignRules.Model;

namespace DesignRules.Rules.Evaluation.Tolerance;

/// <summary>
/// The verdict of a stage's Monte Carlo samples on its required yield, shared by DR402 (refuted) and DR406 (not shown):
/// the passing count, its two-sided Clopper–Pearson interval at the DR402 <c>confidence</c> threshold, and met when the
/// lower bound reaches the requirement, failed when the upper bound stays below it, not shown otherwise.
/// <para>
/// With <c>sequential: true</c> in the rule-set file, batches of <c>samples</c> are drawn while the verdict is "not
/// shown", up to <c>max-samples</c>. Looking at the interval after every batch would let chance decide more often than
/// the stated level admits, so each look uses the Bonferroni level 1 − (1 − c)/K, with K the most looks the cap allows:
/// the chance that any look is wrong then stays within 1 − c. Sample i is the same in every batch arrangement and on any
/// number of threads, so the outcome is fixed by the seed.
/// </para>
/// </summary>
/// <param name="Estimate">The yield, its interval and the verdict.</param>
/// <param name="MonteCarlo">Every sample drawn.</param>
/// <param name="Analysis">The stage's worst-case analysis (for the largest contributor).</param>
internal sealed record YieldJudgement(YieldEstimate Estimate, MonteCarloYield MonteCarlo, WorstCaseAnalysis Analysis)
{
    /// <summary>The yield rule whose thresholds (min-yield, confidence) both yield rules use.</summary>
    public static readonly RuleId ThresholdRule = RuleIds.MonteCarloYield;

    /// <summary>
    /// The judgement of a stage, computed once per design; null when the stage has no accuracy requirement or its
    /// transfer cannot be judged by samples (an average stage, a failed analysis, which DR920 reports).
    /// </summary>
    public static YieldJudgement? Of(DesignEvaluation evaluation, StageProbe stage)
    {
        if (ToleranceAnalyses.Accuracy(stage) is not { } accuracy)
        {
            return null;
        }

        var analysis = ToleranceAnalyses.WorstCase(evaluation, stage);
        if (ToleranceAnalyses.ReportFailure(evaluation, analysis) || analysis.Target.Kind == TransferKind.Average || !(analysis.Metric.FullScale > 0))
        {
            return null;
        }

        return evaluation.YieldJudgements.TryGetValue(stage.StageId, out var known) ? known
            : evaluation.YieldJudgements[stage.StageId] = Run(evaluation, stage, analysis, accuracy);
    }

    private static YieldJudgement Run(DesignEvaluation evaluation, StageProbe stage, WorstCaseAnalysis analysis, double accuracy)
    {
        string id = stage.StageId;
        var settings = evaluation.MonteCarlo;
        double required = stage.Stage.Requirements.Yield?.Value.Value ?? evaluation.Threshold(ThresholdRule, "min-yield", id);
        double confidence = Math.Clamp(evaluation.Threshold(ThresholdRule, "confidence", id), 0.5, 0.999999);
        int batch = Math.Max(1, settings.Samples);
        int cap = settings.Sequential ? Math.Max(batch, settings.MaxSamples) : batch;
        int looks = (cap + batch - 1) / batch;
        double level = 1 - ((1 - confidence) / looks);

        var monteCarlo = ToleranceAnalyses.MonteCarlo(evaluation, stage);
        YieldEstimate estimate;
        for (int look = 1; ; look++)
        {
            int passing = monteCarlo.PassingWithin(accuracy);
            var (lower, upper) = ClopperPearson.Interval(passing, monteCarlo.Samples, level);
            var verdict = lower >= required ? YieldVerdict.Met : upper < required ? YieldVerdict.Failed : YieldVerdict.NotShown;
            estimate = new YieldEstimate(id, monteCarlo.Samples, passing, monteCarlo.Seed, accuracy, required, level, lower, upper, verdict, null, settings.Sequential);

            // Bounded: at most 'looks' batches, each adding at least one sample up to the cap.
            if (verdict != YieldVerdict.NotShown || monteCarlo.Samples >= cap || look >= looks)
            {
                break;
            }

            var more = MonteCarloYield.Run(analysis, settings,
                monteCarlo.Samples, Math.Min(batch, cap - monteCarlo.Samples), evaluation.Analyses.MaxDegreeOfParallelism);
            monteCarlo = monteCarlo.Append(more);
        }

        if (estimate.Verdict == YieldVerdict.NotShown)
        {
            // Advice for a fixed sample count: judged at the stated level, as a run without batches would be.
            estimate = estimate with { SamplesNeeded = ClopperPearson.SamplesToShow(estimate.Yield, required, confidence) };
        }

        evaluation.Record(id, FigureKinds.Yield.Of(estimate.Yield).AtLeast(required));
        evaluation.Record(id, FigureKinds.YieldLower.Of(estimate.Lower));
        evaluation.Record(id, FigureKinds.YieldUpper.Of(estimate.Upper));
        evaluation.Record(id, FigureKinds.YieldConfidence.Of(estimate.Confidence));
        evaluation.Record(id, FigureKinds.RequiredYield.Of(required));
        evaluation.Record(id, FigureKinds.Samples.Of(monteCarlo.Samples));
        if (monteCarlo.Unsolved > 0) evaluation.Record(id, FigureKinds.UnsolvedSamples.Of(monteCarlo.Unsolved));
        evaluation.RecordYield(estimate);
        evaluation.RecordDistribution(id, new SampleDistribution(
            "transfer error (%)", "%", monteCarlo.Errors.Where(double.IsFinite).Select(e => e * 100).ToArray(), null, accuracy * 100)
        {
            Caption = estimate.Caption,
        });
        return new YieldJudgement(estimate, monteCarlo, analysis);
    }
}
