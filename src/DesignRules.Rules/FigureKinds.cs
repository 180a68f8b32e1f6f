namespace DesignRules.Rules;

/// <summary>
/// Every kind of figure the rules record, one constant each: the stable name shared by the JSON report, the pages and the
/// comparison of two runs, the unit, and the label people read. A test keeps the names unique and well formed.
/// </summary>
public static class FigureKinds
{
    // Slew demand and full-power bandwidth.
    /// <summary>The slew rate an amplifier output must reach (subject: the output node). <c>slew.demand</c></summary>
    public static readonly FigureKind SlewDemand = new("slew.demand", "V/s", "slew demanded at {0}");

    /// <summary>The part's slew rate in the direction judged. <c>slew.rate</c></summary>
    public static readonly FigureKind SlewRate = new("slew.rate", "V/s", "slew rate");

    /// <summary>The swing crossed while slewing. <c>slew.swing</c></summary>
    public static readonly FigureKind SlewingSwing = new("slew.swing", "V", "slewing swing");

    /// <summary>The time allowed for one slewing event. <c>slew.time-allowed</c></summary>
    public static readonly FigureKind SlewWindow = new("slew.time-allowed", "s", "time allowed");

    /// <summary>SR / (2π·Vp) of an amplifier output (subject: the slot). <c>slew.full-power-bandwidth</c></summary>
    public static readonly FigureKind FullPowerBandwidth = new("slew.full-power-bandwidth", "Hz", "full-power bandwidth");

    /// <summary>The full-power bandwidth the signal needs. <c>slew.full-power-bandwidth.required</c></summary>
    public static readonly FigureKind RequiredFullPowerBandwidth = new("slew.full-power-bandwidth.required", "Hz", "required full-power bandwidth");

    /// <summary>The peak excursion of an amplifier output. <c>slew.peak-excursion</c></summary>
    public static readonly FigureKind PeakExcursion = new("slew.peak-excursion", "V", "peak excursion");

    /// <summary>The steepest slope the signal asks of an amplifier output (2π·k·f·Vp). <c>slew.steepest-slope</c></summary>
    public static readonly FigureKind SteepestSlope = new("slew.steepest-slope", "V/s", "steepest slope demanded");

    /// <summary>How long the stage output is wrong after a zero crossing. <c>glitch.width</c></summary>
    public static readonly FigureKind Glitch = new("glitch.width", "s", "zero-crossing glitch");

    /// <summary>The longest glitch allowed. <c>glitch.allowed</c></summary>
    public static readonly FigureKind AllowedGlitch = new("glitch.allowed", "s", "allowed glitch");

    /// <summary>Half-width of the band around the ideal output. <c>glitch.error-band</c></summary>
    public static readonly FigureKind GlitchErrorBand = new("glitch.error-band", "V", "error band");

    // Saturation and headroom.
    /// <summary>Room between an amplifier output's extreme and its swing limit (subject: the slot). <c>swing.margin</c></summary>
    public static readonly FigureKind SwingMargin = new("swing.margin", "V", "output swing margin");

    /// <summary>The extreme an amplifier output reaches. <c>swing.extreme</c></summary>
    public static readonly FigureKind OutputExtreme = new("swing.extreme", "V", "output extreme");

    /// <summary>The part's swing limit at the rail. <c>swing.limit</c></summary>
    public static readonly FigureKind SwingLimit = new("swing.limit", "V", "swing limit");

    /// <summary>Output shift from offset voltage and bias currents. <c>swing.offset-shift</c></summary>
    public static readonly FigureKind OffsetShift = new("swing.offset-shift", "V", "offset shift");

    /// <summary>How far an amplifier output runs while its loop is open (subject: the slot). <c>open-loop.excursion</c></summary>
    public static readonly FigureKind OpenLoopExcursion = new("open-loop.excursion", "V", "open-loop excursion");

    /// <summary>Time to come back into the linear range (subject: the slot). <c>open-loop.recovery</c></summary>
    public static readonly FigureKind RecoveryTime = new("open-loop.recovery", "s", "recovery time");

    /// <summary>Recovery time as a fraction of the period. <c>open-loop.recovery-fraction</c></summary>
    public static readonly FigureKind RecoveryFraction = new("open-loop.recovery-fraction", "1", "recovery fraction of period");

