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
    private readonly Dictionary<BandEnd, TransientResult> transients = [];
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
    public bool IsPeriodic => Chain(BandEnd.Top).Period is not null;

    public ElaboratedChain Chain(BandEnd end)
    {
        if (!chains.TryGetValue(end, out var chain))
        {
            chain = ChainElaborator.Elaborate(Design, ElaborationOptions.Default with { BandEnd = end });
            chains[end] = chain;
        }

        return chain;
    }

    public TransientResult Transient(BandEnd end)
    {
        if (!transients.TryGetValue(end, out var result))
        {
            var chain = Chain(end);
            result = Simulate.Transient(chain.Circuit, chain.Window.ToOptions());
            transients[end] = result;
        }

        return result;
    }

    public OperatingPointResult OperatingPoint()
    {
        var chain = Chain(BandEnd.Top);
        return operatingPoint ??= Simulate.OperatingPoint(chain.Circuit);
    }

    public AcResult Ac()
    {
        var chain = Chain(BandEnd.Top);
        return ac ??= Simulate.AcSweep(chain.Circuit, AcSweepPlan(chain));
    }

    private static AcSweep AcSweepPlan(ElaboratedChain chain)
    {
        // The design's source carries a unit stimulus, so that every node voltage reads as its transfer from the source.
        return Simulation.AcSweep.Decades(chain.SourceId, 1, 100e6, 20);
    }
}
