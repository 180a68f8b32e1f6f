using DesignRules.Diagnostics;
using DesignRules.Rules.Evaluation;

namespace DesignRules.Rules.Catalogue.Saturation;

/// <summary>
/// DR202: an amplifier whose loop opens by design (single-diode follower rectifier, peak detector, or a netlist amplifier
/// reaching its feedback only through same-direction diodes) runs to a swing limit while its diode is off. Its recovery
/// at each closing costs about (excursion + Vf)/SR plus the part's overload recovery; reported above max-fraction of the
/// period.
/// </summary>
internal sealed class OpenLoopExcursionRule : Rule
{
    public override RuleId Id => RuleIds.OpenLoopExcursion;

    /// <summary>An output within this distance of a swing limit counts as having run to it, V.</summary>
    private const double AtLimit = 0.05;

    public override void Evaluate(DesignEvaluation evaluation)
    {
        var worst = new Dictionary<string, OpenLoopRun>(StringComparer.Ordinal);
        var order = new List<string>();
        foreach (var band in AmplifierWaveforms.AtEveryEnd(evaluation.Analyses).Where(b => b.IsPeriodic))
        {
            foreach (var a in band.Amplifiers.Where(a => OpenLoop.ByDesign(a.Stage, a.Probe)))
            {
                bool low = a.Minimum <= a.SwingLow + AtLimit, high = a.Maximum >= a.SwingHigh - AtLimit;
                if (!low && !high)
                {
                    continue;
                }

                var (excursion, recovery, extreme) = OpenLoop.RecoveryCost(a, towardsLow: low);
                var current = new OpenLoopRun(a, band.Frequency!.Value, extreme, excursion, recovery, recovery * band.Frequency!.Value);
                if (!worst.TryGetValue(a.Name, out var previous))
                {
                    order.Add(a.Name);
                    worst[a.Name] = current;
                }
                else if (current.Fraction > previous.Fraction)
                {
                    worst[a.Name] = current;
                }
            }
        }

        foreach (var x in order.Select(n => worst[n]))
        {
            var a = x.Amplifier;
            var stageId = a.Stage.StageId;
            evaluation.Record(stageId, FigureKinds.OpenLoopExcursion.Of(a.Probe.Slot, x.Excursion));
            double limit = evaluation.Threshold(Id, "max-fraction", stageId);
            evaluation.Record(stageId, FigureKinds.RecoveryTime.Of(a.Probe.Slot, x.Recovery).AtMost(limit / x.Frequency));
            if (x.Fraction <= limit)
            {
                continue;
            }

            evaluation.Report(Id, stageId, a.Named.PartSpan, new Dictionary<string, string>
            {
                ["node"] = a.Node,
                ["extreme"] = Say.Volts(x.Extreme),
                ["recovery"] = Say.Seconds(x.Recovery),
                ["frequency"] = Say.Hertz(x.Frequency),
                ["fraction"] = Say.Percent(x.Fraction),
                ["limit"] = Say.Percent(limit),
            }, FigureKinds.OpenLoopExcursion.Of(a.Probe.Slot, x.Excursion), FigureKinds.RecoveryTime.Of(a.Probe.Slot, x.Recovery),
               FigureKinds.RecoveryFraction.Of(x.Fraction), FigureKinds.AllowedRecoveryFraction.Of(limit));
        }
    }

    private sealed record OpenLoopRun(AmplifierWaveform Amplifier, double Frequency, double Extreme, double Excursion, double Recovery, double Fraction);
}