    /// <summary>The largest recovery fraction allowed. <c>open-loop.recovery-fraction.allowed</c></summary>
    public static readonly FigureKind AllowedRecoveryFraction = new("open-loop.recovery-fraction.allowed", "1", "allowed fraction");

    /// <summary>Room between an input's extreme and the common-mode range (subject: the slot). <c>common-mode.margin</c></summary>
    public static readonly FigureKind CommonModeMargin = new("common-mode.margin", "V", "input common-mode margin");

    /// <summary>The extreme an amplifier input reaches. <c>common-mode.extreme</c></summary>
    public static readonly FigureKind InputExtreme = new("common-mode.extreme", "V", "input extreme");

    /// <summary>The end of the common-mode range at that rail. <c>common-mode.limit</c></summary>
    public static readonly FigureKind CommonModeLimit = new("common-mode.limit", "V", "common-mode limit");

    /// <summary>Largest voltage between an amplifier's inputs (subject: the slot). <c>differential-input.peak</c></summary>
    public static readonly FigureKind DifferentialInput = new("differential-input.peak", "V", "peak differential input");

    /// <summary>The part's differential input rating. <c>differential-input.maximum</c></summary>
    public static readonly FigureKind MaximumDifferentialInput = new("differential-input.maximum", "V", "maximum differential input");

    /// <summary>Room between the input minimum and the usable range above the negative rail. <c>single-supply.headroom</c></summary>
    public static readonly FigureKind SingleSupplyHeadroom = new("single-supply.headroom", "V", "single-supply input headroom");

    /// <summary>The lowest the stage input goes. <c>single-supply.input-minimum</c></summary>
    public static readonly FigureKind InputMinimum = new("single-supply.input-minimum", "V", "input minimum");

    /// <summary>The lowest usable input above the negative rail. <c>single-supply.usable-minimum</c></summary>
    public static readonly FigureKind UsableInputMinimum = new("single-supply.usable-minimum", "V", "usable input minimum");

    // Loading.
    /// <summary>Peak current an amplifier output delivers (subject: the slot). <c>output-current.peak</c></summary>
    public static readonly FigureKind OutputCurrent = new("output-current.peak", "A", "peak output current");

    /// <summary>The rated output current times the derating. <c>output-current.derated</c></summary>
    public static readonly FigureKind DeratedOutputCurrent = new("output-current.derated", "A", "derated output current");

    /// <summary>The current the amplifier model delivered. <c>output-current.delivered</c></summary>
    public static readonly FigureKind DeliveredOutputCurrent = new("output-current.delivered", "A", "delivered output current");

    /// <summary>Signal lost to the source impedance. <c>loading.source-loss</c></summary>
    public static readonly FigureKind SourceLoadingLoss = new("loading.source-loss", "%", "source loading loss");

    /// <summary>Output error of a high-impedance output under load. <c>loading.diode-off-error</c></summary>
    public static readonly FigureKind DiodeOffError = new("loading.diode-off-error", "%", "output error while the diode is off");

    /// <summary>Signal lost to the next stage's or the load's input impedance. <c>loading.interstage-loss</c></summary>
    public static readonly FigureKind InterstageLoss = new("loading.interstage-loss", "%", "loading loss at the output");

    /// <summary>The stage's output impedance. <c>loading.output-impedance</c></summary>
    public static readonly FigureKind OutputImpedance = new("loading.output-impedance", "Ω", "output impedance");

    /// <summary>The input impedance it drives. <c>loading.input-impedance</c></summary>
    public static readonly FigureKind InputImpedance = new("loading.input-impedance", "Ω", "input impedance");

    /// <summary>The accuracy a figure was judged against. <c>accuracy</c></summary>
    public static readonly FigureKind Accuracy = new("accuracy", "%", "accuracy");

    // Tolerance.
    /// <summary>Largest transfer error over the tolerance corners. <c>tolerance.worst-case</c></summary>
    public static readonly FigureKind WorstCaseTransferError = new("tolerance.worst-case", "%", "worst-case transfer error");

    /// <summary>The gain with nominal values. <c>tolerance.gain.nominal</c></summary>
    public static readonly FigureKind NominalGain = new("tolerance.gain.nominal", "1", "nominal gain");

    /// <summary>The lowest gain over the corners. <c>tolerance.gain.low</c></summary>
    public static readonly FigureKind WorstCaseGainLow = new("tolerance.gain.low", "1", "worst-case gain low");

