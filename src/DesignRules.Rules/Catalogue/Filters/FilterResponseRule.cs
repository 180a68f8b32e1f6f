using DesignRules.Diagnostics;
using DesignRules.Rules.Evaluation;
using DesignRules.Figures.Filters;

namespace DesignRules.Rules.Catalogue.Filters;

/// <summary>
/// DR530: a filter stage's f0 (cutoff or centre), Q and pass-band gain as the engine's AC analysis of the built circuit
/// shows them, with nominal parts, against the stage's requirements. Records the measured and ideal figures of every
/// filter stage.
/// </summary>
internal sealed class FilterResponseRule : Rule
{
    public override RuleId Id => RuleIds.FilterResponse;

    public override void Evaluate(DesignEvaluation evaluation)
    {
        foreach (var stage in FilterStage.Of(evaluation))
        {
            var measured = stage.Measured(evaluation);
            evaluation.Record(stage.Id, FigureKinds.IdealF0.Of(stage.Ideal.F0));
            evaluation.Record(stage.Id, FigureKinds.IdealQ.Of(stage.Ideal.Q));
            if (measured is null)
            {
                continue;
            }

            if (double.IsFinite(measured.LowerMinus3Db)) evaluation.Record(stage.Id, FigureKinds.LowerMinus3Db.Of(measured.LowerMinus3Db));
            if (double.IsFinite(measured.UpperMinus3Db)) evaluation.Record(stage.Id, FigureKinds.UpperMinus3Db.Of(measured.UpperMinus3Db));
            var judged = stage.Targets().ToDictionary(t => t.Name, StringComparer.Ordinal);
            foreach (var (name, value, kinds) in new[] { ("f0", measured.F0, stage.Ideal.Shape == Blocks.FilterShape.BandPass ? FilterFigureKinds.Centre : FilterFigureKinds.F0), ("Q", measured.Q, FilterFigureKinds.Q), ("pass-band gain", measured.PassbandGain, FilterFigureKinds.PassbandGain) })
            {
                var key = name == "f0" && stage.Ideal.Shape == Blocks.FilterShape.BandPass ? "centre frequency" : name;
                if (!judged.TryGetValue(key, out var t))
                {
                    evaluation.Record(stage.Id, kinds.Measured.Of(value));
                    continue;
                }

                double target = FilterStage.Magnitude(t.Target), within = t.Target.Within.Value.Value;
                double error = Math.Abs((value / target) - 1);
                evaluation.Record(stage.Id, kinds.Measured.Of(value));
                evaluation.Record(stage.Id, kinds.Deviation.Of(error).AtMost(within));
                evaluation.Judged(stage.Id, t.Key, Id);
                if (error <= within)
                {
                    continue;
                }

                evaluation.Report(Id, stage.Id, t.Target.Value.Span, new Dictionary<string, string>
                {
                    ["stage"] = stage.Id,
                    ["figure"] = key,
                    ["measured"] = t.Say(value),
                    ["ideal"] = t.Say(t.Of(new MeasuredFilter(stage.Ideal.F0, stage.Ideal.Q, Math.Abs(stage.Ideal.PassbandGain), double.NaN, double.NaN))),
                    ["target"] = t.Say(target),
                    ["within"] = Say.Percent(within),
                    ["error"] = Say.Percent(error),
                    ["margin"] = Say.Percent(error - within),
                }, kinds.Measured.Of(value), kinds.Deviation.Of(error).AtMost(within));
            }
        }
    }
}
