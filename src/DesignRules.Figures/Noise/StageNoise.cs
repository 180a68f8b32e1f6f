using DesignRules.Elaboration;
using DesignRules.Model;
using DesignRules.Rules.Evaluation.LoadingBandwidthStress;
using DesignRules.Simulation;

namespace DesignRules.Rules.Evaluation.Noise;

/// <summary>
/// The noise of one stage's output: the engine's noise analysis of the whole chain (every resistor, amplifier and diode up
/// to and after the stage, the source impedance included), with the signal the stage must handle, for the noise rules
/// (DR420-DR422) and the pages.
/// </summary>
/// <param name="Stage">The stage.</param>
/// <param name="Result">The engine's noise analysis at the stage output.</param>
/// <param name="Low">Bottom of the noise band, Hz.</param>
/// <param name="High">Top of the noise band, Hz.</param>
/// <param name="SignalPeak">The smallest signal at the stage input, peak V (<c>min-signal</c>, else the source carried through the stages before).</param>
/// <param name="StageGain">The stage's ideal gain magnitude (the larger slope of a rectifier).</param>
/// <param name="RmsFactor">RMS over peak of the source waveform (1/√2 for a sine).</param>
internal sealed record StageNoiseFigures(StageProbe Stage, NoiseResult Result, double Low, double High, double SignalPeak, double StageGain, double RmsFactor)
{
    /// <summary>RMS of the smallest signal at the stage output, V.</summary>
    public double SignalRms => SignalPeak * StageGain * RmsFactor;

    /// <summary>Signal-to-noise ratio at the stage output in dB (20·log10 of the RMS ratio).</summary>
    public double SignalToNoiseDecibels => Result.OutputRms > 0 && SignalRms > 0 ? 20 * Math.Log10(SignalRms / Result.OutputRms) : double.PositiveInfinity;

    /// <summary>The output noise referred to the stage's own input (divided by its ideal gain), V RMS.</summary>
    public double NoiseAtStageInput => StageGain > 0 ? Result.OutputRms / StageGain : double.PositiveInfinity;

    /// <summary>The band as people read it.</summary>
    public string Band => $"{Say.Hertz(Low)} to {Say.Hertz(High)}";
}

/// <summary>Which stages get a noise analysis, over which band, and the shared analysis itself.</summary>
internal static class StageNoise
{
    /// <summary>True when a stage states a requirement that needs its noise: <c>snr</c>, <c>noise</c>, or a rectifier's <c>min-signal</c>.</summary>
    public static bool Wanted(StageProbe stage)
    {
        var r = stage.Stage.Requirements;
        return r.SignalToNoise is not null || r.Noise is not null || (StageProperties.IsRectifying(stage) && r.MinSignal is not null);
    }

    /// <summary>The band noise is integrated over: the stage's <c>noise-band</c>, else the source's band; null when neither is stated.</summary>
    public static (double Low, double High)? Band(Design design, Stage stage)
    {
        if (stage.Requirements.NoiseBand is { } stated)
        {
            return (stated.Value.Low.Value, stated.Value.High.Value);
        }

        return design.Source.Waveform.Band is { } band ? (band.Value.Low.Value, band.Value.High.Value) : null;
    }

    /// <summary>
    /// The noise figures of every stage that wants them and has a band, in signal order; a failed analysis is reported
    /// once (DR920) and its stage skipped.
    /// </summary>
    public static IEnumerable<StageNoiseFigures> Stages(DesignEvaluation evaluation)
    {
        var chain = evaluation.Analyses.Chain(BandEnd.Top);
        if (!chain.Succeeded)
        {
            yield break;
        }

        var design = evaluation.Design;
        double level = SourceSignal.Amplitude(design.Source.Waveform);
        double? inputLevel = null;
        foreach (var stage in chain.Stages)
        {
            double gain = Math.Max(Math.Abs(stage.Transfer.SlopePositive), Math.Abs(stage.Transfer.SlopeNegative));
            if (inputLevel is null && StageProperties.IsRectifying(stage))
            {
                inputLevel = PassingLevel(design.Source.Waveform, stage.Transfer.Kind);
            }

            if (Wanted(stage) && Band(design, stage.Stage) is { } band)
            {
                var request = new NoiseRequest(stage.OutputNode, chain.SourceId, band.Low, band.High) { InputLevel = inputLevel };
                var result = evaluation.Analyses.Shared("noise:" + stage.StageId, () => Simulate.Noise(chain.Circuit, request));
                if (result.Failure is { } failure)
                {
                    evaluation.ReportFailure("the noise analysis", failure, chain);
                }
                else
                {
                    double signal = stage.Stage.Requirements.MinSignal?.Value.Value ?? level;
                    yield return new StageNoiseFigures(stage, result, band.Low, band.High, signal, gain, RmsFactor(design.Source.Waveform.Kind));
                }
            }

            level *= gain;
        }
    }