    /// <summary>The highest gain over the corners. <c>tolerance.gain.high</c></summary>
    public static readonly FigureKind WorstCaseGainHigh = new("tolerance.gain.high", "1", "worst-case gain high");

    /// <summary>How far a held value moves in the nominal transient. <c>tolerance.held-deviation</c></summary>
    public static readonly FigureKind HeldDeviation = new("tolerance.held-deviation", "V", "held value deviation (nominal transient)");

    /// <summary>Spread of the held value over the corners. <c>tolerance.hold-droop</c></summary>
    public static readonly FigureKind HoldDroop = new("tolerance.hold-droop", "V", "hold droop");

    /// <summary>Difference between the two half-cycles of an absolute-value stage. <c>tolerance.half-cycle-mismatch</c></summary>
    public static readonly FigureKind HalfCycleMismatch = new("tolerance.half-cycle-mismatch", "%", "worst-case half-cycle mismatch");

    /// <summary>Largest output offset over the corners. <c>tolerance.output-offset</c></summary>
    public static readonly FigureKind OutputOffset = new("tolerance.output-offset", "V", "worst-case output offset");

    /// <summary>The output offset allowed. <c>tolerance.output-offset.allowed</c></summary>
    public static readonly FigureKind AllowedOutputOffset = new("tolerance.output-offset.allowed", "V", "allowed output offset");

    /// <summary>
    /// The temperature (°C) of the design's operating range at which a worst-case figure is worst (the subject names the
    /// figure: <c>transfer</c>, <c>offset</c>). <c>temperature.worst-end@transfer</c>
    /// </summary>
    public static readonly FigureKind WorstTemperature = new("temperature.worst-end", "°C", "worst-case temperature of the {0}");

    /// <summary>How much the amplifiers' offset drift moves the output offset at the worst end of the range. <c>temperature.offset-drift</c></summary>
    public static readonly FigureKind OffsetDrift = new("temperature.offset-drift", "V", "output offset drift over temperature");

    /// <summary>Lowest common-mode rejection over the corners. <c>tolerance.cmrr</c></summary>
    public static readonly FigureKind CommonModeRejection = new("tolerance.cmrr", "1", "worst-case common-mode rejection");

    /// <summary>The common-mode rejection required. <c>tolerance.cmrr.required</c></summary>
    public static readonly FigureKind RequiredCommonModeRejection = new("tolerance.cmrr.required", "1", "required common-mode rejection");

    /// <summary>Output error from the source's common-mode level. <c>tolerance.common-mode-error</c></summary>
    public static readonly FigureKind CommonModeError = new("tolerance.common-mode-error", "V", "common-mode output error");

    /// <summary>The common-mode output error allowed. <c>tolerance.common-mode-error.allowed</c></summary>
    public static readonly FigureKind AllowedCommonModeError = new("tolerance.common-mode-error.allowed", "V", "allowed error");

    /// <summary>The settled averaged level. <c>average.level</c></summary>
    public static readonly FigureKind AveragedLevel = new("average.level", "V", "averaged level");

    /// <summary>The ideal mean of the averaged signal. <c>average.ideal</c></summary>
    public static readonly FigureKind IdealAveragedLevel = new("average.ideal", "V", "ideal averaged level");

    /// <summary>Deviation of the averaged level from the ideal. <c>average.error</c></summary>
    public static readonly FigureKind AverageError = new("average.error", "%", "average transfer error");

    /// <summary>Fraction of Monte Carlo samples within the accuracy. <c>yield.monte-carlo</c></summary>
    public static readonly FigureKind Yield = new("yield.monte-carlo", "%", "Monte Carlo yield");

    /// <summary>Lower end of the Clopper-Pearson interval. <c>yield.lower</c></summary>
    public static readonly FigureKind YieldLower = new("yield.lower", "%", "Monte Carlo yield lower bound");

    /// <summary>Upper end of the Clopper-Pearson interval. <c>yield.upper</c></summary>
    public static readonly FigureKind YieldUpper = new("yield.upper", "%", "Monte Carlo yield upper bound");

    /// <summary>The interval's confidence level. <c>yield.confidence</c></summary>
    public static readonly FigureKind YieldConfidence = new("yield.confidence", "%", "yield confidence level");

    /// <summary>The yield required. <c>yield.required</c></summary>
    public static readonly FigureKind RequiredYield = new("yield.required", "%", "required yield");

