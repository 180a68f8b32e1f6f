using DesignRules.Diagnostics;
using DesignRules.Figures.Filters;
using DesignRules.Rules.Evaluation;

namespace DesignRules.Rules.Catalogue.Filters;

/// <summary>
/// DR410: a filter stage's f0, Q and pass-band gain over its resistor and capacitor tolerances (extreme-value worst case
/// over the tolerance box, and the seeded Monte Carlo's share of samples within the requirement), against the stage's
/// requirements; where the design declares an operating range, over the parts' tempcos too, naming the worst temperature.
/// Runs only for filter stages that state one of them.
/// </summary>
internal sealed class FilterToleranceRule : Rule
{
    public override RuleId Id => RuleIds.FilterTolerance;

    public override void Evaluate(DesignEvaluation evaluation)
    {
        foreach (var stage in FilterStage.Of(evaluation))
        {
            var targets = stage.Targets().ToList();
            if (targets.Count == 0 || stage.Tolerance(evaluation) is not { } tolerance)
            {
                continue;
            }

            foreach (var t in targets)
            {
                double target = FilterStage.Magnitude(t.Target), within = t.Target.Within.Value.Value;
                var range = t.Key switch
                {
                    "q" => tolerance.Q,
                    "passband-gain" => tolerance.Gain,
                    _ => tolerance.F0,
                };
                double error = Math.Max(Math.Abs((range.Low / target) - 1), Math.Abs((range.High / target) - 1));
                double yield = tolerance.YieldWithin(s => t.Key switch { "q" => s.Q, "passband-gain" => s.Gain, _ => s.F0 }, target, within);
                var kinds = FilterFigureKinds.For(t.Key);
                evaluation.Record(stage.Id, kinds.WorstLow.Of(range.Low));
                evaluation.Record(stage.Id, kinds.WorstHigh.Of(range.High));
                evaluation.Record(stage.Id, kinds.WorstDeviation.Of(error).AtMost(within));
                if (double.IsFinite(yield)) evaluation.Record(stage.Id, kinds.ShareWithin.Of(yield));
                evaluation.Judged(stage.Id, t.Key, Id);
                if (error <= within)
                {
                    continue;
                }

                evaluation.Report(Id, stage.Id, t.Target.Within.Span, new Dictionary<string, string>
                {
                    ["stage"] = stage.Id,
                    ["figure"] = t.Name,
                    ["low"] = t.Say(range.Low),
                    ["high"] = t.Say(range.High),
                    ["temperature"] = Temperature(evaluation, tolerance, t.Key, target),
                    ["corners"] = tolerance.Corners.ToString(System.Globalization.CultureInfo.InvariantCulture),
                    ["share"] = double.IsFinite(yield) ? Say.Percent(yield) : "none",
                    ["samples"] = tolerance.Samples.Length.ToString(System.Globalization.CultureInfo.InvariantCulture),
                    ["target"] = t.Say(target),
                    ["within"] = Say.Percent(within),
                    ["error"] = Say.Percent(error),
                }, kinds.WorstDeviation.Of(error).AtMost(within));
            }
        }
    }

    /// <summary>" and tempcos over −40 °C to 85 °C (worst at 85 °C)" where the design declares a range; empty otherwise.</summary>
    private static string Temperature(DesignEvaluation evaluation, FilterTolerance tolerance, string key, double target)
    {
        if (evaluation.Design.Temperature is not { } range ||
            tolerance.WorstTemperature(s => key switch { "q" => s.Q, "passband-gain" => s.Gain, _ => s.F0 }, target) is not { } worst)
        {
            return string.Empty;
        }

        static string Celsius(double t) => new Quantities.Quantity(t, Quantities.Dimension.Temperature).Format();
        return $" and tempcos over {Celsius(range.Value.Low.Value)} to {Celsius(range.Value.High.Value)} (worst at {Celsius(worst)})";
    }
}
