using DesignRules.Blocks;
using DesignRules.Elaboration;
using DesignRules.Figures.Filters;
using DesignRules.Figures.LoadingBandwidthStress;
using DesignRules.Figures.Noise;
using DesignRules.Figures.SlewSaturation;
using DesignRules.Figures.Stability;
using DesignRules.Figures.Tolerance;
using DesignRules.Model;
using DesignRules.Simulation;

namespace DesignRules.Figures;

/// <summary>
/// Where the analyses of one design report what they could not do: a failed analysis (DR920 in the rules) and a
/// transient that did not reach its periodic steady state (DR925). The rules' evaluation implements it, so the figures
/// layer computes and the rules layer judges and reports.
/// </summary>
internal interface IAnalysisFailures
{
    /// <summary>An analysis of <paramref name="chain"/> failed.</summary>
    void Failed(string analysis, SimulationFailure failure, ElaboratedChain chain);

    /// <summary>The transient at <paramref name="end"/> did not settle within its bounds.</summary>
    void Unsettled(BandEnd end, SettledTransient steady);
}

/// <summary>
/// The named analyses of one design, each computed at most once, on first use, and shared by every rule that needs it:
/// the nominal chain and its settled transient at each band end, the DC operating point, the AC sweep, the amplifier
/// waveforms, the single-supply bias, the offset corners, the small-signal loading, the output-current demand, the noise
/// of the stages that ask for it, and per stage the worst case and the Monte Carlo of its DC transfer. Not thread-safe: one design is evaluated on one thread.
/// </summary>
internal sealed class DesignAnalyses(Design design, MonteCarloSettings monteCarlo, IAnalysisFailures failures)
{
    /// <summary>
    /// How many threads the runs inside this design may use at once (band ends, tolerance corners, worst-case and Monte
    /// Carlo samples); -1 for one per core. Each run writes its own slot, so the results do not depend on it.
    /// </summary>
    public int MaxDegreeOfParallelism { get; init; } = -1;

    /// <summary>The options every parallel loop of this design's analyses runs with.</summary>
    internal ParallelOptions Parallelism => new() { MaxDegreeOfParallelism = MaxDegreeOfParallelism, TaskScheduler = TaskScheduler.Current };

    private readonly Dictionary<BandEnd, ElaboratedChain> chains = [];
    private readonly Dictionary<BandEnd, ElaboratedChain> settledChains = [];
    private readonly Dictionary<BandEnd, SettledTransient> transients = [];
    private readonly Dictionary<BandEnd, BandWaveforms?> waveforms = [];
    private readonly Dictionary<BandEnd, IReadOnlyDictionary<string, AmplifierDemand>> demands = [];
    private readonly Dictionary<int, LoadingBandwidthStress.Loading?> loadings = [];
    private readonly Dictionary<string, WorstCaseAnalysis> worstCases = new(StringComparer.Ordinal);
    private readonly Dictionary<string, MonteCarloYield> monteCarlos = new(StringComparer.Ordinal);
    private OperatingPointResult? operatingPoint;
    private AcResult? ac;
    private Lazy<SmallSignal?>? smallSignal;
    private IReadOnlyList<SingleSupplyBias>? singleSupply;
    private OffsetShift.Corners? offsetCorners;
    private IReadOnlyList<CornerRun>? cornerRuns;
    private IReadOnlyList<(ToleranceCorner Corner, BandWaveforms Band)>? cornerWaveforms;
    private IReadOnlyList<(ToleranceCorner Corner, ElaboratedChain Chain, IReadOnlyDictionary<string, AmplifierDemand> Demands)>? cornerDemands;
    private IReadOnlyDictionary<string, FillingHold>? fillingHolds;
    private readonly Dictionary<string, MeasuredFilter?> filters = new(StringComparer.Ordinal);
    private readonly Dictionary<string, FilterTolerance?> filterSpreads = new(StringComparer.Ordinal);
    private ResistorPowers? resistorPowers;
    private LoopGainFigures? loopGains;
    private StepFigures? steps;
    private readonly Dictionary<(string ElementId, double Limit, double? Celsius), CapacitiveLoadFix?> capacitiveLoads = [];
    private IReadOnlyList<StageNoiseFigures>? noise;
    private IReadOnlyList<GbwAtTemperature>? gbwEnds;
    private readonly Dictionary<double, (AcResult Sweep, SmallSignal? Small)> acAt = [];
    private readonly Dictionary<double, LoopGainFigures> loopGainsAt = [];
    private readonly Dictionary<double, StepFigures> stepsAt = [];
    private readonly Dictionary<string, double?> deadZoneFractions = [];
    private readonly Dictionary<(string Stage, double Celsius), double?> noiseAtTemperature = [];

