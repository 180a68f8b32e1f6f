using DesignRules.Diagnostics;
using DesignRules.Figures.Stability;
using DesignRules.Rules.Evaluation;
using DesignRules.Rules.Evaluation.Stability;
using DesignRules.Rules.Evaluation.Tolerance;

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
            // Judged where the margin is least: at 25 °C, or at an end of the range where a gbw-derating raises the GBW
            // and the crossover moves up into the load's pole (as DR510 judges it, so DR510's pointer here holds there).
            if (LoopsOverTemperature.Worst(evaluation, stageId, amp.Slot, m => -(m.PhaseMargin ?? double.PositiveInfinity)) is not
                { Margins.PhaseMargin: { } margin } judged)
            {
                continue;
            }

            var (loop, at) = (judged.Loop, judged.At);
            var limit = evaluation.Threshold(Id, "min-phase-margin", stageId);
            if (evaluation.Analyses.CapacitiveLoad(loop, limit, judged.End) is not { } fix)
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
                ? $"which takes its phase margin {loop.OperatingPoint()}{ToleranceAnalyses.AtTemperature(at)} to {StabilityWords.Degrees(margin)} ({StabilityWords.Degrees(limit)} required; {StabilityWords.Degrees(fix.UnloadedMargin!.Value)} without it)"
                : $"more than the {StabilityWords.Farads(stated!.Value)} the part `{amp.Part.Id.Value}` is specified to drive";

            // Reported at the capacitance (its value is what changes, or where the resistor goes), else at the part.
            var capacitor = fix.Capacitors.OrderByDescending(id => chain.Circuit.Capacitance(id)).First();
            var capacitorSpan = chain.Locate(capacitor);
            var located = capacitorSpan != chain.Design.Id.Span;
            var hint = Hint($"{stageId}.{amp.Slot}", costsMargin ? fix.Isolation : null, costsMargin && fix.Largest is { } c ? FixHints.RoundDown(c) : stated,
                fix.Capacitors.Count == 1 && located ? capacitorSpan : null, capacitor);
            if (hint is null)
            {
                reason += "; choose a part specified for this load";
            }

            var figuresOut = new List<Figure> { stated is { } lim ? FigureKinds.CapacitiveLoad.Of(amp.Slot, load).AtMost(lim) : FigureKinds.CapacitiveLoad.Of(amp.Slot, load) };
            if (costsMargin && fix.Isolation is { } ri)
            {
                figuresOut.Add(FigureKinds.IsolationResistor.Of(amp.Slot, ri).AtTemperature(at));
            }

            evaluation.Report(Id, stageId, located ? capacitorSpan : amp.PartSpan, new Dictionary<string, string>
            {
                ["amplifier"] = $"{stageId}.{amp.Slot}",
                ["capacitance"] = StabilityWords.Farads(load),
                ["capacitors"] = string.Join(", ", fix.Capacitors.Select(id => $"`{id}`")),
                ["reason"] = reason,
            }, hint, [.. figuresOut]);
        }
    }

    /// <summary>
    /// The fix hint: the isolation resistor where one restores the margin (a component to add, so no single YAML value),
    /// naming the largest capacitance as the other way; else the largest capacitance (the computed one, rounded down to the
    /// three digits people read, or the part's stated one), written in place of the capacitor's value where one capacitor
    /// with a value in the design makes up the load. Null when neither is known.
    /// </summary>
    private static FixHint? Hint(string amplifier, double? isolation, double? most, Diagnostics.SourceSpan? oneValue, string capacitor)
    {
        if (isolation is { } r)
        {
            var text = $"put an isolation resistor of {Say.Ohms(r)} (E24) or more between the output of `{amplifier}`, where the feedback is taken, and the capacitance";
            return new FixHint(FixKind.IsolationResistor, amplifier, r, "Ω",
                text + (most is { } m ? $", or keep the capacitance at or below {StabilityWords.Farads(m)}." : "."));
        }

        if (most is not { } value)
        {
            return null;
        }

        var said = StabilityWords.Farads(value);
        return oneValue is null
            ? new FixHint(FixKind.MaximumCapacitance, amplifier, value, "F", $"keep the capacitance at or below {said}.")
            : new FixHint(FixKind.MaximumCapacitance, capacitor, value, "F", $"keep the capacitance at or below {said} (write `{said}`).")
            {
                ValueSpan = oneValue,
                Replacement = said,
            };
    }
}