    /// <summary>Samples drawn. <c>yield.samples</c></summary>
    public static readonly FigureKind Samples = new("yield.samples", "1", "Monte Carlo samples");

    /// <summary>Samples the engine could not solve. <c>yield.unsolved</c></summary>
    public static readonly FigureKind UnsolvedSamples = new("yield.unsolved", "1", "Monte Carlo unsolved samples");

    // Bandwidth and stability.
    /// <summary>The stage's −3 dB bandwidth. <c>bandwidth.closed-loop</c></summary>
    public static readonly FigureKind ClosedLoopBandwidth = new("bandwidth.closed-loop", "Hz", "closed-loop bandwidth");

    /// <summary>The whole chain's −3 dB bandwidth. <c>bandwidth.chain</c></summary>
    public static readonly FigureKind ChainBandwidth = new("bandwidth.chain", "Hz", "closed-loop bandwidth of the chain");

    /// <summary>The bandwidth required. <c>bandwidth.required</c></summary>
    public static readonly FigureKind RequiredBandwidth = new("bandwidth.required", "Hz", "required bandwidth");

    /// <summary>Gain error at the highest signal frequency. <c>bandwidth.band-top-error</c></summary>
    public static readonly FigureKind BandTopGainError = new("bandwidth.band-top-error", "%", "gain error at the band top");

    /// <summary>An amplifier's noise gain (subject: the slot). <c>stability.noise-gain</c></summary>
    public static readonly FigureKind NoiseGain = new("stability.noise-gain", "1", "noise gain");

    /// <summary>The part's minimum stable gain. <c>stability.minimum-stable-gain</c></summary>
    public static readonly FigureKind MinimumStableGain = new("stability.minimum-stable-gain", "1", "minimum stable gain");

    /// <summary>Where an amplifier's loop gain falls through 1 (subject: the slot). <c>stability.crossover</c></summary>
    public static readonly FigureKind Crossover = new("stability.crossover", "Hz", "crossover");

    /// <summary>180° plus the loop's phase at its crossover (subject: the slot). <c>stability.phase-margin</c></summary>
    public static readonly FigureKind PhaseMargin = new("stability.phase-margin", "°", "phase margin");

    /// <summary>How far below 1 the loop gain is where its phase reaches −180° (subject: the slot). <c>stability.gain-margin</c></summary>
    public static readonly FigureKind GainMargin = new("stability.gain-margin", "dB", "gain margin");

    /// <summary>Largest |1/(1 + T)| over frequency, the closed loop's peaking (subject: the slot). <c>stability.loop-peaking</c></summary>
    public static readonly FigureKind LoopPeaking = new("stability.loop-peaking", "dB", "loop peaking");

    /// <summary>Where the loop peaking is largest. <c>stability.loop-peaking.frequency</c></summary>
    public static readonly FigureKind LoopPeakingFrequency = new("stability.loop-peaking.frequency", "Hz", "peaking frequency");

    /// <summary>Capacitance from an amplifier output to fixed nodes (subject: the slot). <c>stability.capacitive-load</c></summary>
    public static readonly FigureKind CapacitiveLoad = new("stability.capacitive-load", "F", "capacitive load");

    /// <summary>Series resistor that restores the phase margin under a capacitive load. <c>stability.isolation-resistor</c></summary>
    public static readonly FigureKind IsolationResistor = new("stability.isolation-resistor", "Ω", "isolation resistor");

    /// <summary>Overshoot of a stage output on a small step, fraction of the change. <c>stability.step-overshoot</c></summary>
    public static readonly FigureKind StepOvershoot = new("stability.step-overshoot", "%", "step overshoot");

    /// <summary>Time from the step until the stage output stays within 1 % of its change. <c>stability.step-settling</c></summary>
    public static readonly FigureKind StepSettling = new("stability.step-settling", "s", "step settling (1 %)");

    /// <summary>A rectifier amplifier's loop gain at the band top (subject: the slot). <c>rectifier.loop-gain</c></summary>
    public static readonly FigureKind LoopGain = new("rectifier.loop-gain", "1", "loop gain at the band top");

    /// <summary>Rectifier error from the finite loop gain. <c>rectifier.band-top-error</c></summary>
    public static readonly FigureKind RectifierError = new("rectifier.band-top-error", "%", "rectifier error at the band top");

    // Stress and hygiene.
    /// <summary>Power in a resistor (subject: the component). <c>stress.resistor-power</c></summary>
    public static readonly FigureKind ResistorPower = new("stress.resistor-power", "W", "power in {0}");

