using DesignRules.Diagnostics;
using DesignRules.Rules.Evaluation;
using DesignRules.Rules.Evaluation.Tolerance;

namespace DesignRules.Rules.Catalogue.Tolerance;

/// <summary>
/// DR405: a stage's output at its bias level (0 V input, or the source's DC level when the signal never visits 0 V), by an
/// extreme-value analysis over every variable (resistor corners with offset voltages, bias and offset currents at their
/// maxima together), against its output-offset requirement.
/// </summary>
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
            var hot = analysis.WorstTemperatureOf(a => a.OutputOffset);
            var figure = FigureKinds.OutputOffset.Of(offset).AtTemperature(hot);
            evaluation.Record(id, stage.Stage.Requirements.OutputOffset is { } allowed ? figure.AtMost(allowed.Value.Value) : figure);
            if (hot is { } worstAt)
            {
                evaluation.Record(id, FigureKinds.WorstTemperature.Of("offset", worstAt));
                evaluation.Record(id, FigureKinds.OffsetDrift.Of(analysis.OffsetDrift));
            }

            evaluation.Judged(id, "output-offset", Id);
            if (stage.Stage.Requirements.OutputOffset is not { } required || offset <= required.Value.Value)
            {
                continue;
            }

            int zero = analysis.Plan.ZeroIndex;
            // The cross terms of the extreme-value corners (bias current × resistor mismatch) are a contributor of their own.
            var cross = analysis.CrossTerm > 0 && stage.Amplifiers.Count > 0
                ? new Contribution("bias currents through the resistors' tolerance", "bias currents × resistor tolerance",
                    ToleranceSpans.Amplifier(evaluation.Design, stage, stage.Amplifiers[0].Slot), analysis.CrossTerm, double.NaN)
                : null;
            var (dominant, detail) = ToleranceAnalyses.Breakdown(analysis, f => f.Deviations[zero], 1, evaluation.Design, also: cross);
            evaluation.Report(Id, id, ToleranceAnalyses.Target(dominant, required.Span), new Dictionary<string, string>
            {
                ["stage"] = id,
                ["offset"] = Say.Volts(offset),
                ["limit"] = Say.Volts(required.Value.Value),
                ["cause"] = (dominant is null ? "the nominal circuit" : dominant.What) + ToleranceAnalyses.AtTemperature(hot),
            }, FigureKinds.OutputOffset.Of(offset).AtTemperature(hot), FigureKinds.AllowedOutputOffset.Of(required.Value.Value));
        }
    }
}
