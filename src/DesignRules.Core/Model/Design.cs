using DesignRules.Diagnostics;
using DesignRules.Quantities;

namespace DesignRules.Model;

/// <summary>One signal chain as declared in a design file, with every part reference resolved.</summary>
/// <param name="Id">The design id.</param>
/// <param name="Title">A human title.</param>
/// <param name="Summary">What the chain is for.</param>
/// <param name="File">The design file path.</param>
/// <param name="ESeries">The preferred-value series resistors must come from, if declared (e.g. "E24").</param>
/// <param name="Supplies">Supply rails.</param>
/// <param name="Source">The signal driving the first stage.</param>
/// <param name="Load">What the last stage drives.</param>
/// <param name="Stages">The stages in signal order.</param>
/// <param name="Requirements">Requirements on the whole chain.</param>
/// <param name="Waivers">Waived findings.</param>
/// <param name="Libraries">The parts libraries visible to this design, built-in first.</param>
public sealed record Design(
    Located<string> Id,
    string Title,
    string Summary,
    string File,
    Located<string>? ESeries,
    Supplies Supplies,
    SignalSource Source,
    SignalLoad Load,
    IReadOnlyList<Stage> Stages,
    Requirements Requirements,
    IReadOnlyList<Waiver> Waivers,
    IReadOnlyList<PartsLibrary> Libraries)
{
    /// <summary>The hazardous energy the chain connects to beyond its own supplies, as declared (null when not declared).</summary>
    public Hazards? Hazards { get; init; }

    /// <summary>The preferred-value series capacitors must come from, if declared (e.g. "E12"); capacitors have their own, coarser series.</summary>
    public Located<string>? CapacitorESeries { get; init; }

    /// <summary>
    /// The operating temperature range (°C) the design must meet its requirements over, if declared; null means 25 °C
    /// only, the temperature parts files state their figures at.
    /// </summary>
    public Located<QuantityRange>? Temperature { get; init; }
}

/// <summary>The supply rails. A single-supply design has a negative rail of 0 V.</summary>
/// <param name="Positive">Positive rail voltage.</param>
/// <param name="Negative">Negative rail voltage (0 V when not written).</param>
public sealed record Supplies(Located<Quantity> Positive, Located<Quantity> Negative);

/// <summary>Waveform shapes a source can have.</summary>
public enum WaveformKind
{
    /// <summary>Sine wave.</summary>
    Sine,
    /// <summary>Symmetric triangle.</summary>
    Triangle,
    /// <summary>Square or pulse with finite edges.</summary>
    Square,
    /// <summary>A constant level.</summary>
    Dc,
    /// <summary>A sum of other waveforms.</summary>
    Sum,
}

/// <summary>A waveform: shape, amplitude (peak), frequency or band, offset, and for squares edge time and duty.</summary>
/// <param name="Kind">The shape.</param>
/// <param name="Amplitude">Peak amplitude (absent for DC).</param>
/// <param name="Frequency">A single frequency, if given.</param>
/// <param name="Band">A band whose ends are tested, if given instead.</param>
/// <param name="Offset">DC level added (the level itself for DC).</param>
/// <param name="RiseTime">Edge time of a square, if given.</param>
/// <param name="Duty">Duty ratio of a square, if given.</param>
/// <param name="Components">Parts of a sum.</param>
/// <param name="Span">Where it is written.</param>
public sealed record Waveform(
    WaveformKind Kind,
    Located<Quantity>? Amplitude,
    Located<Quantity>? Frequency,
    Located<QuantityRange>? Band,
    Located<Quantity>? Offset,
    Located<Quantity>? RiseTime,
    Located<Quantity>? Duty,
    IReadOnlyList<Waveform> Components,
    SourceSpan Span);

/// <summary>The signal source: its waveform, source impedance and common-mode level.</summary>
/// <param name="Waveform">The waveform.</param>
/// <param name="Impedance">Source impedance (0 Ω when not written).</param>
/// <param name="CommonMode">Common-mode level around which a difference stage sees the signal split, if given.</param>
/// <param name="Span">Where it is written.</param>
public sealed record SignalSource(Waveform Waveform, Located<Quantity> Impedance, Located<Quantity>? CommonMode, SourceSpan Span);

/// <summary>The load the last stage drives.</summary>
/// <param name="Resistance">Load resistance.</param>
/// <param name="Capacitance">Load capacitance, if given.</param>
/// <param name="ReturnsTo">The voltage the load returns to (0 V when not written).</param>
/// <param name="Span">Where it is written.</param>
public sealed record SignalLoad(Located<Quantity> Resistance, Located<Quantity>? Capacitance, Located<Quantity> ReturnsTo, SourceSpan Span);

/// <summary>Ideal transfers a stage or chain may be required to realise.</summary>
public enum TransferKind
{
    /// <summary>A linear gain.</summary>
    Gain,
    /// <summary>Output equals the input's magnitude.</summary>
    AbsoluteValue,
    /// <summary>Passes positive half-cycles, blocks negative ones.</summary>
    HalfWavePositive,
    /// <summary>Passes negative half-cycles, blocks positive ones.</summary>
    HalfWaveNegative,
    /// <summary>Holds the peak.</summary>
    Peak,
    /// <summary>The average of the input.</summary>
    Average,
}

