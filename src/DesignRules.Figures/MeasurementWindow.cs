using DesignRules.Elaboration;
using DesignRules.Simulation;

namespace DesignRules.Figures;

/// <summary>Where in a settled transient the figures are measured.</summary>
internal static class MeasurementWindow
{
    /// <summary>The measurement window: the last whole periods after start-up, or the window after start-up for a DC source.</summary>
    public static (double Start, double End) Of(ElaboratedChain chain, TransientResult result)
    {
        double end = result.Time[^1];
        double from = Math.Min(chain.Window.MeasureFrom, end);
        if (chain.Period is not { } period || !(period > 0))
        {
            return (from, end);
        }

        int periods = (int)Math.Floor(((end - from) / period) + 1e-9);
        return periods < 1 ? (from, end) : (end - (periods * period), end);
    }
}
