using DesignRules.Diagnostics;
using DesignRules.Rules.Evaluation;
using DesignRules.Rules.Evaluation.LoadingBandwidthStress;

namespace DesignRules.Rules.Catalogue.Saturation;

/// <summary>
/// DR201: every amplifier output stays inside its swing limits (rail less the part's headroom) by the margin threshold,
/// at the largest amplitude (the transient at every band end) with the part's maximum offset voltage added in the
/// unfavourable direction. Amplifiers whose loop opens by design are left to DR202, and an output that clips only because
/// its current limit holds it (it does not clip in the run without current limits) is left to DR301, which names that cause.
/// Judged at the nominal values and at every resistor-tolerance corner of <see cref="ToleranceCorners"/>; the worst is
/// reported with the corner it occurs at.
/// </summary>
internal sealed class OutputSwingRule : Rule
{
    public override RuleId Id => RuleIds.OutputSwing;

    public override void Evaluate(DesignEvaluation evaluation)
    {
        var worst = new Dictionary<string, Swing>(StringComparer.Ordinal);
        var order = new List<string>();
        var runs = AmplifierWaveforms.AtEveryEnd(evaluation.Analyses).Select(b => (Corner: (ToleranceCorner?)null, Band: b, Demands: OutputCurrentDemand.At(evaluation.Analyses, b.End)))
            .Concat(evaluation.Analyses.CornerWaveforms.Select(c => ((ToleranceCorner?)c.Corner, c.Band, OutputCurrentDemand.AtCorner(evaluation.Analyses, c.Band.Chain))));
        foreach (var (corner, band, demands) in runs)
        {
            foreach (var a in band.Amplifiers.Where(a => !OpenLoop.ByDesign(a.Stage, a.Probe)))
            {
                double margin = evaluation.Threshold(Id, "margin", a.Stage.StageId);
                var (up, down) = OffsetShift.Of(evaluation.Analyses, a);

                // An output the engine held at a limit clips whatever the offset; the drop across the output resistance
                // may keep the pin itself a little inside the limit, so the flag decides, on the side it is nearer to.
                // A drive held at the swing limit only because the output current limit opened the loop is DR301's cause.
                bool byCurrent = demands.TryGetValue(a.Name, out var demand) && demand.ClipsOnlyByCurrent;
                bool clipsHigh = a.ReachedSwingLimit && !byCurrent && a.SwingHigh - a.Maximum <= a.Minimum - a.SwingLow;
                bool clipsLow = a.ReachedSwingLimit && !byCurrent && !clipsHigh;
                var high = new Swing(a, "positive", clipsHigh ? a.Maximum : a.Maximum + up, clipsHigh ? 0 : up, a.SwingHigh, a.SwingHigh - margin, margin, clipsHigh, corner);
                var low = new Swing(a, "negative", clipsLow ? a.Minimum : a.Minimum - down, clipsLow ? 0 : down, a.SwingLow, a.SwingLow + margin, margin, clipsLow, corner);
                var current = high.Over >= low.Over ? high : low;
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

        foreach (var s in order.Select(n => worst[n]))
        {
            var a = s.Amplifier;
            // The room left to the swing limit, judged against the margin threshold (a clipping output has none left).
            double room = s.Clips ? 0 : s.Rail == "positive" ? s.Limit - s.Extreme : s.Extreme - s.Limit;
            evaluation.Record(a.Stage.StageId, FigureKinds.SwingMargin.Of(a.Probe.Slot, room).AtLeast(s.Margin));
            if (s.Over <= 0 && !s.Clips)
            {
                continue;
            }

            var extreme = Say.Volts(s.Extreme);
            var notes = new List<string>();
            if (s.Clips)
            {
                notes.Add("clipping at the swing limit");
            }

            if (s.Offset > 0)
            {
                notes.Add($"including {Say.Volts(s.Offset)} from the maximum offset voltage");
            }

            if (s.Corner is { } corner)
            {
                notes.Add(corner.Phrase);
            }

            evaluation.Report(Id, a.Stage.StageId, a.Named.PartSpan, new Dictionary<string, string>
            {
                ["node"] = a.Node,
                ["extreme"] = notes.Count > 0 ? $"{extreme} ({string.Join("; ", notes)})" : extreme,
                ["limit"] = $"{Say.Volts(s.WithMargin)} (the part's {Say.Volts(s.Limit)} with a {Say.Volts(s.Margin)} margin inside it)",
                ["rail"] = s.Rail,
                ["margin"] = s.Clips ? "the output clips" : $"{Say.Volts(s.Over)} over",
            }, Fix(evaluation, s), FigureKinds.OutputExtreme.Of(s.Extreme), FigureKinds.SwingLimit.Of(s.Limit), FigureKinds.OffsetShift.Of(s.Offset));
        }
    }

    /// <summary>
    /// The searched fix: the nearest E-series value of the stage's gain-setting resistor that keeps the output inside its
    /// limit (one YAML value to write), with the largest source amplitude the design handles as it stands beside it; the
    /// amplitude found first guesses the resistor's boundary (the swing scales with gain times amplitude).
    /// </summary>
    private FixHint? Fix(DesignEvaluation evaluation, Swing s)
    {
        var a = s.Amplifier;
        var stageId = a.Stage.StageId;
        var amplitude = SearchedFixHints.MaximumAmplitude(evaluation, this, stageId, a.Named.PartSpan, AmplitudeGuess(evaluation, s));
        double? scale = amplitude is { Value: > 0 } h && DesignEdits.Amplitude(evaluation.Design) is { } present ? h.Value / present : null;
        var value = SearchedFixHints.GainSettingValue(evaluation, this, stageId, a.Named.PartSpan, scale);
        return value is null ? amplitude : value.Or(amplitude);
    }

    /// <summary>
    /// The closed-form guess of the largest amplitude, as a fraction of today's, for an amplifier that drives its stage's
    /// output: the ideal transfers of the stages up to it give its peak G·A, and the limit less the margin and the offset
    /// shift over that peak is the fraction that just fits (rails taken around 0 V; the search corrects what this misses).
    /// </summary>
    private static double? AmplitudeGuess(DesignEvaluation evaluation, Swing s)
    {
        var a = s.Amplifier;
        var chain = evaluation.Analyses.Chain(Elaboration.BandEnd.Top);
        if (a.Probe.OutputNode != a.Stage.OutputNode || !chain.Succeeded || DesignEdits.Amplitude(evaluation.Design) is not { } present)
        {
            return null;
        }

        double gain = 1;
        foreach (var stage in chain.Stages)
        {
            gain *= stage.Transfer.Gain;
            if (stage.StageId == a.Stage.StageId)
            {
                break;
            }
        }

        double room = Math.Abs(s.WithMargin) - s.Offset;
        double guess = room / Math.Abs(gain * present);
        return guess > 0 && guess < 1 && double.IsFinite(guess) ? guess : null;
    }

    private sealed record Swing(AmplifierWaveform Amplifier, string Rail, double Extreme, double Offset, double Limit, double WithMargin, double Margin, bool Clips, ToleranceCorner? Corner)
    {
        /// <summary>How far the extreme goes past the limit less the margin (positive: a violation; clipping counts as the whole margin), V.</summary>
        public double Over => Clips ? Math.Max(Margin, Raw) : Raw;

        private double Raw => Rail == "positive" ? Extreme - WithMargin : WithMargin - Extreme;
    }
}
