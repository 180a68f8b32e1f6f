using DesignRules.Diagnostics;
using DesignRules.Rules.Evaluation;
using DesignRules.Rules.Evaluation.Tolerance;

namespace DesignRules.Rules.Catalogue.Tolerance;

/// <summary>DR405: a stage's output with zero input, offset voltages and bias currents at their maxima, against its output-offset requirement.</summary>
internal sealed class OutputOffsetRule : Rule
{
    public override RuleId Id => RuleIds.OutputOffset;

    public override void Evaluate(DesignEvaluation evaluation)
    {
        foreach (var stage in ToleranceAnalyses.Stages(evaluation))
        {
            string id = stage.StageId;
            var analysis = ToleranceAnalyses.WorstCase(evaluation, stage);
            if (ToleranceAnalyses.ReportFailure(evaluation, analysis)) continue;
            double offset = analysis.OutputOffset;
            if (double.IsNaN(offset)) continue;
            var figure = FigureKinds.OutputOffset.Of(offset);
            evaluation.Record(id, stage.Stage.Requirements.OutputOffset is { } allowed ? figure.AtMost(allowed.Value.Value) : figure);
            evaluation.Judged(id, "output-offset", Id);
            if (stage.Stage.Requirements.OutputOffset is not { } required || offset <= required.Value.Value)
            {
                continue;
            }

            int zero = analysis.Plan.ZeroIndex;
            var (dominant, detail) = ToleranceAnalyses.Breakdown(analysis, f => f.Deviations[zero], 1, evaluation.Design);
            evaluation.Report(Id, id, ToleranceAnalyses.Target(dominant, required.Span), new Dictionary<string, string>
            {
                ["stage"] = id,
                ["offset"] = Say.Volts(offset),
                ["limit"] = Say.Volts(required.Value.Value),
                ["cause"] = dominant is null ? "the nominal circuit" : dominant.What,
            }, FigureKinds.OutputOffset.Of(offset), FigureKinds.AllowedOutputOffset.Of(required.Value.Value));
        }
    }
}
