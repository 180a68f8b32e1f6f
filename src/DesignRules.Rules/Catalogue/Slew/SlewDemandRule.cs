using DesignRules.Diagnostics;
using DesignRules.Rules.Evaluation;
using DesignRules.Rules.Evaluation.Tolerance;

namespace DesignRules.Rules.Catalogue.Slew;

/// <summary>
/// DR102: on every amplifier output node, each slewing event seen in the transient (a monotone run at the slew rate:
/// a jump across a diode dead zone, a return from a rail, an edge) must cover its voltage within the time allowed — the
/// stage's glitch requirement, else window-fraction × period. The demand is that voltage over that time, against the
/// part's slew rate in the event's direction. Smooth signals inside the full-power bandwidth raise no event. Where the
/// design states a temperature range and the part a slew-rate derating, the slew rate is the slowest over the range (at
/// one of its ends) and the finding names that temperature, as DR101 does.
/// </summary>
internal sealed class SlewDemandRule : Rule
{
    public override RuleId Id => RuleIds.SlewDemand;

    public override void Evaluate(DesignEvaluation evaluation)
    {
        var worst = new Dictionary<string, Demand>(StringComparer.Ordinal);
        var order = new List<string>();
        foreach (var band in AmplifierWaveforms.AtEveryEnd(evaluation.Analyses).Where(b => b.IsPeriodic))
        {
            foreach (var a in band.Amplifiers)
            {
                var stageId = a.Stage.StageId;
                // The waveform is the 25 °C one; the part may slew slower at an end of the range (its slew-derating), and a
                // demand is met only if it is met there too.
                var (derating, _) = TemperatureBehaviour.SlowestSlew(evaluation.Design, a.Probe.Part);
                double window = a.Stage.Stage.Requirements.Glitch?.Value.Value
                    ?? evaluation.Threshold(Id, "window-fraction", stageId) / band.Frequency!.Value;
                // Without slewing events the output follows a smooth signal and its demand is its peak slope; with events,
                // the peak slope is the slew rate itself and the demand is the events' swing over the time allowed.
                var demand = new Demand(a, band.Frequency!.Value, window, null, a.PeakSlope, a.Events.Count == 0 ? a.PeakSlope / (a.SlewSlower * derating) : double.NegativeInfinity);
                double followed = FollowedSlope(band, a);
                foreach (var e in a.Events)
                {
                    // An amplifier in a linear loop must follow its waveform, no faster: an edge of the source slower than
                    // the allowance demands only its own slope. A jump the ideal makes as a step (a diode switching on the
                    // amplifier's output) has only the allowance.
                    double rate = Math.Min(e.Swing / window, followed);
                    double ratio = rate / ((e.Rising ? a.SlewRising : a.SlewFalling) * derating);
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
            var (derating, at) = TemperatureBehaviour.SlowestSlew(evaluation.Design, a.Probe.Part);
            var demanded = FigureKinds.SlewDemand.Of(a.Node, d.Rate);
            evaluation.Record(a.Stage.StageId, d.Event is { } judged ? demanded.AtMost((judged.Rising ? a.SlewRising : a.SlewFalling) * derating).AtTemperature(at) : demanded);
            if (d.Event is not { } e || d.Ratio <= 1)
            {
                continue;
            }

            double slew = (e.Rising ? a.SlewRising : a.SlewFalling) * derating;
            double time = e.Swing / d.Rate;
            evaluation.Report(Id, a.Stage.StageId, a.Named.PartSpan, new Dictionary<string, string>
            {
                ["node"] = a.Node,
                ["demand"] = Say.Slew(d.Rate),
                ["frequency"] = Say.Hertz(d.Frequency),
                ["swing"] = Say.Volts(e.Swing),
                ["window"] = Say.Seconds(time),
                ["slew"] = Say.Slew(slew) + ToleranceAnalyses.AtTemperature(at),
                ["margin"] = Say.Slew(d.Rate - slew),
            }, FixHints.ConfirmAmplifier(evaluation, this, FixHints.MinimumSlewRate(evaluation, a.Name, d.Rate / derating), FixHints.WithSlewRate)
                // As it stands: a swing that scales with the signal, or a window that scales with the period, needs 1/ratio of
                // today's amplitude or band top (the guess); a jump fixed by the circuit (a rail, a diode drop) does not
                // scale with the amplitude, and the search says so.
                .Or(SearchedFixHints.MaximumAmplitude(evaluation, this, a.Stage.StageId, a.Named.PartSpan, 1 / d.Ratio))
                .Or(SearchedFixHints.MaximumBandTop(evaluation, this, a.Stage.StageId, a.Named.PartSpan, 1 / d.Ratio)), FigureKinds.SlewDemand.Of(a.Node, d.Rate).AtTemperature(at), FigureKinds.SlewRate.Of(slew).AtTemperature(at),
               FigureKinds.SlewingSwing.Of(e.Swing), FigureKinds.SlewWindow.Of(time));
        }
    }

    /// <summary>
    /// The steepest slope of the waveform an amplifier in a linear loop must follow, V/s: the source's steepest slope
    /// (a square's span over its edge time) times the amplifier's gain from the source (its output's peak-to-peak over the
    /// source's). Infinite for an amplifier switched by a diode on its own output, whose ideal jumps.
    /// </summary>
    private static double FollowedSlope(BandWaveforms band, AmplifierWaveform a)
    {
        if (a.Stage.Diodes.Any(d => d.Anode == a.Probe.OutputNode || d.Cathode == a.Probe.OutputNode) || band.Period is not { } period)
        {
            return double.PositiveInfinity;
        }

        var (slope, span) = WaveformShape.Steepest(band.Chain.SourceWaveform, period);
        double gain = span > 0 ? (a.Maximum - a.Minimum) / span : double.PositiveInfinity;
        return slope * gain is var followed && followed > 0 && double.IsFinite(followed) ? followed : double.PositiveInfinity;
    }

    private sealed record Demand(AmplifierWaveform Amplifier, double Frequency, double Window, SlewingEvent? Event, double Rate, double Ratio);
}
