using DesignRules.Rules.Evaluation;
using DesignRules.Rules.Evaluation.Filters;

namespace DesignRules.Rules.Catalogue.Filters;

/// <summary>
/// DR530: a filter stage's f0 (cutoff or centre), Q and pass-band gain as the engine's AC analysis of the built circuit
/// shows them, with nominal parts, against the stage's requirements. Records the measured and ideal figures of every
/// filter stage.
/// </summary>
internal sealed class FilterResponseRule : Rule
{
    public override string Id => "DR530";

    public override void Evaluate(DesignEvaluation evaluation)
    {
        foreach (var stage in FilterStage.Of(evaluation))
        {
            var measured = stage.Measured(evaluation);
            evaluation.Record(stage.Id, new Figure("ideal f0", stage.Ideal.F0, "Hz"));
            evaluation.Record(stage.Id, new Figure("ideal Q", stage.Ideal.Q, "1"));
            if (measured is null)
            {
                continue;
            }

            if (double.IsFinite(measured.LowerMinus3Db)) evaluation.Record(stage.Id, new Figure("lower −3 dB frequency", measured.LowerMinus3Db, "Hz"));
            if (double.IsFinite(measured.UpperMinus3Db)) evaluation.Record(stage.Id, new Figure("upper −3 dB frequency", measured.UpperMinus3Db, "Hz"));
            var judged = stage.Targets().ToDictionary(t => t.Name, StringComparer.Ordinal);
            foreach (var (name, value, unit) in new[] { ("f0", measured.F0, "Hz"), ("Q", measured.Q, "1"), ("pass-band gain", measured.PassbandGain, "1") })
            {
                var key = name == "f0" && stage.Ideal.Shape == Blocks.FilterShape.BandPass ? "centre frequency" : name;
                if (!judged.TryGetValue(key, out var t))
                {
                    evaluation.Record(stage.Id, new Figure($"measured {key}", value, unit));
                    continue;
                }

                double target = FilterStage.Magnitude(t.Target), within = t.Target.Within.Value.Value;
                double error = Math.Abs((value / target) - 1);
                evaluation.Record(stage.Id, new Figure($"measured {key}", value, unit));
                evaluation.Record(stage.Id, new Figure($"{key} deviation", error, "%").AtMost(within));
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
                }, new Figure($"measured {key}", value, unit), new Figure($"{key} deviation", error, "%").AtMost(within));
            }
        }
    }
}
