using DesignRules.Diagnostics;
using DesignRules.Rules.Evaluation;

namespace DesignRules.Rules.Catalogue.Saturation;

/// <summary>
/// DR203: both inputs of every amplifier stay inside the part's common-mode range [Vneg + negative headroom,
/// Vpos − positive headroom] (a negative headroom reaches beyond the rail) throughout the transient at every band end.
/// The negative side of a single-supply stage that lacks a bias point is left to DR205. Judged at the nominal values and
/// at every resistor-tolerance corner of <see cref="ToleranceCorners"/>; the worst is reported with its corner.
/// </summary>
internal sealed class CommonModeRangeRule : Rule
{
    public override RuleId Id => RuleIds.CommonModeRange;

    public override void Evaluate(DesignEvaluation evaluation)
    {
        var worst = new Dictionary<string, Excess>(StringComparer.Ordinal);
        var order = new List<string>();
        var runs = AmplifierWaveforms.AtEveryEnd(evaluation.Analyses).Select(b => (Corner: (ToleranceCorner?)null, Band: b))
            .Concat(evaluation.Analyses.CornerWaveforms.Select(c => ((ToleranceCorner?)c.Corner, c.Band)));
        foreach (var (corner, band) in runs)
        {
            foreach (var a in band.Amplifiers)
            {
                double high = a.Probe.Rails.Positive - a.Probe.Part.InputRange.Positive.Value.Value;
                double low = a.Probe.Rails.Negative + a.Probe.Part.InputRange.Negative.Value.Value;
                double top = Math.Max(a.PlusMaximum, a.MinusMaximum), bottom = Math.Min(a.PlusMinimum, a.MinusMinimum);
                var upper = new Excess(a, "positive", top, high, top - high, corner);
                var lower = new Excess(a, "negative", bottom, low, low - bottom, corner);
                var current = upper.Over >= lower.Over || SingleSupply.NeedsBias(evaluation.Analyses, a.Stage.StageId) ? upper : lower;
                if (!worst.TryGetValue(a.Name, out var previous))
                {
                    order.Add(a.Name);
                    worst[a.Name] = current;
                }
                else if (current.Over > previous.Over)
                {
                    worst[a.Name] = current;
                }
            }
        }

        foreach (var x in order.Select(n => worst[n]))
        {
            var a = x.Amplifier;
            evaluation.Record(a.Stage.StageId, FigureKinds.CommonModeMargin.Of(a.Probe.Slot, -x.Over).AtLeast(0));
            if (x.Over <= 0)
            {
                continue;
            }

            evaluation.Report(Id, a.Stage.StageId, a.Named.PartSpan, new Dictionary<string, string>
            {
                ["amplifier"] = a.Name,
                ["extreme"] = x.Corner is { } c ? $"{Say.Volts(x.Extreme)} ({c.Phrase})" : Say.Volts(x.Extreme),
                ["limit"] = Say.Volts(x.Limit),
                ["rail"] = x.Rail,
                ["margin"] = Say.Volts(x.Over),
            }, FigureKinds.InputExtreme.Of(x.Extreme), FigureKinds.CommonModeLimit.Of(x.Limit));
        }
    }

    private sealed record Excess(AmplifierWaveform Amplifier, string Rail, double Extreme, double Limit, double Over, ToleranceCorner? Corner);
}
