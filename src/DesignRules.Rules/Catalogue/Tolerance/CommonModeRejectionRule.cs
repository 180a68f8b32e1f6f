using DesignRules.Diagnostics;
using DesignRules.Rules.Evaluation;
using DesignRules.Rules.Evaluation.Tolerance;

namespace DesignRules.Rules.Catalogue.Tolerance;

/// <summary>
/// DR403: a difference stage fed from a split source: its worst-case common-mode rejection over the resistor corners
/// against the stage's <c>cmrr</c> requirement, and the output error the source's common-mode level then causes against
/// the accuracy. One finding per stage: a rejection below the requirement is reported first, with the output error beside it.
/// </summary>
internal sealed class CommonModeRejectionRule : Rule
{
    public override RuleId Id => RuleIds.CommonModeRejection;

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
            double accuracy = ToleranceAnalyses.Accuracy(stage) ?? evaluation.Threshold(Id, "default-accuracy", id);
            double limit = accuracy * analysis.Metric.FullScale;
            var required = stage.Stage.Requirements.CommonModeRejection;
            if (double.IsFinite(cmrr))
            {
                var rejection = FigureKinds.CommonModeRejection.Of(cmrr);
                evaluation.Record(id, required is { } atLeast ? rejection.AtLeast(atLeast.Value.Value) : rejection);
            }

            evaluation.Record(id, FigureKinds.CommonModeError.Of(error).AtMost(limit));
            evaluation.Judged(id, "cmrr", Id);
            bool rejectsTooLittle = required is { } r && cmrr < r.Value.Value;
            if (!(error > limit) && !rejectsTooLittle)
            {
                continue;
            }

            double tolerance = analysis.Variables.Resistors.Select(r => r.Tolerance).DefaultIfEmpty(0).Max();
            var (dominant, _) = ToleranceAnalyses.Breakdown(analysis, f => f.CommonModeShift, 1, evaluation.Design);
            var fallback = rejectsTooLittle ? required!.Span : stage.Stage.Requirements.Accuracy?.Span ?? stage.Stage.Span;
            var shift = $"the {Say.Volts(level)} common-mode level then moves the output by {Say.Volts(error)} "
                + $"({Say.Volts(limit)}, {Say.Percent(accuracy)} of the {Say.Volts(analysis.Metric.FullScale)} full scale, allowed)";
            string consequence = rejectsTooLittle
                ? $"at least {Say.Ratio(required!.Value.Value)} ({Say.Decibels(required.Value.Value)}) is required, "
                    + $"{(20 * Math.Log10(required.Value.Value / cmrr)).ToString("0.#", System.Globalization.CultureInfo.InvariantCulture)} dB short; {shift}"
                : shift;
            var figures = new List<Figure>
            {
                FigureKinds.CommonModeRejection.Of(cmrr),
                FigureKinds.CommonModeError.Of(error),
                FigureKinds.AllowedCommonModeError.Of(limit),
            };
            if (required is not null)
            {
                figures.Add(FigureKinds.RequiredCommonModeRejection.Of(required.Value.Value));
            }

            evaluation.Report(Id, id, ToleranceAnalyses.Target(dominant, fallback), new Dictionary<string, string>
            {
                ["stage"] = id,
                ["cmrr"] = $"{Say.Ratio(cmrr)} ({Say.Decibels(cmrr)})",
                ["tolerance"] = Say.Percent(tolerance),
                ["consequence"] = consequence,
            }, SearchedFixHints.MaximumResistorTolerance(evaluation, this, id, FigureKinds.CommonModeError), [.. figures]);
        }
    }
}
