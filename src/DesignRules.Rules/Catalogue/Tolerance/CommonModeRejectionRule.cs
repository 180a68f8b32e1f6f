using DesignRules.Rules.Evaluation;
using DesignRules.Rules.Evaluation.Tolerance;

namespace DesignRules.Rules.Catalogue.Tolerance;

/// <summary>
/// DR403: a difference stage fed from a split source: its worst-case common-mode rejection over the resistor corners and
/// the output error the source's common-mode level then causes, against the accuracy.
/// </summary>
internal sealed class CommonModeRejectionRule : Rule
{
    public override string Id => "DR403";

    public override void Evaluate(DesignEvaluation evaluation)
    {
        foreach (var stage in ToleranceAnalyses.Stages(evaluation))
        {
            string id = stage.StageId;
            var analysis = ToleranceAnalyses.WorstCase(evaluation, stage);
            if (analysis.Plan.CommonMode is null || ToleranceAnalyses.ReportFailure(evaluation, analysis))
            {
                continue;
            }

            double cmrr = analysis.WorstCommonModeRejection;
            double level = evaluation.Design.Source.CommonMode!.Value.Value;
            double error = level == 0 ? 0 : analysis.CommonModeShift.Magnitude;
            if (double.IsFinite(cmrr)) evaluation.Record(id, "worst-case common-mode rejection", cmrr, "1");
            evaluation.Record(id, "common-mode output error", error, "V");
            double accuracy = ToleranceAnalyses.Accuracy(stage) ?? evaluation.Threshold(Id, "default-accuracy", id);
            double limit = accuracy * analysis.Metric.FullScale;
            if (!(error > limit))
            {
                continue;
            }

            double tolerance = analysis.Variables.Resistors.Select(r => r.Tolerance).DefaultIfEmpty(0).Max();
            var (dominant, _) = ToleranceAnalyses.Breakdown(analysis, f => f.CommonModeShift, 1, evaluation.Design);
            var fallback = stage.Stage.Requirements.Accuracy?.Span ?? stage.Stage.Span;
            evaluation.Report(Id, id, ToleranceAnalyses.Target(dominant, fallback), new Dictionary<string, string>
            {
                ["stage"] = id,
                ["cmrr"] = $"{Say.Ratio(cmrr)} ({Say.Decibels(cmrr)})",
                ["tolerance"] = Say.Percent(tolerance),
                ["vcm"] = Say.Volts(level),
                ["error"] = Say.Volts(error),
                ["limit"] = $"{Say.Volts(limit)}, {Say.Percent(accuracy)} of the {Say.Volts(analysis.Metric.FullScale)} full scale",
            }, new Figure("common-mode output error", error, "V"), new Figure("allowed error", limit, "V"), new Figure("worst-case common-mode rejection", cmrr, "1"));
        }
    }
}
