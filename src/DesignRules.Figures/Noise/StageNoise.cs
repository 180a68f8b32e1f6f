using DesignRules.Elaboration;
using DesignRules.Model;

namespace DesignRules.Figures.Noise;

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
/// <param name="Circuit">The chain compiled for noise that every stage of the design was analysed on.</param>
/// <param name="Request">The noise request the stage was analysed with (output node, band, input level).</param>
internal sealed record StageNoiseFigures(
    StageProbe Stage, NoiseResult Result, double Low, double High, double SignalPeak, double StageGain, double RmsFactor, NoiseCircuit Circuit, NoiseRequest Request)
{
    /// <summary>RMS of the smallest signal at the stage output, V.</summary>
    public double SignalRms => SignalPeak * StageGain * RmsFactor;

    /// <summary>Signal-to-noise ratio at the stage output in dB (20·log10 of the RMS ratio).</summary>
    public double SignalToNoiseDecibels => Result.OutputRms > 0 && SignalRms > 0 ? 20 * Math.Log10(SignalRms / Result.OutputRms) : double.PositiveInfinity;

    /// <summary>The output noise referred to the stage's own input (divided by its ideal gain), V RMS.</summary>
    public double NoiseAtStageInput => StageGain > 0 ? Result.OutputRms / StageGain : double.PositiveInfinity;

    /// <summary>The largest contributor, or null when the analysis found no noise source.</summary>
    public NoiseContribution? Largest => Result.Contributors.Count > 0 ? Result.Contributors[0] : null;
}

/// <summary>
/// Which stages get a noise analysis, over which band, and the analysis itself: the nominal chain compiled once for
/// noise (<see cref="NoiseCircuit"/>), every wanted stage analysed on it, its operating point solved once per input level.
/// <see cref="DesignAnalyses.Noise"/> computes it once per design and every noise rule and the pages share it.
/// </summary>
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
    /// The noise figures of every stage that wants them and has a band, in signal order, from one compilation of the
    /// nominal chain; a failed analysis is reported once (DR920) and its stage left out.
    /// </summary>
    public static IReadOnlyList<StageNoiseFigures> Compute(DesignAnalyses analyses)
    {
        var chain = analyses.Chain(BandEnd.Top);
        if (!chain.Succeeded)
        {
            return [];
        }

        var design = analyses.Design;
        double level = SourceSignal.Amplitude(design.Source.Waveform);
        double? inputLevel = null;
        NoiseCircuit? circuit = null;
        var figures = new List<StageNoiseFigures>();
        foreach (var stage in chain.Stages)
        {
            double gain = Math.Max(Math.Abs(stage.Transfer.SlopePositive), Math.Abs(stage.Transfer.SlopeNegative));
            if (inputLevel is null && StageProperties.IsRectifying(stage))
            {
                inputLevel = PassingLevel(design.Source.Waveform, stage.Transfer.Kind);
            }

            if (Wanted(stage) && Band(design, stage.Stage) is { } band)
            {
                circuit ??= NoiseCircuit.Compile(chain.Circuit);
                var request = new NoiseRequest(stage.OutputNode, chain.SourceId, band.Low, band.High) { InputLevel = inputLevel };
                var result = circuit.Analyse(request);
                if (result.Failure is { } failure)
                {
                    analyses.ReportFailure("the noise analysis", failure, chain);
                }
                else
                {
                    double signal = stage.Stage.Requirements.MinSignal?.Value.Value ?? level;
                    figures.Add(new StageNoiseFigures(stage, result, band.Low, band.High, signal, gain, RmsFactor(design.Source.Waveform.Kind), circuit, request));
                }
            }

            level *= gain;
        }

        return figures;
    }

    /// <summary>
    /// The source level a rectifying chain is linearised at: its DC level plus the peak in the direction the rectifier
    /// passes, so the diode conducts and the loop is closed, as it is while the signal is rectified.
    /// </summary>
    /// <summary>
    /// The stage's RMS noise referred to its input (as <see cref="StageNoiseFigures.NoiseAtStageInput"/>) with the whole
    /// chain at <paramref name="celsius"/>: the resistors' Johnson–Nyquist noise and the diodes' shot noise with that
    /// temperature's kT and operating point; the amplifiers' stated voltage and current noise densities, which parts state
    /// at 25 °C, unchanged. Null when the analysis fails there.
    /// </summary>
    public static double? AtStageInput(ElaboratedChain chain, StageNoiseFigures figures, double celsius)
    {
        var circuit = chain.Circuit.Without([]);
        circuit.Temperature = PhysicalConstants.ZeroCelsius + celsius;
        var result = NoiseCircuit.Compile(circuit).Analyse(figures.Request);
        return result.Failure is null && figures.StageGain > 0 ? result.OutputRms / figures.StageGain : null;
    }

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
}
