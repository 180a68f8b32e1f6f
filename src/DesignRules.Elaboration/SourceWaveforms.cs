using DesignRules.Simulation;
using ModelWaveform = DesignRules.Model.Waveform;
using WaveformKind = DesignRules.Model.WaveformKind;

namespace DesignRules.Elaboration;

/// <summary>
/// Turns a design's source waveform into the engine's: sine, triangle and square (finite edges, given duty) at the chosen
/// test frequency and amplitude scale, a DC level, or a sum of those.
/// </summary>
internal static class SourceWaveforms
{
    /// <summary>The frequency a waveform is tested at: its own, or the chosen end of its band; null for DC.</summary>
    public static double? Frequency(ModelWaveform w, BandEnd end) => w.Kind switch
    {
        WaveformKind.Dc => null,
        WaveformKind.Sum => null,
        _ => w.Frequency?.Value.Value ?? (w.Band is { } band ? (end == BandEnd.Top ? band.Value.High.Value : band.Value.Low.Value) : null),
    };

    /// <summary>Every test frequency of a waveform and its components.</summary>
    public static IEnumerable<double> Frequencies(ModelWaveform w, BandEnd end) =>
        w.Kind == WaveformKind.Sum ? w.Components.SelectMany(c => Frequencies(c, end)) : Frequency(w, end) is { } f ? [f] : [];

    /// <summary>
    /// Where the fastest test frequency of a waveform is written (a component's <c>frequency:</c>, or the band whose end is
    /// tested): the value that sets a transient's largest step, and so its step count; null for DC.
    /// </summary>
    public static Diagnostics.SourceSpan? FastestSpan(ModelWaveform w, BandEnd end)
    {
        var candidates = w.Kind == WaveformKind.Sum ? w.Components : [w];
        Diagnostics.SourceSpan? span = null;
        double fastest = 0;
        foreach (var c in candidates)
        {
            if (c.Kind == WaveformKind.Sum || Frequency(c, end) is not { } f || !(f > fastest)) continue;
            fastest = f;
            span = c.Frequency?.Span ?? c.Band?.Span;
        }

        return span;
    }

    /// <summary>The engine waveform; <paramref name="frequencyScale"/> multiplies every frequency.</summary>
    public static Waveform Convert(ModelWaveform w, BandEnd end, double amplitudeScale, double frequencyScale)
    {
        double amplitude = (w.Amplitude?.Value.Value ?? 0) * amplitudeScale;
        double offset = w.Offset?.Value.Value ?? 0;
        double f = (Frequency(w, end) ?? 0) * frequencyScale;
        switch (w.Kind)
        {
            case WaveformKind.Sine:
                return new SineWaveform(amplitude, f, offset);
            case WaveformKind.Triangle:
                return new TriangleWaveform(amplitude, f, offset);
            case WaveformKind.Square:
                double period = 1 / f;
                double duty = w.Duty?.Value.Value ?? 0.5;
                double edge = w.RiseTime?.Value.Value ?? (0.01 * period);
                return new PulseWaveform(offset - amplitude, offset + amplitude, period, duty, edge, edge);
            case WaveformKind.Sum:
                return new SumWaveform(w.Components.Select(c => Convert(c, end, amplitudeScale, frequencyScale)).ToArray());
            default:
                return new DcWaveform(offset * amplitudeScale);
        }
    }
}
