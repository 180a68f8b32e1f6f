using DesignRules.Figures.Tolerance;
using DesignRules.Elaboration;
using DesignRules.Simulation;

namespace DesignRules.Figures.LoadingBandwidthStress;

/// <summary>What one amplifier's output asked for and got at one band end.</summary>
/// <param name="Demanded">Peak current the circuit demands of the output (from the run without current limits), A.</param>
/// <param name="Delivered">Peak current the part's limited output delivered in the nominal run, A.</param>
/// <param name="CurrentLimited">True when the nominal run drove the output into its current limit.</param>
/// <param name="ClipsOnlyByCurrent">
/// True when the output clipped (its drive held at a swing limit) in the nominal run but not in the run without current
/// limits: the current limit, not the swing limit, is what clips it.
/// </param>
/// <param name="OutputReached">The largest |output| the limited output reached, V.</param>
/// <param name="OutputAsked">The largest |output| the run without current limits reached, V.</param>
internal sealed record AmplifierDemand(double Demanded, double Delivered, bool CurrentLimited, bool ClipsOnlyByCurrent, double OutputReached, double OutputAsked);

/// <summary>
/// The current each amplifier output demands, as opposed to the current a limited output delivers. A current-limited output
/// delivers its part's limit whatever the circuit asks, so the nominal transient cannot tell a stage that asks 21 mA of a
/// 20 mA part from one that asks 50 mA, nor a clip at the swing limit from one at the current limit. Where any amplifier of a
/// band end reaches its current limit, the chain is run once more with every amplifier's limit removed (same circuit,
/// same time window); the peak output current of that run is the demand, and an output that clips only in the limited run
/// clips because of its current limit.
/// </summary>
internal static class OutputCurrentDemand
{
    /// <summary>Per amplifier element id, what its output asked for and got at <paramref name="end"/> (empty when the chain cannot be simulated).</summary>
    public static IReadOnlyDictionary<string, AmplifierDemand> At(DesignAnalyses analyses, BandEnd end) =>
        analyses.OutputCurrentDemand(end);

    /// <summary>The same at every resistor-tolerance corner and band end (<see cref="DesignAnalyses.CornerRuns"/>).</summary>
    internal static IReadOnlyList<(ToleranceCorner Corner, ElaboratedChain Chain, IReadOnlyDictionary<string, AmplifierDemand> Demands)> AtCorners(DesignAnalyses analyses) =>
        analyses.CornerRuns.Select(r => (r.Corner, r.Chain, (IReadOnlyDictionary<string, AmplifierDemand>)Of(analyses.Design, r.Chain, r.Transient))).ToList();

    /// <summary>The demands of the corner whose chain is <paramref name="chain"/>, if it is one (else empty).</summary>
    public static IReadOnlyDictionary<string, AmplifierDemand> AtCorner(DesignAnalyses analyses, ElaboratedChain chain) =>
        analyses.CornerDemands.FirstOrDefault(c => ReferenceEquals(c.Chain, chain)).Demands ?? new Dictionary<string, AmplifierDemand>();

    internal static Dictionary<string, AmplifierDemand> Compute(DesignAnalyses analyses, BandEnd end)
    {
        var chain = analyses.Chain(end);
        if (!chain.Succeeded)
        {
            return new Dictionary<string, AmplifierDemand>(StringComparer.Ordinal);
        }

        return Of(analyses.Design, chain, analyses.Transient(end));
    }

    private static Dictionary<string, AmplifierDemand> Of(Model.Design design, ElaboratedChain chain, TransientResult nominal)
    {
        var demands = new Dictionary<string, AmplifierDemand>(StringComparer.Ordinal);
        if (!nominal.Succeeded || nominal.Time.Count < 2)
        {
            return demands;
        }

        double from = Math.Min(chain.Window.MeasureFrom, nominal.Time[^1]);
        var amplifiers = chain.Stages.SelectMany(s => s.Amplifiers).ToList();
        var limited = amplifiers.ToDictionary(a => a.ElementId, a => Measure(nominal, a.ElementId, from), StringComparer.Ordinal);
        TransientResult? unlimited = null;
        if (limited.Values.Any(m => m.CurrentLimited))
        {
            // Same design, same options, only the output current limits removed; a failure leaves the delivered figures.
            var free = ChainElaborator.Elaborate(design, chain.Options with { OutputCurrentLimits = false });
            if (free.Succeeded)
            {
                var run = Simulate.Transient(free.Circuit, chain.Window.ToOptions());
                unlimited = run.Succeeded && run.Time.Count >= 2 ? run : null;
            }
        }

        foreach (var amp in amplifiers)
        {
            var got = limited[amp.ElementId];
            var asked = unlimited is null ? got : Measure(unlimited, amp.ElementId, Math.Min(from, unlimited.Time[^1]));
            demands[amp.ElementId] = new AmplifierDemand(
                Math.Max(asked.PeakCurrent, got.PeakCurrent), got.PeakCurrent, got.CurrentLimited,
                got.CurrentLimited && got.AtSwingLimit && !asked.AtSwingLimit, got.PeakOutput, asked.PeakOutput);
        }

        return demands;
    }

    private sealed record Run(double PeakCurrent, double PeakOutput, bool CurrentLimited, bool AtSwingLimit);

    private static Run Measure(TransientResult result, string amplifierId, double from)
    {
        var trace = result.Amplifier(amplifierId);
        var output = result.Voltage(trace.OutputNode);
        double current = 0, peak = 0;
        bool limited = false, atLimit = false;
        for (int i = 0; i < result.Time.Count; i++)
        {
            if (result.Time[i] < from) continue;
            current = Math.Max(current, Math.Abs(trace.OutputCurrent[i]));
            peak = Math.Max(peak, Math.Abs(output[i]));
            limited |= trace.CurrentLimited[i];
            atLimit |= trace.AtSwingLimit[i];
        }

        return new Run(current, peak, limited, atLimit);
    }
}
