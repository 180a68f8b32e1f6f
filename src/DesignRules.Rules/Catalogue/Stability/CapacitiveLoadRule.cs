using DesignRules.Diagnostics;
using DesignRules.Figures.Stability;
using DesignRules.Rules.Evaluation;

namespace DesignRules.Rules.Catalogue.Stability;

/// <summary>
/// DR512: the capacitance an amplifier's output drives to ground (a cable, an ADC input, a load capacitor) must be one
/// it drives stably: no more than the part states (<c>capacitive-load</c>), and not so much that the loop's phase margin
/// falls below the threshold while it would hold without it. The fix hint comes from the figures layer's variants of the
/// circuit (<see cref="Figures.DesignAnalyses.CapacitiveLoad"/>): the smallest isolation resistor (next E24 value)
/// between the output, where the feedback is taken, and the capacitance that restores the margin, and the largest
/// capacitance that keeps it.
/// </summary>
internal sealed class CapacitiveLoadRule : Rule
{
    public override RuleId Id => RuleIds.CapacitiveLoad;

    public override void Evaluate(DesignEvaluation evaluation)
    {
        var figures = evaluation.Analyses.LoopGains;
        var chain = figures.Chain;
        foreach (var amp in StageParts.Amplifiers(evaluation.Design))
        {
            var stageId = amp.Stage.Id.Value;
            if (figures.Of(stageId, amp.Slot) is not { Loop.Margins: { State: LoopState.Closed, PhaseMargin: { } margin } } loop)
            {
                continue;
            }

            var limit = evaluation.Threshold(Id, "min-phase-margin", stageId);
            if (evaluation.Analyses.CapacitiveLoad(loop, limit) is not { } fix)
            {
                continue;
            }

            var load = fix.Load;
            var stated = amp.Part.CapacitiveLoad?.Value.Value;
            evaluation.Record(stageId, stated is { } partLimit ? FigureKinds.CapacitiveLoad.Of(amp.Slot, load).AtMost(partLimit) : FigureKinds.CapacitiveLoad.Of(amp.Slot, load));
            bool beyondPart = stated is { } s && load > s * (1 + 1e-9);
            bool costsMargin = fix.CostsMargin(limit);
            if (!beyondPart && !costsMargin)
            {
                continue;
            }

            var reason = costsMargin
                ? $"which takes its phase margin {loop.OperatingPoint()} to {StabilityWords.Degrees(margin)} ({StabilityWords.Degrees(limit)} required; {StabilityWords.Degrees(fix.UnloadedMargin!.Value)} without it)"
                : $"more than the {StabilityWords.Farads(stated!.Value)} the part `{amp.Part.Id.Value}` is specified to drive";
            var fixes = new List<string>();
            if (costsMargin && fix.Isolation is { } r)
            {
                fixes.Add($"put an isolation resistor of {Say.Ohms(r)} (E24) or more between the output, where the feedback is taken, and the capacitance");
            }

            if (costsMargin && fix.Largest is { } c)
            {
                fixes.Add($"keep the capacitance at or below {StabilityWords.Farads(c)}");
            }
            else if (stated is { } st)
            {
                fixes.Add($"keep the capacitance at or below {StabilityWords.Farads(st)}");
            }

            var figuresOut = new List<Figure> { stated is { } lim ? FigureKinds.CapacitiveLoad.Of(amp.Slot, load).AtMost(lim) : FigureKinds.CapacitiveLoad.Of(amp.Slot, load) };
            if (costsMargin && fix.Isolation is { } ri)
            {
                figuresOut.Add(FigureKinds.IsolationResistor.Of(amp.Slot, ri));
            }

            // Reported at the capacitance (its value is what changes, or where the resistor goes), else at the part.
            var span = chain.Locate(fix.Capacitors.OrderByDescending(id => chain.Circuit.Capacitance(id)).First());
            evaluation.Report(Id, stageId, span == chain.Design.Id.Span ? amp.PartSpan : span, new Dictionary<string, string>
            {
                ["amplifier"] = $"{stageId}.{amp.Slot}",
                ["capacitance"] = StabilityWords.Farads(load),
                ["capacitors"] = string.Join(", ", fix.Capacitors.Select(id => $"`{id}`")),
                ["reason"] = reason,
                ["fix"] = fixes.Count > 0 ? string.Join(", or ", fixes) : "choose a part specified for this load",
            }, [.. figuresOut]);
        }
    }
}
