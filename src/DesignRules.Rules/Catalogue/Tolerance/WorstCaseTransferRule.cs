using DesignRules.Diagnostics;
using DesignRules.Model;
using DesignRules.Rules.Evaluation;
using DesignRules.Rules.Evaluation.Tolerance;

namespace DesignRules.Rules.Catalogue.Tolerance;

/// <summary>
/// DR401: the extreme-value worst case of a stage's transfer (resistor corners, offsets and bias currents at their maxima,
/// diode forward-voltage spread; for a peak stage also the held value's droop in the nominal transient) against its accuracy.
/// </summary>
internal sealed class WorstCaseTransferRule : Rule
{
    public override RuleId Id => RuleIds.WorstCaseTransfer;

    public override void Evaluate(DesignEvaluation evaluation)
    {
        foreach (var stage in ToleranceAnalyses.Stages(evaluation))
        {
            string id = stage.StageId;
            var analysis = ToleranceAnalyses.WorstCase(evaluation, stage);
            if (ToleranceAnalyses.ReportFailure(evaluation, analysis)) continue;
            var (error, level) = analysis.TransferError;
            if (double.IsNaN(error)) continue;
            // An average is judged over time (ripple, settling), which this DC analysis does not see: no limit for it here.
            // With an operating range, the end (or middle) at which the error is worst: a finding names it.
            var hot = analysis.WorstTemperatureOf(a => a.TransferError.Error);
            if (hot is { } worstAt)
            {
                evaluation.Record(id, FigureKinds.WorstTemperature.Of("transfer", worstAt));
            }

            var transferError = FigureKinds.WorstCaseTransferError.Of(error).AtTemperature(hot);
            evaluation.Record(id, ToleranceAnalyses.Accuracy(stage) is { } allowed && analysis.Target.Kind != TransferKind.Average ? transferError.AtMost(allowed) : transferError);
            if (analysis.Target.Kind != TransferKind.Average)
            {
                evaluation.Judged(id, "accuracy", Id);
                evaluation.Judged(id, "transfer", Id);
                evaluation.Judged(id, "gain", Id);
            }

            if (analysis.Target.IsLinear && double.IsFinite(analysis.Gain.Low))
            {
                evaluation.Record(id, FigureKinds.NominalGain.Of(analysis.Nominal.Gain));
                evaluation.Record(id, FigureKinds.WorstCaseGainLow.Of(analysis.Gain.Low));
                evaluation.Record(id, FigureKinds.WorstCaseGainHigh.Of(analysis.Gain.High));
            }

            if (analysis.Metric.Dynamic is { } hold)
            {
                evaluation.Record(id, FigureKinds.HeldDeviation.Of(hold.Magnitude));
            }

            // An average is judged over time (ripple, settling), which this DC analysis does not see.
            if (ToleranceAnalyses.Accuracy(stage) is not { } accuracy || analysis.Target.Kind == TransferKind.Average || error <= accuracy)
            {
                continue;
            }

            var scale = analysis.Metric.FullScale;
            // A peak stage's held value in the transient is listed as the hold capacitor's droop where the stage has one.
            var droop = ToleranceAnalyses.HoldDroop(analysis);
            var extra = analysis.Metric.Dynamic is { } dyn && droop is null ? $"held value in the transient {Say.Percent(dyn.Magnitude / scale)}" : null;
            var (dominant, detail) = ToleranceAnalyses.Breakdown(analysis, f => f.Deviations[level], scale, evaluation.Design, extra, droop);
            var nominal = Math.Abs(analysis.Nominal.Deviations[level]);
            var span = dominant is not null && dominant.Size >= nominal ? dominant.Span : stage.Stage.Requirements.Accuracy!.Span;
            evaluation.Report(Id, id, span, new Dictionary<string, string>
            {
                ["stage"] = id,
                ["error"] = Say.Percent(error),
                ["detail"] = detail + (dominant is null ? string.Empty : $"; most from {dominant.What}") + ToleranceAnalyses.AtTemperature(hot),
                ["limit"] = Say.Percent(accuracy),
                ["margin"] = Say.Percent(error - accuracy),
            }, Fix(evaluation, stage, analysis), [FigureKinds.WorstCaseTransferError.Of(error).AtTemperature(hot), FigureKinds.Accuracy.Of(accuracy),
                .. analysis.Metric.Dynamic is { } held ? [FigureKinds.HoldDroop.Of(held.High - held.Low)] : Array.Empty<Figure>()]);
        }
    }

    /// <summary>
    /// The searched fix: the loosest resistor tolerance that meets the accuracy; where the nominal gain is off the required
    /// one, also the nearest E-series value of the gain-setting resistor that meets it (first where no tolerance would).
    /// </summary>
    private FixHint? Fix(DesignEvaluation evaluation, DesignRules.Elaboration.StageProbe stage, DesignRules.Figures.Tolerance.WorstCaseAnalysis analysis)
    {
        var tolerance = SearchedFixHints.MaximumResistorTolerance(evaluation, this, stage.StageId, FigureKinds.WorstCaseTransferError);
        var value = analysis.Target.Kind == TransferKind.Gain && stage.Stage.Requirements.Gain is not null && stage.Transfer.Gain != 0
            ? SearchedFixHints.GainCorrectingValue(evaluation, this, stage.StageId, analysis.Target.SlopePositive / stage.Transfer.Gain)
            : null;
        return (tolerance, value) switch
        {
            (null, _) => value,
            ({ Value: 0 }, { } v) => v.Or(tolerance),
            _ => tolerance.Or(value),
        };
    }
}
