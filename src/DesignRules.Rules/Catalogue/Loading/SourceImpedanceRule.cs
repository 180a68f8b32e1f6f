using DesignRules.Diagnostics;
using DesignRules.Rules.Evaluation;
using DesignRules.Rules.Evaluation.LoadingBandwidthStress;
using DesignRules.Simulation;

namespace DesignRules.Rules.Catalogue.Loading;

/// <summary>
/// DR302: the source impedance divides the signal with the first stage's input impedance. For a linear first stage (and a
/// DC source) the loss is read from the AC analysis at each band-end frequency (at DC for a DC source): the fraction of the
/// source emf dropped across the source impedance, |v(emf) − v(in)| / |v(emf)| = |Rs / (Rs + Zin)|, with Zin the engine's
/// impedance at the source node. A rectifying or holding first stage has no meaningful small-signal input impedance at
/// its bias point, so there the loss is read from the transient: the largest drop across the source impedance over the
/// largest emf. Compared with the first stage's accuracy (or default-accuracy).
/// </summary>
internal sealed class SourceImpedanceRule : Rule
{
    public override RuleId Id => RuleIds.SourceImpedance;

    public override void Evaluate(DesignEvaluation evaluation)
    {
        var design = evaluation.Design;
        double rs = design.Source.Impedance.Value.Value;
        if (design.Stages.Count == 0 || !(rs > 0))
        {
            return;
        }

        var small = SmallSignal.Of(evaluation.Analyses);
        if (small is null || small.Chain.Stages.Count == 0)
        {
            return;
        }

        var first = small.Chain.Stages[0];
        bool linear = first.Transfer.Kind == Model.TransferKind.Gain;
        double error = 0, zin = double.PositiveInfinity;
        if (linear || small.BandFrequencies.Count == 0)
        {
            var frequencies = small.BandFrequencies.Count > 0 ? small.BandFrequencies : [SmallSignal.Dc];
            foreach (var f in frequencies)
            {
                int i = small.IndexOf(f);
                var emf = small.Result.Voltage(small.Chain.SourceEmfNode)[i];
                var vin = SmallSignal.InputVoltage(small.Result, first, i);
                double e = emf.Magnitude > 0 ? (emf - vin).Magnitude / emf.Magnitude : 0;
                if (e >= error)
                {
                    error = e;
                    zin = Split(small) ? rs * (1 - e) / Math.Max(e, 1e-300)
                        : FrequencyResponse.ImpedanceAtSource(small.Result, small.Chain.SourceOutputNode, small.Chain.SourceId, f).Magnitude;
                }
            }
        }
        else
        {
            foreach (var (_, chain, result) in evaluation.Analyses.SettledTransients)
            {
                var (start, end) = MeasurementWindow.Of(chain, result);
                var emf = result.Voltage(chain.SourceEmfNode);
                var inPlus = result.Voltage(first.InputNode);
                var inMinus = Circuit.IsReference(first.ReferenceInputNode) ? null : result.Voltage(first.ReferenceInputNode);
                double drop = 0, peak = 0;
                for (int i = 0; i < result.Time.Count; i++)
                {
                    if (result.Time[i] < start || result.Time[i] > end)
                    {
                        continue;
                    }

                    double vin = inPlus[i] - (inMinus?[i] ?? 0);
                    drop = Math.Max(drop, Math.Abs(emf[i] - vin));
                    peak = Math.Max(peak, Math.Abs(emf[i]));
                }

                double e = peak > 0 ? drop / peak : 0;
                if (e >= error)
                {
                    error = e;
                    zin = rs * (1 - e) / Math.Max(e, 1e-300);
                }
            }
        }

        var stageId = first.StageId;
        double accuracy = StageFacts.Accuracy(evaluation, Id, first.Stage);
        evaluation.Record(stageId, FigureKinds.SourceLoadingLoss.Of(error).AtMost(accuracy));
        if (error <= accuracy)
        {
            return;
        }

        evaluation.Report(Id, stageId, design.Source.Impedance.Span, new Dictionary<string, string>
        {
            ["rs"] = Say.Ohms(rs),
            ["stage"] = stageId,
            ["zin"] = double.IsFinite(zin) ? Say.Ohms(zin) : "unbounded",
            ["error"] = Say.Percent(error),
            ["limit"] = Say.Percent(accuracy),
            ["margin"] = Say.Percent(error - accuracy),
        }, FigureKinds.SourceLoadingLoss.Of(error), FigureKinds.Accuracy.Of(accuracy));
    }

    private static bool Split(SmallSignal small) => !Circuit.IsReference(small.Chain.Stages[0].ReferenceInputNode);
}