    /// <summary>Rated power times the derating. <c>stress.resistor-power.derated</c></summary>
    public static readonly FigureKind DeratedPower = new("stress.resistor-power.derated", "W", "derated power");

    /// <summary>Peak reverse voltage across a diode (subject: the slot). <c>stress.diode-reverse-voltage</c></summary>
    public static readonly FigureKind DiodeReverseVoltage = new("stress.diode-reverse-voltage", "V", "peak reverse voltage");

    /// <summary>Rated reverse voltage times the derating. <c>stress.diode-reverse-voltage.derated</c></summary>
    public static readonly FigureKind DeratedReverseVoltage = new("stress.diode-reverse-voltage.derated", "V", "derated rating");

    /// <summary>Peak forward current of a diode (subject: the slot). <c>stress.diode-forward-current</c></summary>
    public static readonly FigureKind DiodeForwardCurrent = new("stress.diode-forward-current", "A", "peak forward current");

    /// <summary>Rated forward current times the derating. <c>stress.diode-forward-current.derated</c></summary>
    public static readonly FigureKind DeratedForwardCurrent = new("stress.diode-forward-current.derated", "A", "derated rating");

    /// <summary>The span between the rails. <c>stress.supply-span</c></summary>
    public static readonly FigureKind SupplySpan = new("stress.supply-span", "V", "supply span");

    /// <summary>The span the part allows. <c>stress.supply-span.allowed</c></summary>
    public static readonly FigureKind AllowedSupplySpan = new("stress.supply-span.allowed", "V", "allowed span");

    /// <summary>A resistor's value. <c>hygiene.value</c></summary>
    public static readonly FigureKind ResistorValue = new("hygiene.value", "Ω", "value");

    /// <summary>The nearest value of the declared E-series. <c>hygiene.nearest-preferred</c></summary>
    public static readonly FigureKind NearestPreferredValue = new("hygiene.nearest-preferred", "Ω", "nearest preferred value");

    // Filters.
    /// <summary>The ideal natural (corner or centre) frequency from the component values. <c>filter.natural-frequency.ideal</c></summary>
    public static readonly FigureKind IdealF0 = new("filter.natural-frequency.ideal", "Hz", "ideal f0");

    /// <summary>The ideal Q from the component values. <c>filter.q.ideal</c></summary>
    public static readonly FigureKind IdealQ = new("filter.q.ideal", "1", "ideal Q");

    /// <summary>The lower −3 dB frequency of the measured response. <c>filter.band-edge.lower</c></summary>
    public static readonly FigureKind LowerMinus3Db = new("filter.band-edge.lower", "Hz", "lower −3 dB frequency");

    /// <summary>The upper −3 dB frequency of the measured response. <c>filter.band-edge.upper</c></summary>
    public static readonly FigureKind UpperMinus3Db = new("filter.band-edge.upper", "Hz", "upper −3 dB frequency");

    /// <summary>Attenuation at the stop-band frequency relative to the pass band. <c>filter.stopband-attenuation</c></summary>
    public static readonly FigureKind StopbandAttenuation = new("filter.stopband-attenuation", "1", "stop-band attenuation");

    /// <summary>The f0 measured on the stage's response. <c>filter.cutoff</c></summary>
    public static readonly FigureKind MeasuredF0 = new("filter.cutoff", "Hz", "measured f0");

    /// <summary>Deviation of the measured f0 from its requirement. <c>filter.cutoff.deviation</c></summary>
    public static readonly FigureKind F0Deviation = new("filter.cutoff.deviation", "%", "f0 deviation");

    /// <summary>The lowest f0 over the tolerance corners. <c>filter.cutoff.worst-case.low</c></summary>
    public static readonly FigureKind WorstCaseF0Low = new("filter.cutoff.worst-case.low", "Hz", "worst-case f0 low");

    /// <summary>The highest f0 over the tolerance corners. <c>filter.cutoff.worst-case.high</c></summary>
    public static readonly FigureKind WorstCaseF0High = new("filter.cutoff.worst-case.high", "Hz", "worst-case f0 high");

    /// <summary>The largest deviation of the f0 from its requirement over the corners. <c>filter.cutoff.worst-case.deviation</c></summary>
    public static readonly FigureKind WorstCaseF0Deviation = new("filter.cutoff.worst-case.deviation", "%", "worst-case f0 deviation");