/// <summary>Requirements on a stage or a chain; every one is optional.</summary>
/// <param name="Transfer">The ideal transfer.</param>
/// <param name="Gain">Expected gain.</param>
/// <param name="Accuracy">Allowed deviation of the transfer.</param>
/// <param name="Glitch">Longest allowed zero-crossing glitch.</param>
/// <param name="Yield">Minimum Monte Carlo yield.</param>
/// <param name="Bandwidth">Lowest allowed −3 dB bandwidth.</param>
/// <param name="OutputOffset">Largest allowed output offset.</param>
/// <param name="MinSignal">Smallest signal that must be handled to the accuracy.</param>
/// <param name="Span">Where the requirements are written (the stage or design when absent).</param>
public sealed record Requirements(
    Located<TransferKind>? Transfer,
    Located<Quantity>? Gain,
    Located<Quantity>? Accuracy,
    Located<Quantity>? Glitch,
    Located<Quantity>? Yield,
    Located<Quantity>? Bandwidth,
    Located<Quantity>? OutputOffset,
    Located<Quantity>? MinSignal,
    SourceSpan Span)
{
    /// <summary>
    /// Lowest allowed worst-case common-mode rejection (a plain ratio; <c>cmrr: 80 dB</c> is 10 000) of a difference stage.
    /// </summary>
    public Located<Quantity>? CommonModeRejection { get; init; }

    /// <summary>The −3 dB corner (the natural frequency f0) of a low- or high-pass filter stage, with its allowed deviation.</summary>
    public FilterTarget? Cutoff { get; init; }

    /// <summary>The centre frequency f0 of a band-pass filter stage, with its allowed deviation.</summary>
    public FilterTarget? Centre { get; init; }

    /// <summary>The quality factor Q of a filter stage, with its allowed deviation.</summary>
    public FilterTarget? Q { get; init; }

    /// <summary>The gain in the pass band (at the centre for a band-pass), with its allowed deviation.</summary>
    public FilterTarget? PassbandGain { get; init; }

    /// <summary>The least attenuation a filter stage must give at a frequency in its stop band.</summary>
    public StopbandRequirement? Stopband { get; init; }

    /// <summary>
    /// Lowest allowed signal-to-noise ratio at the stage output for the smallest signal (<see cref="MinSignal"/>, else the
    /// source's level), a plain amplitude ratio (<c>snr: 60 dB</c> is 1000).
    /// </summary>
    public Located<Quantity>? SignalToNoise { get; init; }

    /// <summary>Largest allowed RMS noise over the noise band, at the stage output or referred to the design's input.</summary>
    public NoiseRequirement? Noise { get; init; }

    /// <summary>The band noise is integrated over when the source states no band of its own.</summary>
    public Located<QuantityRange>? NoiseBand { get; init; }

    /// <summary>No requirement at all.</summary>
    public static Requirements None(SourceSpan span) => new(null, null, null, null, null, null, null, null, span);
}

/// <summary>Where a noise requirement is measured.</summary>
public enum NoiseReference
{
    /// <summary>At the stage output.</summary>
    Output,
    /// <summary>Referred to the design's input: the output noise divided by the pass-band gain from the source.</summary>
    Input,
}

/// <summary>The largest RMS noise a stage may show, and where it is measured.</summary>
/// <param name="Rms">The RMS noise voltage over the noise band.</param>
/// <param name="At">At the output, or referred to the input.</param>
/// <param name="Span">Where the requirement is written.</param>
public sealed record NoiseRequirement(Located<Quantity> Rms, Located<NoiseReference> At, SourceSpan Span);

/// <summary>A filter figure a stage must reach, and how far the built circuit may be off it (relative).</summary>
/// <param name="Value">The figure (a frequency, a Q, a gain).</param>
/// <param name="Within">The allowed relative deviation (2 %).</param>
/// <param name="Span">Where the requirement is written.</param>
public sealed record FilterTarget(Located<Quantity> Value, Located<Quantity> Within, SourceSpan Span);

/// <summary>The least attenuation relative to the pass band at one frequency of the stop band.</summary>
/// <param name="Frequency">Where the attenuation is required.</param>
/// <param name="Attenuation">The least attenuation as a ratio above 1 (40 dB is 100).</param>
/// <param name="Span">Where the requirement is written.</param>
public sealed record StopbandRequirement(Located<Quantity> Frequency, Located<Quantity> Attenuation, SourceSpan Span);

/// <summary>A waived finding: rule, stage (or "*"), mandatory reason, optional expiry.</summary>
/// <param name="Rule">The rule id.</param>
/// <param name="Stage">The stage id, or "*" for the whole design.</param>
/// <param name="Reason">Why the finding is accepted.</param>
/// <param name="Expires">The last day the waiver holds, if limited.</param>
/// <param name="Span">Where it is written.</param>
public sealed record Waiver(Located<string> Rule, Located<string> Stage, Located<string> Reason, Located<DateOnly>? Expires, SourceSpan Span);
