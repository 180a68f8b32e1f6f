using DesignRules.Elaboration;
using DesignRules.Model;
using DesignRules.Simulation;

namespace DesignRules.Rules.Evaluation;

/// <summary>
/// The analyses of one design, each run at most once and shared by every rule that needs it: the nominal chain
/// and its transient at each end of the band, the DC operating point, and the AC sweep.
/// </summary>
internal sealed class DesignAnalyses(Design design, MonteCarloSettings monteCarlo)
{
    private readonly Dictionary<BandEnd, ElaboratedChain> chains = [];
    private readonly Dictionary<BandEnd, ElaboratedChain> settledChains = [];
    private readonly Dictionary<BandEnd, SettledTransient> transients = [];
    private readonly Dictionary<string, object> shared = new(StringComparer.Ordinal);
    private OperatingPointResult? operatingPoint;
    private AcResult? ac;

    public MonteCarloSettings MonteCarlo { get; } = monteCarlo;

    /// <summary>The design the analyses are of.</summary>
    public Design Design { get; } = design;

    /// <summary>
    /// Any further analysis, computed once under <paramref name="key"/> and shared by every rule that asks for it
    /// (e.g. "tolerance:rect" for a stage's worst-case corners).
    /// </summary>
    public T Shared<T>(string key, Func<T> compute)
        where T : notnull
    {
        if (!shared.TryGetValue(key, out var value))
        {
            value = compute();
            shared[key] = value;
        }

        return (T)value;
    }

    /// <summary>The band ends a time-domain rule should look at: both ends of a band, or the single frequency once.</summary>
    public IReadOnlyList<BandEnd> BandEnds =>
        Design.Source.Waveform.Band is not null ? [BandEnd.Top, BandEnd.Bottom] : [BandEnd.Top];

    /// <summary>True when the source is periodic, so transient rules apply.</summary>
    public bool IsPeriodic => RawChain(BandEnd.Top).Period is not null;

    /// <summary>
    /// The chain at a band end. For a periodic source its <see cref="ElaboratedChain.Window"/> is the window of settled
    /// periods of <see cref="Transient"/> (the transient runs first), so every rule measures the steady state.
    /// </summary>
    public ElaboratedChain Chain(BandEnd end)
    {
        var raw = RawChain(end);
        if (raw.Period is null || !raw.Succeeded)
        {
            return raw;
        }

        var steady = Steady(end);
        return raw.Window == steady.Window ? raw : settledChains.TryGetValue(end, out var c) ? c : settledChains[end] = raw with { Window = steady.Window };
    }

    /// <summary>The transient at a band end, run until its periodic steady state (see <see cref="Steady"/>).</summary>
    public TransientResult Transient(BandEnd end) => Steady(end).Result;

    /// <summary>The transient at a band end with its settling verdict: run until successive periods agree, or a limit is hit.</summary>
    public SettledTransient Steady(BandEnd end)
    {
        if (!transients.TryGetValue(end, out var result))
        {
            result = PeriodicSteadyState.Run(RawChain(end), SteadyStateLimits.Default);
            transients[end] = result;
        }

        return result;
    }

    private ElaboratedChain RawChain(BandEnd end)
    {
        if (!chains.TryGetValue(end, out var chain))
        {
            chain = ChainElaborator.Elaborate(Design, ElaborationOptions.Default with { BandEnd = end });
            chains[end] = chain;
        }

        return chain;
    }

    public OperatingPointResult OperatingPoint()
    {
        var chain = RawChain(BandEnd.Top);
        return operatingPoint ??= Simulate.OperatingPoint(chain.Circuit);
    }

    public AcResult Ac()
    {
        var chain = RawChain(BandEnd.Top);
        return ac ??= Simulate.AcSweep(chain.Circuit, AcSweepPlan(chain));
    }

    private static AcSweep AcSweepPlan(ElaboratedChain chain)
    {
        // The design's source carries a unit stimulus, so that every node voltage reads as its transfer from the source.
        return Simulation.AcSweep.Decades(chain.SourceId, 1, 100e6, 20);
    }
}
