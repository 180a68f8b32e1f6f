using DesignRules.Elaboration;
using DesignRules.Model;

namespace DesignRules.Figures.LoadingBandwidthStress;

/// <summary>A peak stage whose hold capacitor is still filling in the measured periods.</summary>
/// <param name="Stage">The stage.</param>
/// <param name="Capacitor">The hold capacitor.</param>
/// <param name="RisePerPeriod">How much the held value (the output's largest value in a period) rises from one measured period to the next, V.</param>
/// <param name="Demand">The charge current that following the input from empty asks: C·2π·f·Vp (i = C·dv/dt at the sine's steepest slope), A.</param>
/// <param name="Amplifier">The amplifier that charges it (the stage's first).</param>
internal sealed record FillingHold(StageProbe Stage, ComponentProbe Capacitor, double RisePerPeriod, double Demand, AmplifierProbe Amplifier);

/// <summary>
/// Tells filling from droop in a peak stage. Between peaks a settled hold droops and each peak tops it up to the same
/// level; a hold capacitor too large for the current that charges it (an amplifier at its current limit) instead gains a
/// little at every peak for many periods. When the held value in the settled window still rises from period to period by
/// more than <see cref="RiseFraction"/> of the input's peak, the stage is filling: its droop and accuracy are not judged
/// on that signal (DR305 says so), and the current it needs is the charge current, not the limit it delivers.
/// </summary>
internal static class HoldFilling
{
    /// <summary>A rise of the held value per period above this fraction of the input's peak is filling (common practice: a tenth of the 1 % accuracy class).</summary>
    public const double RiseFraction = 1e-3;

    /// <summary>The filling peak stages at the top band end, by stage id (empty for a DC source); see <see cref="DesignAnalyses.FillingHolds"/>.</summary>
    internal static Dictionary<string, FillingHold> Compute(DesignAnalyses analyses)
    {
        var found = new Dictionary<string, FillingHold>(StringComparer.Ordinal);
        if (!analyses.IsPeriodic)
        {
            return found;
        }

        var chain = analyses.Chain(BandEnd.Top);
        var result = analyses.Transient(BandEnd.Top);
        if (!chain.Succeeded || !result.Succeeded || chain.Period is not { } period || result.Time.Count < 2)
        {
            return found;
        }

        var (start, end) = MeasurementWindow.Of(chain, result);
        int periods = (int)Math.Floor(((end - start) / period) + 1e-9);
        if (periods < 2)
        {
            return found;
        }

        foreach (var stage in chain.Stages.Where(s => s.Transfer.Kind == TransferKind.Peak && s.Amplifiers.Count > 0))
        {
            var capacitor = stage.Components.FirstOrDefault(c => c.Kind == ElementKind.Capacitor);
            if (capacitor is null)
            {
                continue;
            }

            var output = result.Voltage(stage.OutputNode);
            var input = result.Voltage(stage.InputNode);
            var held = new double[periods];
            Array.Fill(held, double.NegativeInfinity);
            double inputPeak = 0;
            for (int i = 0; i < result.Time.Count; i++)
            {
                double t = result.Time[i];
                if (t < start || t > end) continue;
                int k = Math.Min(periods - 1, (int)((t - start) / period));
                held[k] = Math.Max(held[k], output[i]);
                inputPeak = Math.Max(inputPeak, Math.Abs(input[i]));
            }

            double rise = (held[^1] - held[0]) / (periods - 1);
            if (!(rise > RiseFraction * inputPeak))
            {
                continue;
            }

            double demand = capacitor.Value * 2 * Math.PI * (1 / period) * inputPeak;
            found[stage.StageId] = new FillingHold(stage, capacitor, rise, demand, stage.Amplifiers[0]);
        }

        return found;
    }
}