    public MonteCarloSettings MonteCarlo { get; } = monteCarlo;

    /// <summary>
    /// True (the default) when the first settled transient asked for runs every band end's at once, side by side on the
    /// cores (a check asks for them all); false runs each only when asked (a re-run that judges one rule).
    /// </summary>
    public bool BandEndsTogether { get; set; } = true;

    /// <summary>The design the analyses are of.</summary>
    public Design Design { get; } = design;

    /// <summary>Reports a failed analysis to the rules layer (DR920).</summary>
    public void ReportFailure(string analysis, SimulationFailure failure, ElaboratedChain chain) => failures.Failed(analysis, failure, chain);

    /// <summary>Reports a settled run that did not reach its periodic steady state at <paramref name="end"/> (DR925), such as a tolerance corner's.</summary>
    public void ReportUnsettled(BandEnd end, SettledTransient steady) => failures.Unsettled(end, steady);

    /// <summary>
    /// True when the transient at <paramref name="end"/> reached its periodic steady state; otherwise reports it (DR925)
    /// and returns false, so that no figure is measured on an unsettled signal.
    /// </summary>
    public bool IsSettled(BandEnd end)
    {
        var steady = Steady(end);
        if (!steady.Settled) failures.Unsettled(end, steady);
        return steady.Settled;
    }

    /// <summary>Every amplifier measured in the settled transient at <paramref name="end"/> (null when it cannot be run).</summary>
    public BandWaveforms? Waveforms(BandEnd end) =>
        waveforms.TryGetValue(end, out var w) ? w : waveforms[end] = AmplifierWaveforms.Compute(this, end);

    /// <summary>The stages of a single-supply design that need a bias level (empty for a split supply).</summary>
    public IReadOnlyList<SingleSupplyBias> SingleSupplyStages => singleSupply ??= SingleSupply.Compute(this);

    /// <summary>The DC operating points with every amplifier's offset at nominal, +maximum and −maximum.</summary>
    public OffsetShift.Corners OffsetCorners => offsetCorners ??= OffsetShift.Compute(this);

    /// <summary>The AC sweep over the source's band with its band frequencies (null when it cannot be run).</summary>
    public SmallSignal? SmallSignal => (smallSignal ??= new Lazy<SmallSignal?>(() => LoadingBandwidthStress.SmallSignal.Compute(this), LazyThreadSafetyMode.None)).Value;

    /// <summary>The loading between stage <paramref name="stageIndex"/>'s output and what it drives.</summary>
    public LoadingBandwidthStress.Loading? LoadingAt(int stageIndex) =>
        loadings.TryGetValue(stageIndex, out var l) ? l : loadings[stageIndex] = SmallSignal?.ComputeLoading(this, stageIndex);

    /// <summary>The output current each amplifier is asked for in the transient at <paramref name="end"/>, by element id.</summary>
    public IReadOnlyDictionary<string, AmplifierDemand> OutputCurrentDemand(BandEnd end) =>
        demands.TryGetValue(end, out var d) ? d : demands[end] = LoadingBandwidthStress.OutputCurrentDemand.Compute(this, end);

    /// <summary>
    /// The chain and its settled transient at each resistor-tolerance corner and band end (<see cref="ToleranceCorners"/>),
    /// for the rules that judge a figure at its worst corner; none for a DC source or a chain without tolerances.
    /// </summary>
    public IReadOnlyList<CornerRun> CornerRuns => cornerRuns ??= ToleranceCorners.Compute(this);

    /// <summary>The amplifier waveforms measured in every corner run (<see cref="CornerRuns"/>).</summary>
    public IReadOnlyList<(ToleranceCorner Corner, BandWaveforms Band)> CornerWaveforms => cornerWaveforms ??= AmplifierWaveforms.AtCorners(this);

