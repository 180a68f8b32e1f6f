using DesignRules.Diagnostics;
using System.Numerics;
using DesignRules.Model;
using DesignRules.Rules.Evaluation;
using DesignRules.Rules.Evaluation.LoadingBandwidthStress;

namespace DesignRules.Rules.Catalogue.Loading;

/// <summary>
/// DR304: each stage's output impedance against the input impedance of what it drives (the next stage, or the load after
/// the last stage), from the AC analysis: the loss Zout/(Zout + Zin) at each band-end frequency, and at DC when the signal
/// there carries a mean (a rectified, held or averaged signal, or a DC source or offset). Compared with the tighter of the
/// two stages' accuracies (or default-accuracy). Diode-switched outputs (an output not driven by an amplifier in a stage with diodes) have no meaningful small-signal
/// output impedance at the bias point and are left out (DR303 judges those driven only through a diode). Located at the stage's last value or part, the natural place to add a
/// buffer or change the impedance level.
/// </summary>
internal sealed class InterstageLoadingRule : Rule
{
    public override RuleId Id => RuleIds.InterstageLoading;

    public override void Evaluate(DesignEvaluation evaluation)
    {
        var small = SmallSignal.Of(evaluation.Analyses);
        if (small is null)
        {
            return;
        }

        var stages = small.Chain.Stages;
        bool sourceMean = small.BandFrequencies.Count == 0 || (evaluation.Design.Source.Waveform.Offset?.Value.Value ?? 0) != 0;
        for (int k = 0; k < stages.Count; k++)
        {
            var stage = stages[k];
            if (stage.Diodes.Count > 0 && !stage.Amplifiers.Any(a => a.OutputNode == stage.OutputNode))
            {
                continue; // a diode-switched output has no small-signal output impedance worth the name at its bias point (DR303)
            }

            var loading = evaluation.Analyses.LoadingAt(k);
            if (loading is null)
            {
                continue;
            }

            bool mean = sourceMean || stages.Take(k + 1).Any(s => s.Transfer.Kind != TransferKind.Gain);
            var frequencies = new HashSet<double>(small.BandFrequencies);
            if (mean || frequencies.Count == 0)
            {
                frequencies.Add(SmallSignal.Dc);
            }

            var worst = loading.Points.Where(p => frequencies.Contains(p.Frequency)).MaxBy(p => p.Error);
            if (worst is null)
            {
                continue;
            }

            bool last = k + 1 == stages.Count;
            double accuracy = StageFacts.Accuracy(evaluation, Id, stage.Stage);
            if (!last)
            {
                accuracy = Math.Min(accuracy, StageFacts.Accuracy(evaluation, Id, stages[k + 1].Stage));
            }

            evaluation.Record(stage.StageId, FigureKinds.InterstageLoss.Of(worst.Error).AtMost(accuracy));

            if (worst.Error <= accuracy)
            {
                continue;
            }

            var span = last ? evaluation.Design.Load.Resistance.Span : LastValueSpan(stage.Stage);
            evaluation.Report(Id, stage.StageId, span, new Dictionary<string, string>
            {
                ["stage"] = stage.StageId,
                ["zout"] = Describe(worst.OutputImpedance),
                ["next"] = last ? "the load" : $"stage `{stages[k + 1].StageId}`",
                ["zin"] = Describe(worst.InputImpedance),
                ["frequency"] = worst.Frequency == SmallSignal.Dc ? "DC" : Say.Hertz(worst.Frequency),
                ["error"] = Say.Percent(worst.Error),
                ["limit"] = Say.Percent(accuracy),
                ["margin"] = Say.Percent(worst.Error - accuracy),
            }, FigureKinds.InterstageLoss.Of(worst.Error), FigureKinds.Accuracy.Of(accuracy),
                FigureKinds.OutputImpedance.Of(worst.OutputImpedance.Magnitude), FigureKinds.InputImpedance.Of(worst.InputImpedance.Magnitude));
        }
    }

    private static string Describe(Complex z) => double.IsFinite(z.Magnitude) ? Say.Ohms(z.Magnitude) : "unbounded";

    /// <summary>Where the stage's output impedance is set: its buffer flag, the resistor its output is taken across, or the block.</summary>
    private static Diagnostics.SourceSpan LastValueSpan(Stage stage) => stage switch
    {
        BlockStage block when block.Flags.TryGetValue("buffer", out var flag) => flag.Span,
        BlockStage block when block.Block.OutputValue is { } name && block.Values.TryGetValue(name, out var value) => value.Value.Span,
        BlockStage block => block.BlockName.Span,
        NetlistStage netlist => netlist.Output.Span,
        _ => stage.Span,
    };
}