    /// <summary>
    /// The source level a rectifying chain is linearised at: its DC level plus the peak in the direction the rectifier
    /// passes, so the diode conducts and the loop is closed, as it is while the signal is rectified.
    /// </summary>
    private static double PassingLevel(Model.Waveform waveform, TransferKind kind)
    {
        double offset = waveform.Offset?.Value.Value ?? 0;
        if (waveform.Kind == WaveformKind.Dc)
        {
            return offset;
        }

        double amplitude = SourceSignal.Amplitude(waveform);
        return kind == TransferKind.HalfWaveNegative ? offset - amplitude : offset + amplitude;
    }

    /// <summary>RMS over peak of a waveform (sine 1/√2, triangle 1/√3, square and DC 1; a sum is taken as a sine).</summary>
    private static double RmsFactor(WaveformKind kind) => kind switch
    {
        WaveformKind.Triangle => 1 / Math.Sqrt(3),
        WaveformKind.Square or WaveformKind.Dc => 1,
        _ => 1 / Math.Sqrt(2),
    };

    /// <summary>A contributor in words with its share: "the thermal noise of `rect.rf` (40 % of the noise power)".</summary>
    public static string Cause(NoiseContribution? c) => c is null ? "not known (the analysis found no noise source)" : c.Kind switch
    {
        NoiseKind.Thermal => $"the thermal noise of `{c.Element}`",
        NoiseKind.AmplifierVoltage => $"the voltage noise of `{c.Element}`",
        NoiseKind.AmplifierCurrentNonInverting => $"the current noise of `{c.Element}` at its + input",
        NoiseKind.AmplifierCurrentInverting => $"the current noise of `{c.Element}` at its − input",
        _ => $"the shot noise of `{c.Element}`",
    } + $" ({Say.Percent(c.Share)} of the noise power)";

    /// <summary>What would lower a contributor.</summary>
    public static string Fix(NoiseContribution? c) => c?.Kind switch
    {
        NoiseKind.Thermal => "lower that resistance (noise voltage grows as √R) or narrow the noise band",
        NoiseKind.AmplifierVoltage => "choose an amplifier with a lower noise density, or lower the noise gain",
        NoiseKind.AmplifierCurrentNonInverting or NoiseKind.AmplifierCurrentInverting => "choose an amplifier with lower current noise (a JFET or CMOS input), or lower the resistance its input sees",
        NoiseKind.Shot => "change the diode's operating current, or filter after it",
        _ => "narrow the noise band",
    };

    /// <summary>Most points of a noise plot's traces: enough for a smooth curve, small enough for a diff-able SVG.</summary>
    private const int PlotPoints = 161;

    /// <summary>The plot data of a stage's noise: the analysis' final grid thinned to at most <see cref="PlotPoints"/> points.</summary>
    public static NoisePlot Plot(StageNoiseFigures figures)
    {
        var r = figures.Result;
        int count = r.Frequencies.Count;
        int stride = Math.Max(1, (int)Math.Ceiling((count - 1) / (double)(PlotPoints - 1)));
        var index = Enumerable.Range(0, count).Where(i => i % stride == 0 || i == count - 1).ToArray();
        double[] Pick(IReadOnlyList<double> values) => index.Select(i => values[i]).ToArray();
        var contributors = r.Contributors.Select(c => new NoiseContributor(c.Element, Words(c.Kind), c.Rms, c.Share, Pick(c.Density))).ToList();
        return new NoisePlot(Pick(r.Frequencies), Pick(r.OutputDensity), contributors, r.OutputRms);
    }

    /// <summary>A kind of noise as a page names it.</summary>
    public static string Words(NoiseKind kind) => kind switch
    {
        NoiseKind.Thermal => "thermal 4kTR",
        NoiseKind.AmplifierVoltage => "voltage noise e_n",
        NoiseKind.AmplifierCurrentNonInverting => "current noise i_n at +",
        NoiseKind.AmplifierCurrentInverting => "current noise i_n at −",
        _ => "shot noise 2qI",
    };

    /// <summary>Where to point a noise finding: the element of the largest contributor, else the stage.</summary>
    public static Diagnostics.SourceSpan Target(DesignEvaluation evaluation, StageNoiseFigures figures)
    {
        var chain = evaluation.Analyses.Chain(BandEnd.Top);
        return figures.Result.Contributors.Count > 0 ? chain.Locate(figures.Result.Contributors[0].Element) : figures.Stage.Stage.Span;
    }
}