    /// <summary>The output current each amplifier is asked for in every corner run, by element id.</summary>
    public IReadOnlyList<(ToleranceCorner Corner, ElaboratedChain Chain, IReadOnlyDictionary<string, AmplifierDemand> Demands)> CornerDemands =>
        cornerDemands ??= LoadingBandwidthStress.OutputCurrentDemand.AtCorners(this);

    /// <summary>The peak stages whose hold capacitor is still filling in the measured periods, by stage id.</summary>
    public IReadOnlyDictionary<string, FillingHold> FillingHolds => fillingHolds ??= HoldFilling.Compute(this);

    /// <summary>
    /// The transients at each band end that ran and reached their periodic steady state, with their chains; a failed
    /// transient is reported once (DR920) and an unsettled one (DR925), and both are skipped, so no figure is measured on them.
    /// </summary>
    public IEnumerable<(BandEnd End, ElaboratedChain Chain, TransientResult Result)> SettledTransients
    {
        get
        {
            foreach (var end in BandEnds)
            {
                var chain = Chain(end);
                if (!chain.Succeeded)
                {
                    yield break;
                }

                var result = Transient(end);
                if (!result.Succeeded)
                {
                    ReportFailure("transient", result.Failure!, chain);
                    continue;
                }

                if (!IsSettled(end))
                {
                    continue;
                }

                yield return (end, chain, result);
            }
        }
    }

    /// <summary>
    /// The mean power of every resistor, the largest over the band ends and the resistor-tolerance corners, with the corner
    /// where each peaks (<see cref="LoadingBandwidthStress.ResistorPowers"/>); null power when the chain cannot be analysed.
    /// </summary>
    public ResistorPowers ResistorPowers => resistorPowers ??= LoadingBandwidthStress.ResistorPowers.Compute(this);

    /// <summary>The ideal response of a filter block stage, from its block descriptor; null for any other stage.</summary>
    public static FilterResponse? IdealFilter(Stage stage) => stage is BlockStage block ? block.Block.Filter(BlockValues.Of(block)) : null;

    /// <summary>f0, Q and pass-band gain of a filter stage measured from the nominal chain's AC analysis; null when not measurable.</summary>
    public MeasuredFilter? Filter(StageProbe stage) =>
        filters.TryGetValue(stage.StageId, out var m) ? m
        : filters[stage.StageId] = IdealFilter(stage.Stage) is { } ideal ? FilterFigures.Measure(Chain(BandEnd.Top), stage, ideal) : null;

    /// <summary>The worst case and Monte Carlo of a filter stage's f0, Q and pass-band gain over its part tolerances.</summary>
    public FilterTolerance? FilterSpread(StageProbe stage) =>
        filterSpreads.TryGetValue(stage.StageId, out var t) ? t
        : filterSpreads[stage.StageId] = IdealFilter(stage.Stage) is { } ideal ? FilterTolerance.Run(this, stage, ideal) : null;

    /// <summary>
    /// Every amplifier's loop gain and margins in the nominal chain, at the operating point where its margin is smallest
    /// (one loop-gain analysis per amplifier per design, shared by the stability rules and the pages).
    /// </summary>
    public LoopGainFigures LoopGains => loopGains ??= LoopGainAnalyses.Compute(Chain(BandEnd.Top));

    /// <summary>
    /// The nominal chain with its amplifiers' GBW at each end of the operating range where a part's <c>gbw-derating</c>
    /// moves it (variants of the compiled circuit); empty without a range or a derating.
    /// </summary>
    public IReadOnlyList<GbwAtTemperature> GbwEnds => gbwEnds ??= GbwOverTemperature.Ends(Design, Chain(BandEnd.Top));

    /// <summary>The AC sweep and the small-signal list (as <see cref="Ac"/> and <see cref="SmallSignal"/>) with the GBWs of <paramref name="end"/>.</summary>
    public (AcResult Sweep, SmallSignal? Small) AcAt(GbwAtTemperature end) =>
        acAt.TryGetValue(end.Celsius, out var r) ? r
        : acAt[end.Celsius] = (Simulate.AcSweep(end.Chain.Circuit, AcSweepPlan(end.Chain)), LoadingBandwidthStress.SmallSignal.Compute(this, end.Chain));

