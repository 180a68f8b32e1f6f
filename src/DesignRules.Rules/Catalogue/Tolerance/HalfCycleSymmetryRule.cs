using DesignRules.Diagnostics;
using DesignRules.Model;
using DesignRules.Rules.Evaluation;
using DesignRules.Rules.Evaluation.Tolerance;

namespace DesignRules.Rules.Catalogue.Tolerance;

/// <summary>DR404: the worst-case mismatch of an absolute-value stage's two half-cycle gains against its accuracy.</summary>
internal sealed class HalfCycleSymmetryRule : Rule
{
    public override RuleId Id => RuleIds.HalfCycleSymmetry;

    public override void Evaluate(DesignEvaluation evaluation)
    {
        foreach (var stage in ToleranceAnalyses.Stages(evaluation))
        {
            string id = stage.StageId;
            var analysis = ToleranceAnalyses.WorstCase(evaluation, stage);
            if (analysis.Target.Kind != TransferKind.AbsoluteValue || ToleranceAnalyses.ReportFailure(evaluation, analysis))
            {
                continue;
            }

            double scale = Math.Abs(analysis.Target.SlopePositive);
            double mismatch = analysis.Mismatch.Magnitude / scale;
            if (double.IsNaN(mismatch)) continue;
            var figure = FigureKinds.HalfCycleMismatch.Of(mismatch);
            evaluation.Record(id, ToleranceAnalyses.Accuracy(stage) is { } allowed ? figure.AtMost(allowed) : figure);
            if (ToleranceAnalyses.Accuracy(stage) is not { } accuracy || mismatch <= accuracy)
            {
                continue;
            }

            var (dominant, detail) = ToleranceAnalyses.Breakdown(analysis, f => f.Mismatch, scale, evaluation.Design);
            evaluation.Report(Id, id, ToleranceAnalyses.Target(dominant, stage.Stage.Requirements.Accuracy!.Span), new Dictionary<string, string>
            {
                ["stage"] = id,
                ["error"] = Say.Percent(mismatch),
                ["detail"] = detail + (dominant is null ? string.Empty : $"; most from {dominant.What}"),
                ["limit"] = Say.Percent(accuracy),
                ["margin"] = Say.Percent(mismatch - accuracy),
            }, SearchedFixHints.MaximumResistorTolerance(evaluation, this, id, FigureKinds.HalfCycleMismatch), FigureKinds.HalfCycleMismatch.Of(mismatch), FigureKinds.Accuracy.Of(accuracy));
        }
    }
}