    /// <summary>The share of Monte Carlo samples whose f0 is within its requirement. <c>filter.cutoff.monte-carlo-within</c></summary>
    public static readonly FigureKind F0ShareWithin = new("filter.cutoff.monte-carlo-within", "%", "Monte Carlo share of f0 within");

    /// <summary>The centre frequency measured on the stage's response. <c>filter.centre</c></summary>
    public static readonly FigureKind MeasuredCentre = new("filter.centre", "Hz", "measured centre frequency");

    /// <summary>Deviation of the measured centre frequency from its requirement. <c>filter.centre.deviation</c></summary>
    public static readonly FigureKind CentreDeviation = new("filter.centre.deviation", "%", "centre frequency deviation");

    /// <summary>The lowest centre frequency over the tolerance corners. <c>filter.centre.worst-case.low</c></summary>
    public static readonly FigureKind WorstCaseCentreLow = new("filter.centre.worst-case.low", "Hz", "worst-case centre frequency low");

    /// <summary>The highest centre frequency over the tolerance corners. <c>filter.centre.worst-case.high</c></summary>
    public static readonly FigureKind WorstCaseCentreHigh = new("filter.centre.worst-case.high", "Hz", "worst-case centre frequency high");

    /// <summary>The largest deviation of the centre frequency from its requirement over the corners. <c>filter.centre.worst-case.deviation</c></summary>
    public static readonly FigureKind WorstCaseCentreDeviation = new("filter.centre.worst-case.deviation", "%", "worst-case centre frequency deviation");

    /// <summary>The share of Monte Carlo samples whose centre frequency is within its requirement. <c>filter.centre.monte-carlo-within</c></summary>
    public static readonly FigureKind CentreShareWithin = new("filter.centre.monte-carlo-within", "%", "Monte Carlo share of centre frequency within");

    /// <summary>The Q measured on the stage's response. <c>filter.q</c></summary>
    public static readonly FigureKind MeasuredQ = new("filter.q", "1", "measured Q");

    /// <summary>Deviation of the measured Q from its requirement. <c>filter.q.deviation</c></summary>
    public static readonly FigureKind QDeviation = new("filter.q.deviation", "%", "Q deviation");

    /// <summary>The lowest Q over the tolerance corners. <c>filter.q.worst-case.low</c></summary>
    public static readonly FigureKind WorstCaseQLow = new("filter.q.worst-case.low", "1", "worst-case Q low");

    /// <summary>The highest Q over the tolerance corners. <c>filter.q.worst-case.high</c></summary>
    public static readonly FigureKind WorstCaseQHigh = new("filter.q.worst-case.high", "1", "worst-case Q high");

    /// <summary>The largest deviation of the Q from its requirement over the corners. <c>filter.q.worst-case.deviation</c></summary>
    public static readonly FigureKind WorstCaseQDeviation = new("filter.q.worst-case.deviation", "%", "worst-case Q deviation");

    /// <summary>The share of Monte Carlo samples whose Q is within its requirement. <c>filter.q.monte-carlo-within</c></summary>
    public static readonly FigureKind QShareWithin = new("filter.q.monte-carlo-within", "%", "Monte Carlo share of Q within");

    /// <summary>The pass-band gain measured on the stage's response. <c>filter.passband-gain</c></summary>
    public static readonly FigureKind MeasuredPassbandGain = new("filter.passband-gain", "1", "measured pass-band gain");

    /// <summary>Deviation of the measured pass-band gain from its requirement. <c>filter.passband-gain.deviation</c></summary>
    public static readonly FigureKind PassbandGainDeviation = new("filter.passband-gain.deviation", "%", "pass-band gain deviation");

    /// <summary>The lowest pass-band gain over the tolerance corners. <c>filter.passband-gain.worst-case.low</c></summary>
    public static readonly FigureKind WorstCasePassbandGainLow = new("filter.passband-gain.worst-case.low", "1", "worst-case pass-band gain low");

    /// <summary>The highest pass-band gain over the tolerance corners. <c>filter.passband-gain.worst-case.high</c></summary>
    public static readonly FigureKind WorstCasePassbandGainHigh = new("filter.passband-gain.worst-case.high", "1", "worst-case pass-band gain high");

    /// <summary>The largest deviation of the pass-band gain from its requirement over the corners. <c>filter.passband-gain.worst-case.deviation</c></summary>
    public static readonly FigureKind WorstCasePassbandGainDeviation = new("filter.passband-gain.worst-case.deviation", "%", "worst-case pass-band gain deviation");