    /// <summary>Every amplifier's loop gain and margins (as <see cref="LoopGains"/>) with the GBWs of <paramref name="end"/>.</summary>
    public LoopGainFigures LoopGainsAt(GbwAtTemperature end) =>
        loopGainsAt.TryGetValue(end.Celsius, out var l) ? l : loopGainsAt[end.Celsius] = LoopGainAnalyses.Compute(end.Chain);

    /// <summary>Every stage output's answer to a small step at the source (its record set by <see cref="LoopGains"/>).</summary>
    public StepFigures Steps => steps ??= StepAnalyses.Compute(LoopGains);

    /// <summary>Every stage output's answer to a small step (as <see cref="Steps"/>) with the GBWs of <paramref name="end"/>.</summary>
    public StepFigures StepsAt(GbwAtTemperature end) =>
        stepsAt.TryGetValue(end.Celsius, out var s) ? s : stepsAt[end.Celsius] = StepAnalyses.Compute(LoopGainsAt(end));

    /// <summary>
    /// The capacitive load on an amplifier's output and, when its margin is below <paramref name="minPhaseMargin"/> °,
    /// what restores it (searched on variants of the compiled circuit); null when the output drives no capacitance.
    /// <paramref name="end"/> names the GBW end of the operating range the loop was found at (<see cref="LoopGainsAt"/>);
    /// null for the 25 °C loop of <see cref="LoopGains"/>.
    /// </summary>
    public CapacitiveLoadFix? CapacitiveLoad(AmplifierLoop loop, double minPhaseMargin, GbwAtTemperature? end = null) =>
        capacitiveLoads.TryGetValue((loop.ElementId, minPhaseMargin, end?.Celsius), out var c) ? c
        : capacitiveLoads[(loop.ElementId, minPhaseMargin, end?.Celsius)] = CapacitiveLoadVariants.Compute(end?.Chain ?? LoopGains.Chain, loop, minPhaseMargin);

    /// <summary>
    /// The noise at the output of every stage whose requirements ask for it (<c>snr</c>, <c>noise</c>, a rectifier's
    /// <c>min-signal</c>), over its noise band, in signal order: the nominal chain compiled once for noise and each stage
    /// analysed on it (<see cref="StageNoise"/>), shared by the noise rules and the pages.
    /// </summary>
    public IReadOnlyList<StageNoiseFigures> Noise => noise ??= StageNoise.Compute(this);

    /// <summary>The stages of the nominal chain (none when the chain could not be built).</summary>
    public IReadOnlyList<StageProbe> Stages
    {
        get
        {
            var chain = Chain(BandEnd.Top);
            return chain.Succeeded ? chain.Stages : [];
        }
    }

    /// <summary>
    /// The extreme-value worst case of a stage's DC transfer. Its <see cref="WorstCaseAnalysis.Circuit"/> is the stage's
    /// chain compiled once: <c>Circuit.Measure(variation)</c> solves any further corner warm. Where the design declares an
    /// operating range it is the temperature worst case too: the same analysis at the range's low end, middle and high end
    /// on that one circuit (<see cref="WorstCaseAnalysis.AtTemperatures"/>), combined, shared by every rule that asks.
    /// </summary>
    public WorstCaseAnalysis WorstCase(StageProbe stage) =>
        worstCases.TryGetValue(stage.StageId, out var w) ? w
        : worstCases[stage.StageId] = WorstCaseAnalysis.Run(Design, Chain(BandEnd.Top), stage, HoldDeviation(stage), MaxDegreeOfParallelism);

