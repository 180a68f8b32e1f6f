using DesignRules.Diagnostics;
using DesignRules.Rules.Evaluation;
using DesignRules.Rules.Evaluation.LoadingBandwidthStress;

namespace DesignRules.Rules.Catalogue.Stress;

/// <summary>
/// DR603: the peak forward current of each diode in the transient at each band end (start-up excluded), from the largest
/// forward voltage across it and the engine's diode model (Shockley law with series resistance), against its rated forward
/// current times the derating factor.
/// </summary>
internal sealed class DiodeForwardCurrentRule : Rule
{
    public override RuleId Id => RuleIds.DiodeForwardCurrent;

    public override void Evaluate(DesignEvaluation evaluation) =>
        DiodeStress.Evaluate(evaluation, Id, FigureKinds.DiodeForwardCurrent, FigureKinds.DeratedForwardCurrent, (chain, result, diode) =>
        {
            var (start, end) = MeasurementWindow.Of(chain, result);
            var anode = DiodeStress.Voltages(result, diode.Anode);
            var cathode = DiodeStress.Voltages(result, diode.Cathode);
            double forward = double.NegativeInfinity;
            for (int i = 0; i < result.Time.Count; i++)
            {
                if (result.Time[i] >= start && result.Time[i] <= end)
                {
                    forward = Math.Max(forward, anode[i] - cathode[i]);
                }
            }

            // The model's current rises with the voltage, so the largest voltage gives the peak current.
            return diode.Model.ForwardCurrent(forward, chain.Options.Temperature);
        }, d => d.Part.ForwardCurrentRating.Value.Value, Say.Amps, "current");
}