    /// <summary>The share of Monte Carlo samples whose pass-band gain is within its requirement. <c>filter.passband-gain.monte-carlo-within</c></summary>
    public static readonly FigureKind PassbandGainShareWithin = new("filter.passband-gain.monte-carlo-within", "%", "Monte Carlo share of pass-band gain within");

    // Peak hold filling.
    /// <summary>The charge current following the input from an empty hold capacitor asks (C·2π·f·Vp). <c>hold.charge-current</c></summary>
    public static readonly FigureKind HoldChargeCurrent = new("hold.charge-current", "A", "hold charge current demanded");

    /// <summary>How much the held value rises per period while the capacitor fills. <c>hold.rise-per-period</c></summary>
    public static readonly FigureKind HeldRisePerPeriod = new("hold.rise-per-period", "V", "held value rise per period");

    /// <summary>The output current the amplifier delivers. <c>hold.amplifier-current</c></summary>
    public static readonly FigureKind HoldAmplifierCurrent = new("hold.amplifier-current", "A", "amplifier output current");

    /// <summary>A capacitor's value. <c>hygiene.capacitor-value</c></summary>
    public static readonly FigureKind CapacitorValue = new("hygiene.capacitor-value", "F", "value");

    /// <summary>The nearest capacitor value of the declared E-series. <c>hygiene.nearest-preferred-capacitor</c></summary>
    public static readonly FigureKind NearestPreferredCapacitorValue = new("hygiene.nearest-preferred-capacitor", "F", "nearest preferred value");

    // Noise (DR420-DR422).
    /// <summary>RMS noise at the stage output over its noise band. <c>noise.output</c></summary>
    public static readonly FigureKind OutputNoise = new("noise.output", "V", "output noise (RMS)");

    /// <summary>The output noise referred to the design's input (over the pass-band gain from the source). <c>noise.input-referred</c></summary>
    public static readonly FigureKind InputReferredNoise = new("noise.input-referred", "V", "input-referred noise (RMS)");

    /// <summary>The largest RMS noise the stage's <c>noise</c> requirement allows. <c>noise.allowed</c></summary>
    public static readonly FigureKind AllowedNoise = new("noise.allowed", "V", "allowed noise (RMS)");

    /// <summary>A contributor's share of the output noise power (subject: the element). <c>noise.share</c></summary>
    public static readonly FigureKind NoiseShare = new("noise.share", "%", "share of the output noise power of {0}");

    /// <summary>Signal-to-noise ratio of the smallest signal at the stage output. <c>noise.snr</c></summary>
    public static readonly FigureKind SignalToNoise = new("noise.snr", "dB", "signal-to-noise ratio");

    /// <summary>The stage's <c>snr</c> requirement. <c>noise.snr.required</c></summary>
    public static readonly FigureKind RequiredSignalToNoise = new("noise.snr.required", "dB", "required signal-to-noise ratio");

    /// <summary>A precision rectifier's dead zone referred to its input (offset plus diode drop over loop gain). <c>noise.dead-zone</c></summary>
    public static readonly FigureKind RectifierDeadZone = new("noise.dead-zone", "V", "rectifier dead zone");

    /// <summary>The stage's output noise divided by its gain (RMS). <c>noise.floor-at-input</c></summary>
    public static readonly FigureKind NoiseFloorAtInput = new("noise.floor-at-input", "V", "noise floor at the stage input");

    /// <summary>The dead zone plus the crest factor times the noise floor. <c>noise.dead-zone-and-floor</c></summary>
    public static readonly FigureKind DeadZoneAndFloor = new("noise.dead-zone-and-floor", "V", "dead zone plus noise floor");

    /// <summary>The smallest signal the stage must rectify (<c>min-signal</c>). <c>noise.smallest-signal</c></summary>
    public static readonly FigureKind SmallestSignal = new("noise.smallest-signal", "V", "smallest signal");

    /// <summary>Every kind, in declaration order.</summary>
    public static IReadOnlyList<FigureKind> All { get; } = typeof(FigureKinds).GetFields(System.Reflection.BindingFlags.Public | System.Reflection.BindingFlags.Static)
        .Where(f => f.FieldType == typeof(FigureKind)).Select(f => (FigureKind)f.GetValue(null)!).ToList();
}
