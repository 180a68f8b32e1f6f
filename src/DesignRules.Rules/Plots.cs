namespace DesignRules.Rules;

/// <summary>What a trace of a transient plot shows.</summary>
public enum TraceRole
{
    /// <summary>The stage's input node.</summary>
    Input,
    /// <summary>The stage's output node.</summary>
    StageOutput,
    /// <summary>An amplifier's own output node (inside the stage).</summary>
    AmplifierOutput,
}

/// <summary>One named waveform on a uniform time grid.</summary>
/// <param name="Name">The node name, e.g. <c>rect.u1.out</c>.</param>
/// <param name="Role">What the node is.</param>
/// <param name="Values">Volts, one per time point of the plot.</param>
public sealed record Trace(string Name, TraceRole Role, IReadOnlyList<double> Values);

/// <summary>An amplifier's output swing limits, drawn as lines on the transient plot.</summary>
/// <param name="Amplifier">The amplifier element id.</param>
/// <param name="Low">Lowest output voltage the part reaches.</param>
/// <param name="High">Highest output voltage the part reaches.</param>
public sealed record SwingBand(string Amplifier, double Low, double High);

/// <summary>Two periods of the transient at the band top: input, stage output and every amplifier output.</summary>
/// <param name="Frequency">Signal frequency of the run.</param>
/// <param name="Time">Seconds, uniform grid.</param>
/// <param name="Traces">The waveforms.</param>
/// <param name="SwingLimits">Swing limits of the stage's amplifiers.</param>
public sealed record TransientPlot(double Frequency, IReadOnlyList<double> Time, IReadOnlyList<Trace> Traces, IReadOnlyList<SwingBand> SwingLimits);

/// <summary>The stage's small-signal response, output over input.</summary>
/// <param name="Frequency">Hertz, log-spaced.</param>
/// <param name="MagnitudeDb">Gain in dB.</param>
/// <param name="PhaseDegrees">Phase in degrees, unwrapped.</param>
public sealed record BodePlot(IReadOnlyList<double> Frequency, IReadOnlyList<double> MagnitudeDb, IReadOnlyList<double> PhaseDegrees)
{
    /// <summary>Vertical marks on a filter stage's response: the signal band's ends, the −3 dB points, the stop-band frequency.</summary>
    public IReadOnlyList<ResponseMark> Marks { get; init; } = [];

    /// <summary>The most a filter stage may pass at its stop-band frequency, dB (the pass-band level less the required attenuation).</summary>
    public double? StopbandLimitDb { get; init; }
}

/// <summary>A vertical mark on a response plot.</summary>
/// <param name="Frequency">Where, Hz.</param>
/// <param name="Label">What it marks.</param>
public sealed record ResponseMark(double Frequency, string Label);

/// <summary>Monte Carlo samples of a stage's main figure with the requirement's limits.</summary>
/// <param name="Figure">What was sampled, e.g. "gain".</param>
/// <param name="Unit">Its SI unit symbol ("1" for ratios).</param>
/// <param name="Samples">The sampled values, in sample order.</param>
/// <param name="Low">Lowest acceptable value, if any.</param>
/// <param name="High">Highest acceptable value, if any.</param>
public sealed record SampleDistribution(string Figure, string Unit, IReadOnlyList<double> Samples, double? Low, double? High)
{
    /// <summary>What the samples show, for the plot's caption (e.g. the yield with its confidence interval), if anything.</summary>
    public string? Caption { get; init; }
}

/// <summary>One contributor to a stage's output noise, for the noise plot and the contributor table.</summary>
/// <param name="Element">The element id (<c>amp.rf</c>, <c>amp.u1</c>, <c>source.rs</c>).</param>
/// <param name="Source">What kind of noise, in words ("thermal 4kTR", "voltage noise e_n").</param>
/// <param name="Rms">Its RMS noise at the stage output over the band, V.</param>
/// <param name="Share">Its fraction of the output noise power (0..1).</param>
/// <param name="Density">Its density at the output at each plot frequency, V/√Hz.</param>
public sealed record NoiseContributor(string Element, string Source, double Rms, double Share, IReadOnlyList<double> Density);

/// <summary>The noise density at a stage's output over the noise band: the total and each contributor, largest first.</summary>
/// <param name="Frequency">Hertz, log-spaced, both band ends included.</param>
/// <param name="Total">Total density at the output, V/√Hz.</param>
/// <param name="Contributors">Every contributor, largest first.</param>
/// <param name="OutputRms">The integrated RMS noise at the output, V.</param>
public sealed record NoisePlot(IReadOnlyList<double> Frequency, IReadOnlyList<double> Total, IReadOnlyList<NoiseContributor> Contributors, double OutputRms);

/// <summary>The plot data of one stage; each part is absent when it does not apply or its analysis failed.</summary>
/// <param name="StageId">The stage id.</param>
/// <param name="Transient">The band-top transient.</param>
/// <param name="Bode">The closed-loop response.</param>
/// <param name="Distribution">The Monte Carlo distribution of the main figure.</param>
public sealed record StagePlots(string StageId, TransientPlot? Transient, BodePlot? Bode, SampleDistribution? Distribution)
{
    /// <summary>The loop gain of each amplifier of the stage whose loop is closed, with its crossover and phase margin.</summary>
    public IReadOnlyList<LoopGainPlot> LoopGains { get; init; } = [];

    /// <summary>The small-step response, where the stage rings (overshoot above 5 %); null otherwise.</summary>
    public StepPlot? Step { get; init; }
    /// <summary>The output noise density with its contributors, for a stage whose requirements asked for its noise.</summary>
    public NoisePlot? Noise { get; init; }
}
