using DesignRules.Elaboration;
using DesignRules.Quantities;

namespace DesignRules.Figures.Stability;

/// <summary>What a capacitive load costs one loop, and what would restore its margin.</summary>
/// <param name="Load">Capacitance from the output to fixed nodes, F.</param>
/// <param name="Capacitors">The capacitors that make it up, by element id.</param>
/// <param name="UnloadedMargin">Phase margin without the capacitance, °; null when the loop does not close then.</param>
/// <param name="Isolation">Smallest E24 isolation resistor that restores the margin, Ω; null when not searched or none up to 100 kΩ.</param>
/// <param name="Largest">Largest capacitance that keeps the margin, F; null when not searched or none does.</param>
internal sealed record CapacitiveLoadFix(double Load, IReadOnlyList<string> Capacitors, double? UnloadedMargin, double? Isolation, double? Largest)
{
    /// <summary>True when the margin would hold without the capacitance: the load is what costs it.</summary>
    public bool CostsMargin(double limit) => UnloadedMargin is { } u && u >= limit;
}

/// <summary>
/// What a capacitive load costs one amplifier's loop, found on variants of the compiled circuit (the chain is not
/// elaborated again): the margin without the capacitance, the smallest isolation resistor (next E24 value, IEC 60063)
/// between the output, where the feedback is taken, and the capacitance that restores a margin, and the largest share
/// of today's capacitance that keeps it. Every search is a bounded bisection.
/// </summary>
internal static class CapacitiveLoadVariants
{
    /// <summary>Bisection steps of each search (each halves a logarithmic interval).</summary>
    private const int SearchSteps = 24;

    /// <summary>
    /// The capacitive load on <paramref name="loop"/>'s output and, when its margin is below <paramref name="limit"/>,
    /// whether the load is the cause and what restores the margin (the searches run only then).
    /// </summary>
    public static CapacitiveLoadFix? Compute(ElaboratedChain chain, AmplifierLoop loop, double limit)
    {
        var capacitors = chain.Circuit.CapacitorsToFixedNodes(loop.OutputNode);
        if (capacitors.Count == 0)
        {
            return null;
        }

        var load = capacitors.Sum(c => chain.Circuit.Capacitance(c) ?? 0);
        if (loop.Loop.Margins.PhaseMargin is not { } margin || margin >= limit)
        {
            return new CapacitiveLoadFix(load, capacitors, null, null, null);
        }

        var unloaded = UnloadedMargin(chain, loop, capacitors);
        if (unloaded is not { } u || u < limit)
        {
            return new CapacitiveLoadFix(load, capacitors, unloaded, null, null);
        }

        return new CapacitiveLoadFix(load, capacitors, unloaded, Isolation(chain, loop, capacitors, limit), Largest(chain, loop, capacitors, load, limit));
    }

    /// <summary>The margins of one amplifier of <paramref name="circuit"/> (a variant of the chain's) at a loop's operating point.</summary>
    public static LoopMargins? MarginsOf(Circuit circuit, ElaboratedChain chain, AmplifierLoop loop)
    {
        var request = LoopGainAnalyses.Sweep with { Amplifiers = [loop.ElementId], BiasSource = loop.BiasValue is null ? null : chain.SourceId, BiasValue = loop.BiasValue ?? 0 };
        var result = Simulate.LoopGain(circuit, request);
        return result.Succeeded ? result.Loop(loop.ElementId)?.Margins : null;
    }

    /// <summary>The phase margin with the capacitances shrunk a millionfold, °; null when the loop does not close.</summary>
    public static double? UnloadedMargin(ElaboratedChain chain, AmplifierLoop loop, IReadOnlyList<string> capacitors) =>
        MarginsOf(chain.Circuit.WithCapacitorsScaled(capacitors, 1e-6), chain, loop)?.PhaseMargin;

    /// <summary>The smallest isolation resistance (rounded up to E24) that brings the margin to <paramref name="limit"/>, or null when even 100 kΩ does not.</summary>
    public static double? Isolation(ElaboratedChain chain, AmplifierLoop loop, IReadOnlyList<string> capacitors, double limit)
    {
        bool Holds(double r) => MarginsOf(chain.Circuit.WithIsolatedCapacitors(loop.OutputNode, capacitors, r), chain, loop) is { State: LoopState.Closed, PhaseMargin: { } pm } && pm >= limit;
        double lo = Math.Log(0.01), hi = Math.Log(100e3);
        if (!Holds(Math.Exp(hi)))
        {
            return null;
        }

        for (int i = 0; i < SearchSteps; i++)
        {
            double mid = 0.5 * (lo + hi);
            if (Holds(Math.Exp(mid)))
            {
                hi = mid;
            }
            else
            {
                lo = mid;
            }
        }

        var value = NextE24(Math.Exp(hi));
        return Holds(value) ? value : NextE24(value * 1.0001);
    }

    /// <summary>The largest capacitance (a fraction of today's <paramref name="load"/>) that keeps the margin, or null when none does.</summary>
    public static double? Largest(ElaboratedChain chain, AmplifierLoop loop, IReadOnlyList<string> capacitors, double load, double limit)
    {
        bool Holds(double k) => MarginsOf(chain.Circuit.WithCapacitorsScaled(capacitors, k), chain, loop) is { State: LoopState.Closed, PhaseMargin: { } pm } && pm >= limit;
        double lo = Math.Log(1e-6), hi = 0;
        if (!Holds(Math.Exp(lo)))
        {
            return null;
        }

        for (int i = 0; i < SearchSteps; i++)
        {
            double mid = 0.5 * (lo + hi);
            if (Holds(Math.Exp(mid)))
            {
                lo = mid;
            }
            else
            {
                hi = mid;
            }
        }

        return load * Math.Exp(lo);
    }

    // The E24 preferred value at or above r (IEC 60063): the series' mantissas scaled to r's decade and the next.
    private static double NextE24(double r)
    {
        var mantissas = ESeries.E24.Mantissas;
        var unit = Math.Pow(10, Math.Floor(Math.Log10(mantissas[0])));
        var decade = Math.Pow(10, Math.Floor(Math.Log10(r)));
        foreach (var scale in new[] { decade, decade * 10 })
        {
            foreach (var m in mantissas)
            {
                if (m / unit * scale >= r * (1 - 1e-9))
                {
                    return m / unit * scale;
                }
            }
        }

        return decade * 10;
    }
}
