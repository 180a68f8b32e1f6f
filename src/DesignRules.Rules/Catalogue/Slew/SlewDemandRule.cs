using DesignRules.Rules.Evaluation;

namespace DesignRules.Rules.Catalogue.Slew;

/// <summary>
/// DR102: on every amplifier output node, each slewing event seen in the transient (a monotone run at the slew rate:
/// a jump across a diode dead zone, a return from a rail, an edge) must cover its voltage within the time allowed — the
/// stage's glitch requirement, else window-fraction × period. The demand is that voltage over that time, against the
/// part's slew rate in the event's direction. Smooth signals inside the full-power bandwidth raise no event.
/// </summary>
internal sealed class SlewDemandRule : Rule
{
    public override string Id => "DR102";

    public override void Evaluate(DesignEvaluation evaluation)
    {
        var worst = new Dictionary<string, Demand>(StringComparer.Ordinal);
        var order = new List<string>();
        foreach (var band in AmplifierWaveforms.AtEveryEnd(evaluation.Analyses).Where(b => b.IsPeriodic))
        {
            foreach (var a in band.Amplifiers)
            {
                var stageId = a.Stage.StageId;
                double window = a.Stage.Stage.Requirements.Glitch?.Value.Value
                    ?? evaluation.Threshold(Id, "window-fraction", stageId) / band.Frequency!.Value;
                // Without slewing events the output follows a smooth signal and its demand is its peak slope; with events,
                // the peak slope is the slew rate itself and the demand is the events' swing over the time allowed.
                var demand = new Demand(a, band.Frequency!.Value, window, null, a.PeakSlope, a.Events.Count == 0 ? a.PeakSlope / a.SlewSlower : double.NegativeInfinity);
                foreach (var e in a.Events)
                {
                    double rate = e.Swing / window;
                    double ratio = rate / (e.Rising ? a.SlewRising : a.SlewFalling);
                    if (ratio > demand.Ratio)
                    {
                        demand = demand with { Event = e, Rate = rate, Ratio = ratio };
                    }
                }

                if (!worst.TryGetValue(a.Name, out var previous))
                {
                    order.Add(a.Name);
                    worst[a.Name] = demand;
                }
                else if (demand.Ratio > previous.Ratio)
                {
                    worst[a.Name] = demand;
                }
            }
        }

        foreach (var d in order.Select(n => worst[n]))
        {
            var a = d.Amplifier;
            var demanded = new Figure($"slew demanded at {a.Node}", d.Rate, "V/s");
            evaluation.Record(a.Stage.StageId, d.Event is { } judged ? demanded.AtMost(judged.Rising ? a.SlewRising : a.SlewFalling) : demanded);
            if (d.Event is not { } e || d.Ratio <= 1)
            {
                continue;
            }

            double slew = e.Rising ? a.SlewRising : a.SlewFalling;
            evaluation.Report(Id, a.Stage.StageId, a.Named.PartSpan, new Dictionary<string, string>
            {
                ["node"] = a.Node,
                ["demand"] = Say.Slew(d.Rate),
                ["frequency"] = Say.Hertz(d.Frequency),
                ["swing"] = Say.Volts(e.Swing),
                ["window"] = Say.Seconds(d.Window),
                ["slew"] = Say.Slew(slew),
                ["margin"] = Say.Slew(d.Rate - slew),
            }, new Figure("slew demanded", d.Rate, "V/s"), new Figure("slew rate", slew, "V/s"),
               new Figure("slewing swing", e.Swing, "V"), new Figure("time allowed", d.Window, "s"));
        }
    }

    private sealed record Demand(AmplifierWaveform Amplifier, double Frequency, double Window, SlewingEvent? Event, double Rate, double Ratio);
}
