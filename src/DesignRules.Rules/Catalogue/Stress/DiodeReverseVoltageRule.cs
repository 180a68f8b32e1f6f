using DesignRules.Diagnostics;
using DesignRules.Rules.Evaluation;
using DesignRules.Rules.Evaluation.LoadingBandwidthStress;

namespace DesignRules.Rules.Catalogue.Stress;

/// <summary>
/// DR602: the largest reverse voltage v(cathode) − v(anode) each diode sees in the transient at each band end (start-up
/// excluded), against its rated reverse voltage times the derating factor.
/// </summary>
internal sealed class DiodeReverseVoltageRule : Rule
{
    public override RuleId Id => RuleIds.DiodeReverseVoltage;

    public override void Evaluate(DesignEvaluation evaluation) =>
        DiodeStress.Evaluate(evaluation, Id, FigureKinds.DiodeReverseVoltage, FigureKinds.DeratedReverseVoltage, (chain, result, diode) =>
        {
            var (start, end) = MeasurementWindow.Of(chain, result);
            var anode = DiodeStress.Voltages(result, diode.Anode);
            var cathode = DiodeStress.Voltages(result, diode.Cathode);
            double peak = 0;
            for (int i = 0; i < result.Time.Count; i++)
            {
                if (result.Time[i] >= start && result.Time[i] <= end)
                {
                    peak = Math.Max(peak, cathode[i] - anode[i]);
                }
            }

            return peak;
        }, d => d.Part.ReverseVoltageRating.Value.Value, Say.Volts, "voltage");
}
