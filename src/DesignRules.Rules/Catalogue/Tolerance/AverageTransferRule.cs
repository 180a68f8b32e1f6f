using DesignRules.Diagnostics;
using DesignRules.Elaboration;
using DesignRules.Model;
using DesignRules.Rules.Evaluation;
using DesignRules.Rules.Evaluation.LoadingBandwidthStress;
using DesignRules.Rules.Evaluation.Tolerance;
using DesignRules.Simulation;

namespace DesignRules.Rules.Catalogue.Tolerance;

/// <summary>
/// DR407: the level an averaging stage settles to against the ideal — the mean over whole periods of the signal the ideal
/// transfers of the stages before it make of the source (2·Vp/π for a full-wave rectified sine), through the stage's own
/// ideal gain — judged against the stage's accuracy. Measured on the settled transient at every band end.
/// </summary>
internal sealed class AverageTransferRule : Rule
{
    public override RuleId Id => RuleIds.AverageTransfer;

    public override void Evaluate(DesignEvaluation evaluation)
    {
        var worst = new Dictionary<string, Level>(StringComparer.Ordinal);
        foreach (var (_, chain, result) in evaluation.Analyses.SettledTransients)
        {
            if (chain.Period is null)
            {
                continue;
            }

            var (start, end) = MeasurementWindow.Of(chain, result);
            for (int k = 0; k < chain.Stages.Count; k++)
            {
                var stage = chain.Stages[k];
                if (TransferTarget.Of(stage).Kind != TransferKind.Average)
                {
                    continue;
                }

                var (idealInput, basis) = IdealInput(chain, result, k);
                double inputMean = MeasurementWindow.Average(result.Time, idealInput, start, end);
                double ideal = stage.Transfer.At(inputMean);
                double level = MeasurementWindow.Average(result.Time, result.Voltage(stage.OutputNode), start, end);
                double error = Math.Abs(ideal) > 1e-9 ? Math.Abs(level - ideal) / Math.Abs(ideal) : double.NaN;
                var current = new Level(level, ideal, error, basis);
                if (!worst.TryGetValue(stage.StageId, out var previous) || (error > previous.Error))
                {
                    worst[stage.StageId] = current;
                }
            }
        }

        foreach (var stage in evaluation.Design.Stages)
        {
            if (!worst.TryGetValue(stage.Id.Value, out var l))
            {
                continue;
            }

            string id = stage.Id.Value;
            evaluation.Record(id, FigureKinds.AveragedLevel.Of(l.Measured));
            evaluation.Record(id, FigureKinds.IdealAveragedLevel.Of(l.Ideal));
            if (double.IsNaN(l.Error))
            {
                continue;
            }

            evaluation.Record(id, FigureKinds.AverageError.Of(l.Error));
            evaluation.Judged(id, "accuracy", Id);
            evaluation.Judged(id, "transfer", Id);
            if (stage.Requirements.Accuracy is not { } accuracy || l.Error <= accuracy.Value.Value)
            {
                continue;
            }

            evaluation.Report(Id, id, accuracy.Span, new Dictionary<string, string>
            {
                ["stage"] = id,
                ["level"] = Say.Volts(l.Measured),
                ["ideal"] = Say.Volts(l.Ideal),
                ["basis"] = l.Basis,
                ["error"] = Say.Percent(l.Error),
                ["limit"] = Say.Percent(accuracy.Value.Value),
                ["margin"] = Say.Percent(l.Error - accuracy.Value.Value),
            }, FigureKinds.AveragedLevel.Of(l.Measured), FigureKinds.IdealAveragedLevel.Of(l.Ideal), FigureKinds.AverageError.Of(l.Error));
        }
    }

    /// <summary>
    /// The signal an ideal chain would feed stage <paramref name="index"/>: the source emf through the ideal transfer of
    /// every stage before it. A peak or average stage before it has no memoryless ideal, so from the last such stage on
    /// the measured signal at its output is used instead (said in the basis).
    /// </summary>
    private static (double[] Signal, string Basis) IdealInput(ElaboratedChain chain, TransientResult result, int index)
    {
        int from = 0;
        var signal = result.Voltage(chain.SourceEmfNode);
        string basis = "the mean of the ideal chain's signal from the source";
        for (int k = index - 1; k >= 0; k--)
        {
            if (chain.Stages[k].Transfer.Kind is TransferKind.Peak or TransferKind.Average)
            {
                signal = result.Voltage(chain.Stages[k].OutputNode);
                from = k + 1;
                basis = $"the mean of the ideal chain's signal from the measured output of stage `{chain.Stages[k].StageId}`";
                break;
            }
        }

        var x = (double[])signal.Clone();
        for (int k = from; k < index; k++)
        {
            var transfer = chain.Stages[k].Transfer;
            for (int i = 0; i < x.Length; i++) x[i] = transfer.At(x[i]);
        }

        return (x, basis);
    }

    private sealed record Level(double Measured, double Ideal, double Error, string Basis);
}
