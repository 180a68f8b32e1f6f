using DesignRules.Model;

namespace DesignRules.Figures;

/// <summary>Frequencies and amplitude of the design's source, read from the model.</summary>
internal static class SourceSignal
{
    /// <summary>The highest frequency the source is tested at (band top, own frequency, or a sum's highest); null for DC.</summary>
    public static double? TopFrequency(Model.Waveform w) => w.Kind switch
    {
        WaveformKind.Dc => null,
        WaveformKind.Sum => w.Components.Select(TopFrequency).Where(f => f is not null).Max(),
        _ => w.Band?.Value.High.Value ?? w.Frequency?.Value.Value,
    };

    /// <summary>The peak amplitude of the source (the sum of a sum's components; the level of a DC source).</summary>
    public static double Amplitude(Model.Waveform w) => w.Kind switch
    {
        WaveformKind.Dc => Math.Abs(w.Offset?.Value.Value ?? 0),
        WaveformKind.Sum => w.Components.Sum(Amplitude),
        _ => Math.Abs(w.Amplitude?.Value.Value ?? 0),
    };
}