    /// <summary>The seeded Monte Carlo of a stage's DC transfer with the rule-set's settings.</summary>
    public MonteCarloYield MonteCarloOf(StageProbe stage) =>
        monteCarlos.TryGetValue(stage.StageId, out var m) ? m
        : monteCarlos[stage.StageId] = MonteCarloYield.Run(WorstCase(stage), MonteCarlo, MaxDegreeOfParallelism);

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
            RunSteady(end);
            result = transients[end];
        }

        return result;
    }

    /// <summary>
    /// Runs the settled transient at <paramref name="end"/> and, for a periodic source, at every other band end not yet
    /// run: they are independent (each its own chain and circuit), so they run side by side on the cores, each result
    /// the same bits as run alone. Every rule that asks for one asks for the others too.
    /// </summary>
    private void RunSteady(BandEnd end)
    {
        var chain = RawChain(end);
        var ends = BandEndsTogether && chain.Period is not null && chain.Succeeded
            ? BandEnds.Where(e => e == end || !transients.ContainsKey(e)).ToList()
            : [end];

        // Elaboration touches this object's caches: it stays on this thread; only the transients run in parallel.
        var raws = ends.Select(RawChain).ToList();
        var results = new SettledTransient[ends.Count];
        if (ends.Count == 1)
        {
            results[0] = PeriodicSteadyState.Run(raws[0], SteadyStateLimits.Default);
        }
        else
        {
            Parallel.For(0, ends.Count, Parallelism, i => results[i] = PeriodicSteadyState.Run(raws[i], SteadyStateLimits.Default));
        }

        for (int i = 0; i < ends.Count; i++)
        {
            transients[ends[i]] = results[i];
        }
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

    /// <summary>
    /// The fraction of a small signal at a precision rectifier stage's input that reaches its amplifier's inputs while the
    /// loop is open in the dead zone (<see cref="DeadZoneFraction"/>), on the nominal chain; null when it cannot be measured.
    /// </summary>
    public double? DeadZoneFractionOf(StageProbe stage, AmplifierProbe amplifier) =>
        deadZoneFractions.TryGetValue(amplifier.ElementId, out var f) ? f
        : deadZoneFractions[amplifier.ElementId] = DeadZoneFraction.Of(Chain(BandEnd.Top), stage, amplifier);

    /// <summary>
    /// A stage's RMS noise referred to its input with the chain at <paramref name="celsius"/> (<see cref="StageNoise.AtStageInput"/>;
    /// at 25 °C the figure of <see cref="Noise"/>), or null when it cannot be computed there.
    /// </summary>
    public double? NoiseAtStageInput(StageNoiseFigures figures, double celsius)
    {
        if (celsius == TemperatureBehaviour.Reference)
        {
            return figures.NoiseAtStageInput;
        }

        var key = (figures.Stage.StageId, celsius);
        return noiseAtTemperature.TryGetValue(key, out var n) ? n : noiseAtTemperature[key] = StageNoise.AtStageInput(Chain(BandEnd.Top), figures, celsius);
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

    /// <summary>
    /// For a peak stage: the range of (held output − input peak) over the measured periods of the nominal transient at
    /// each band end, V; null for other stages or when no transient could be run.
    /// </summary>
    private Interval? HoldDeviation(StageProbe stage)
    {
        if (TransferTarget.Of(stage).Kind != TransferKind.Peak || !IsPeriodic)
        {
            return null;
        }

        // A hold still filling is not drooping: DR305 reports it, and its held value is not judged as droop.
        if (FillingHolds.ContainsKey(stage.StageId))
        {
            return null;
        }

        Interval? range = null;
        foreach (var end in BandEnds)
        {
            var chain = Chain(end);
            var result = Transient(end);
            var probe = chain.Stage(stage.StageId);
            if (!result.Succeeded || probe is null)
            {
                if (result.Failure is { } failure) ReportFailure("transient", failure, chain);
                continue;
            }

            if (!IsSettled(end))
            {
                continue;
            }

            var time = result.Time;
            var input = result.Voltage(probe.InputNode);
            var output = result.Voltage(probe.OutputNode);
            double peak = double.NegativeInfinity;
            for (int i = 0; i < time.Count; i++) if (time[i] >= chain.Window.MeasureFrom) peak = Math.Max(peak, input[i]);
            if (!double.IsFinite(peak)) continue;
            for (int i = 0; i < time.Count; i++)
            {
                if (time[i] < chain.Window.MeasureFrom) continue;
                double d = output[i] - peak;
                range = range is { } r ? r.Include(d) : Interval.Point(d);
            }
        }

        return range;
    }

    private static AcSweep AcSweepPlan(ElaboratedChain chain)
    {
        // The design's source carries a unit stimulus, so that every node voltage reads as its transfer from the source.
        return Simulation.Analysis.AcSweep.Decades(chain.SourceId, 1, 100e6, 20);
    }
}
