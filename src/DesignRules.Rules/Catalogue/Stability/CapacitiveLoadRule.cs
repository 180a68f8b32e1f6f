using DesignRules.Quantities;
using DesignRules.Rules.Evaluation;
using DesignRules.Simulation;

namespace DesignRules.Rules.Catalogue.Stability;

/// <summary>
/// DR512: the capacitance an amplifier's output drives to ground (a cable, an ADC input, a load capacitor) must be one
/// it drives stably: no more than the part states (<c>capacitive-load</c>), and not so much that the loop's phase margin
/// falls below the threshold while it would hold without it. The fix hint is computed on variants of the circuit: the
/// smallest isolation resistor (next E24 value) between the output, where the feedback is taken, and the capacitance
/// that restores the margin, and the largest capacitance that keeps it.
/// </summary>
internal sealed class CapacitiveLoadRule : Rule
{
    /// <summary>Bisection steps of each search (each halves a logarithmic interval).</summary>
    private const int SearchSteps = 24;

    public override string Id => "DR512";

    public override void Evaluate(DesignEvaluation evaluation)
    {
        var figures = evaluation.Analyses.LoopGains();
        var chain = figures.Chain;
        foreach (var amp in StageParts.Amplifiers(evaluation.Design))
        {
            var stageId = amp.Stage.Id.Value;
            if (figures.Of(stageId, amp.Slot) is not { Loop.Margins: { State: LoopState.Closed, PhaseMargin: { } margin } } loop)
            {
                continue;
            }

            var capacitors = chain.Circuit.CapacitorsToFixedNodes(loop.OutputNode);
            if (capacitors.Count == 0)
            {
                continue;
            }

            var load = capacitors.Sum(c => chain.Circuit.Capacitance(c) ?? 0);
            evaluation.Record(stageId, $"capacitive load {amp.Slot}", load, "F");
            var limit = evaluation.Threshold(Id, "min-phase-margin", stageId);
            var stated = amp.Part.CapacitiveLoad?.Value.Value;
            bool beyondPart = stated is { } s && load > s * (1 + 1e-9);
            double? unloaded = null;
            if (margin < limit)
            {
                unloaded = StabilityAnalyses.MarginsOf(chain.Circuit.WithCapacitorsScaled(capacitors, 1e-6), chain, loop)?.PhaseMargin;
            }

            bool costsMargin = unloaded is { } u && u >= limit;
            if (!beyondPart && !costsMargin)
            {
                continue;
            }

            double? isolation = costsMargin ? Isolation(chain, loop, capacitors, limit) : null;
            double? largest = costsMargin ? Largest(chain, loop, capacitors, load, limit) : null;
            var reason = costsMargin
                ? $"which takes its phase margin {loop.OperatingPoint} to {StabilityAnalyses.Degrees(margin)} ({StabilityAnalyses.Degrees(limit)} required; {StabilityAnalyses.Degrees(unloaded!.Value)} without it)"
                : $"more than the {StabilityAnalyses.Farads(stated!.Value)} the part `{amp.Part.Id.Value}` is specified to drive";
            var fixes = new List<string>();
            if (isolation is { } r)
            {
                fixes.Add($"put an isolation resistor of {Say.Ohms(r)} (E24) or more between the output, where the feedback is taken, and the capacitance");
            }

            if (largest is { } c)
            {
                fixes.Add($"keep the capacitance at or below {StabilityAnalyses.Farads(c)}");
            }
            else if (stated is { } st)
            {
                fixes.Add($"keep the capacitance at or below {StabilityAnalyses.Farads(st)}");
            }

            var figuresOut = new List<Figure> { stated is { } lim ? new Figure("capacitive load", load, "F").AtMost(lim) : new Figure("capacitive load", load, "F") };
            if (isolation is { } ri)
            {
                figuresOut.Add(new Figure("isolation resistor", ri, "Ω"));
            }

            // Reported at the capacitance (its value is what changes, or where the resistor goes), else at the part.
            var span = chain.Locate(capacitors.OrderByDescending(c => chain.Circuit.Capacitance(c)).First());
            evaluation.Report(Id, stageId, span == chain.Design.Id.Span ? amp.PartSpan : span, new Dictionary<string, string>
            {
                ["amplifier"] = $"{stageId}.{amp.Slot}",
                ["capacitance"] = StabilityAnalyses.Farads(load),
                ["capacitors"] = string.Join(", ", capacitors.Select(id => $"`{id}`")),
                ["reason"] = reason,
                ["fix"] = fixes.Count > 0 ? string.Join(", or ", fixes) : "choose a part specified for this load",
            }, [.. figuresOut]);
        }
    }

    // The smallest isolation resistance (rounded up to E24) that brings the margin to the limit, or null when even 100 kΩ does not.
    private static double? Isolation(Elaboration.ElaboratedChain chain, AmplifierLoop loop, IReadOnlyList<string> capacitors, double limit)
    {
        bool Holds(double r) => StabilityAnalyses.MarginsOf(chain.Circuit.WithIsolatedCapacitors(loop.OutputNode, capacitors, r), chain, loop) is { State: LoopState.Closed, PhaseMargin: { } pm } && pm >= limit;
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

    // The largest capacitance (a fraction of today's) that keeps the margin, or null when none does.
    private static double? Largest(Elaboration.ElaboratedChain chain, AmplifierLoop loop, IReadOnlyList<string> capacitors, double load, double limit)
    {
        bool Holds(double k) => StabilityAnalyses.MarginsOf(chain.Circuit.WithCapacitorsScaled(capacitors, k), chain, loop) is { State: LoopState.Closed, PhaseMargin: { } pm } && pm >= limit;
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
