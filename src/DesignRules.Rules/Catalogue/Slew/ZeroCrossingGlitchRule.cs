using DesignRules.Diagnostics;
using DesignRules.Rules.Evaluation;

namespace DesignRules.Rules.Catalogue.Slew;

/// <summary>
/// DR103: at the output of every rectifying stage (half-wave, absolute-value, or a netlist with diodes and a rectifier
/// transfer), the longest time after an input zero crossing that the output stays outside the error band around the
/// ideal transfer, against the stage's glitch requirement or max-fraction × period. Points at the amplifier whose
/// slewing event is the longest (the one to make faster).
/// </summary>
internal sealed class ZeroCrossingGlitchRule : Rule
{
    public override RuleId Id => RuleIds.ZeroCrossingGlitch;

    public override void Evaluate(DesignEvaluation evaluation)
    {
        var worst = new Dictionary<string, Glitch>(StringComparer.Ordinal);
        var order = new List<string>();
        foreach (var band in AmplifierWaveforms.AtEveryEnd(evaluation.Analyses).Where(b => b.IsPeriodic))
        {
            double frequency = band.Frequency!.Value;
            foreach (var stage in band.Chain.Stages.Where(StageProperties.IsRectifying))
            {
                var requirements = stage.Stage.Requirements;
                double fraction = requirements.Accuracy?.Value.Value ?? evaluation.Threshold(Id, "band", stage.StageId);
                if (ZeroCrossingGlitch.Of(band, stage, fraction) is not { } glitch)
                {
                    continue;
                }

                double limit = requirements.Glitch?.Value.Value ?? evaluation.Threshold(Id, "max-fraction", stage.StageId) / frequency;
                var amplifiers = band.Amplifiers.Where(a => a.Stage.StageId == stage.StageId).ToList();
                if (amplifiers.Count == 0)
                {
                    continue;
                }

                var slowest = amplifiers.OrderByDescending(a => a.Events.Select(e => e.Duration).DefaultIfEmpty(0).Max()).First();
                var current = new Glitch(slowest, frequency, glitch, limit, slowest.Events.OrderByDescending(e => e.Duration).FirstOrDefault());
                if (!worst.TryGetValue(stage.StageId, out var previous))
                {
                    order.Add(stage.StageId);
                    worst[stage.StageId] = current;
                }
                else if (current.Ratio > previous.Ratio)
                {
                    worst[stage.StageId] = current;
                }
            }
        }

        foreach (var stageId in order)
        {
            var g = worst[stageId];
            evaluation.Record(stageId, FigureKinds.Glitch.Of(g.Measured.Width).AtMost(g.Limit));
            evaluation.Judged(stageId, "glitch", Id);
            if (g.Ratio <= 1)
            {
                continue;
            }

            evaluation.Report(Id, stageId, g.Amplifier.Named.PartSpan, new Dictionary<string, string>
            {
                ["stage"] = stageId,
                ["glitch"] = Say.Seconds(g.Measured.Width),
                ["frequency"] = Say.Hertz(g.Frequency),
                ["node"] = g.Amplifier.Node,
                ["swing"] = Say.Volts(g.Event?.Swing ?? 0),
                ["limit"] = Say.Seconds(g.Limit),
                ["margin"] = Say.Seconds(g.Measured.Width - g.Limit),
            }, FigureKinds.Glitch.Of(g.Measured.Width), FigureKinds.AllowedGlitch.Of(g.Limit),
               FigureKinds.GlitchErrorBand.Of(g.Measured.Tolerance), FigureKinds.SlewingSwing.Of(g.Event?.Swing ?? 0));
        }
    }

    private sealed record Glitch(AmplifierWaveform Amplifier, double Frequency, StageGlitch Measured, double Limit, SlewingEvent? Event)
    {
        public double Ratio => Measured.Width / Limit;
    }
}
