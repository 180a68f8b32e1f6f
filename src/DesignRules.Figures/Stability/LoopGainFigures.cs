using DesignRules.Elaboration;

namespace DesignRules.Figures.Stability;

/// <summary>
/// The loop of one amplifier as the stability rules judge it: the loop gain at the operating point where its margin is
/// smallest among those where the loop is closed (the quiescent point and the source held at either extreme, where a
/// rectifier's or peak detector's diode conducts), or, when the loop is closed at none of them, the quiescent loop.
/// </summary>
/// <param name="StageId">The stage.</param>
/// <param name="Slot">The slot or netlist element id (u1).</param>
/// <param name="ElementId">The engine element id (stage.u1).</param>
/// <param name="OutputNode">The amplifier's output node.</param>
/// <param name="Frequencies">Frequencies of <see cref="LoopGain.Gain"/>, Hz.</param>
/// <param name="Loop">The loop gain and its margins.</param>
/// <param name="BiasValue">The source's value at the operating point used, V; null for the quiescent point.</param>
/// <param name="QuiescentCrossover">The crossover of the loop at the quiescent point, Hz, where it is closed there (a
/// small step from rest is answered at that speed, whichever operating point has the least margin); else null.</param>
internal sealed record AmplifierLoop(
    string StageId, string Slot, string ElementId, string OutputNode, IReadOnlyList<double> Frequencies, LoopGain Loop, double? BiasValue, double? QuiescentCrossover);

/// <summary>Every amplifier loop of a design, or the failure that stopped the analysis.</summary>
internal sealed record LoopGainFigures(IReadOnlyList<AmplifierLoop> Loops, SimulationFailure? Failure, ElaboratedChain Chain)
{
    /// <summary>The loop of an amplifier by stage and slot, or null.</summary>
    public AmplifierLoop? Of(string stageId, string slot) => Loops.FirstOrDefault(l => l.StageId == stageId && l.Slot == slot);
}

/// <summary>
/// The loop-gain analysis of a design (<see cref="DesignAnalyses.LoopGains"/>, run once and shared by the stability rules
/// and the pages): one engine loop-gain run per operating point covers every amplifier.
/// </summary>
internal static class LoopGainAnalyses
{
    /// <summary>
    /// The sweep every loop is read over: 1 Hz to 1 GHz, 10 points a decade (enough to bracket every crossing and to
    /// unwrap the phase of any loop without a resonance sharper than a tenth of a decade), crossings placed by bisection.
    /// </summary>
    public static LoopGainRequest Sweep { get; } = LoopGainRequest.Decades(1, 1e9, 10);

    /// <summary>
    /// Degrees by which a loop read at a source extreme must have less margin than the quiescent one to replace it: a
    /// linear stage's loop moves by a few thousandths of a degree with its output level, and keeps its quiescent figure.
    /// </summary>
    private const double MarginResolution = 0.05;

    /// <summary>The margins of one amplifier of <paramref name="circuit"/> (a variant of the chain's) at a loop's operating point.</summary>
    public static LoopMargins? MarginsOf(Circuit circuit, ElaboratedChain chain, AmplifierLoop loop)
    {
        var request = Sweep with { Amplifiers = [loop.ElementId], BiasSource = loop.BiasValue is null ? null : chain.SourceId, BiasValue = loop.BiasValue ?? 0 };
        var result = Simulate.LoopGain(circuit, request);
        return result.Succeeded ? result.Loop(loop.ElementId)?.Margins : null;
    }

    /// <summary>Every amplifier loop of <paramref name="chain"/> at the operating point where its margin is smallest.</summary>
    public static LoopGainFigures Compute(ElaboratedChain chain)
    {
        if (!chain.Succeeded)
        {
            return new LoopGainFigures([], null, chain);
        }

        var quiescent = Simulate.LoopGain(chain.Circuit, Sweep);
        if (!quiescent.Succeeded)
        {
            return new LoopGainFigures([], quiescent.Failure, chain);
        }

        // Every amplifier is read again with the source held at either extreme, not only one whose loop is open at rest: a
        // conducting diode's small-signal resistance, and the pole it makes with a hold capacitor, moves with the current
        // the signal drives through it, so a peak detector closed at rest can have its least margin at its peak. An
        // extreme replaces the quiescent loop only when its margin is smaller by more than MarginResolution.
        var best = quiescent.Loops.ToDictionary(l => l.Amplifier, l => (Loop: l, Bias: (double?)null), StringComparer.Ordinal);
        foreach (var bias in SourceExtremes(chain))
        {
            var biased = Simulate.LoopGain(chain.Circuit, Sweep with { BiasSource = chain.SourceId, BiasValue = bias });
            if (!biased.Succeeded)
            {
                continue;
            }

            foreach (var loop in biased.Loops.Where(l => l.Margins.State == LoopState.Closed))
            {
                var kept = best[loop.Amplifier];
                if (kept.Loop.Margins.State != LoopState.Closed || loop.Margins.PhaseMargin < kept.Loop.Margins.PhaseMargin - MarginResolution)
                {
                    best[loop.Amplifier] = (loop, bias);
                }
            }
        }

        var loops = new List<AmplifierLoop>();
        foreach (var stage in chain.Stages)
        {
            foreach (var amp in stage.Amplifiers)
            {
                if (best.TryGetValue(amp.ElementId, out var b))
                {
                    var rest = quiescent.Loops.First(l => l.Amplifier == amp.ElementId).Margins;
                    double? restCrossover = rest.State == LoopState.Closed ? rest.Crossover : null;
                    loops.Add(new AmplifierLoop(stage.StageId, amp.Slot, amp.ElementId, amp.OutputNode, quiescent.Frequencies, b.Loop, b.Bias, restCrossover));
                }
            }
        }

        return new LoopGainFigures(loops, null, chain);
    }

    // The source's lowest and highest value over a period (its quiescent value alone for a DC source), where a diode
    // that is off at the quiescent point conducts.
    private static IEnumerable<double> SourceExtremes(ElaboratedChain chain)
    {
        var waveform = chain.SourceWaveform;
        if (chain.Period is not { } period)
        {
            yield break;
        }

        double low = double.PositiveInfinity, high = double.NegativeInfinity;
        const int samples = 256;
        for (int i = 0; i < samples; i++)
        {
            double v = waveform.ValueAt(period * i / samples);
            low = Math.Min(low, v);
            high = Math.Max(high, v);
        }

        double rest = waveform.DcValue;
        if (high > rest + 1e-9)
        {
            yield return high;
        }

        if (low < rest - 1e-9)
        {
            yield return low;
        }
    }
}
