using DesignRules.Elaboration;
using DesignRules.Figures.Tolerance;
using DesignRules.Model;
using DesignRules.Simulation;

namespace DesignRules.Figures.LoadingBandwidthStress;

/// <summary>
/// The power each resistor of a design dissipates, P = v²/R from its node voltages (Joule's law): averaged over the whole
/// periods of the transient's measurement window at each band end, or at the DC operating point for a DC source; the
/// largest over the nominal values and every resistor-tolerance corner of <see cref="ToleranceCorners"/> (each resistor at
/// its corner value), with the corner where it peaks.
/// </summary>
/// <param name="Power">Power by element id, W; null when the chain cannot be analysed.</param>
/// <param name="Corners">The tolerance corner at which a resistor dissipates most, by element id; absent where that is nominal.</param>
internal sealed record ResistorPowers(IReadOnlyDictionary<string, double>? Power, IReadOnlyDictionary<string, ToleranceCorner> Corners)
{
    public static ResistorPowers Compute(DesignAnalyses analyses)
    {
        var corners = new Dictionary<string, ToleranceCorner>(StringComparer.Ordinal);
        var chain = analyses.Chain(BandEnd.Top);
        if (!chain.Succeeded)
        {
            return new ResistorPowers(null, corners);
        }

        var power = new Dictionary<string, double>(StringComparer.Ordinal);
        if (analyses.IsPeriodic)
        {
            foreach (var (_, run, result) in analyses.SettledTransients)
            {
                foreach (var (id, p) in Mean(run, result))
                {
                    power[id] = Math.Max(power.GetValueOrDefault(id), p);
                }
            }

            // The same at every resistor-tolerance corner, with each resistor at its corner value.
            foreach (var run in analyses.CornerRuns)
            {
                foreach (var (id, p) in Mean(run.Chain, run.Transient))
                {
                    if (p > power.GetValueOrDefault(id))
                    {
                        power[id] = p;
                        corners[id] = run.Corner;
                    }
                }
            }
        }
        else
        {
            var op = analyses.OperatingPoint();
            if (!op.Succeeded)
            {
                analyses.ReportFailure("operating point", op.Failure!, chain);
                return new ResistorPowers(null, corners);
            }

            foreach (var r in Resistors(chain))
            {
                power[r.ElementId] = Math.Max(power.GetValueOrDefault(r.ElementId), Square(op.Voltage(r.NodeA) - op.Voltage(r.NodeB)) / r.Value);
            }
        }

        return new ResistorPowers(power, corners);
    }

    private static IEnumerable<(string Id, double Power)> Mean(ElaboratedChain chain, TransientResult result)
    {
        var (start, end) = MeasurementWindow.Of(chain, result);
        foreach (var r in Resistors(chain))
        {
            var a = result.Voltage(r.NodeA);
            var b = result.Voltage(r.NodeB);
            var power = new double[a.Length];
            for (int i = 0; i < power.Length; i++) power[i] = Square(a[i] - b[i]) / r.Value;
            yield return (r.ElementId, MeasurementWindow.Average(result.Time, power, start, end));
        }
    }

    private static IEnumerable<ComponentProbe> Resistors(ElaboratedChain chain) =>
        chain.Stages.SelectMany(s => s.Components).Where(c => c.Kind == ElementKind.Resistor);

    private static double Square(double v) => v * v;
}
