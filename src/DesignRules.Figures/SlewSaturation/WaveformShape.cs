using DesignRules.Simulation;

namespace DesignRules.Figures.SlewSaturation;

/// <summary>
/// How steep a periodic source waveform is for its size: its steepest slope divided by 2π·f·Vp (f its highest frequency,
/// Vp its peak excursion from its mean). 1 for a sine (the slope of Vp·sin(2πft) peaks at 2π·f·Vp), 2/π for a triangle
/// (4·Vp·f), found by sampling for a sum. A stage scales the waveform, not its shape, so the same factor holds at every
/// linear amplifier output.
/// </summary>
/// <param name="Factor">Steepest slope over 2π·f·Vp.</param>
/// <param name="Formula">How the message names the full-power bandwidth formula it used.</param>
internal sealed record WaveformShape(double Factor, string Formula)
{
    private const int Samples = 8192;

    /// <summary>The shape of <paramref name="waveform"/>, or null for a square (its edges are steps: DR102 judges them).</summary>
    public static WaveformShape? Of(Waveform waveform, double period, double frequency)
    {
        switch (waveform)
        {
            case SineWaveform:
                return new WaveformShape(1, "SR/(2π·Vp), the sine formula");
            case TriangleWaveform:
                return new WaveformShape(2 / Math.PI, "SR/(4·Vp), from the triangle's steepest slope 4·Vp·f");
            case PulseWaveform:
                return null;
            case SumWaveform sum when sum.Terms.Any(t => t is PulseWaveform):
                return null;
        }

        var (steepest, low, high, mean) = Sample(waveform, period);
        double excursion = Math.Max(high - mean, mean - low);
        return excursion > 0 && steepest > 0
            ? new WaveformShape(steepest / (2 * Math.PI * frequency * excursion), "f·SR / steepest slope of the waveform")
            : null;
    }

    /// <summary>
    /// The steepest slope of one period of a waveform, V/s, and its peak-to-peak span, V: for a square, its span over
    /// its faster edge time; otherwise sampled.
    /// </summary>
    public static (double Slope, double Span) Steepest(Waveform waveform, double period)
    {
        if (waveform is PulseWaveform pulse)
        {
            return (Math.Abs(pulse.High - pulse.Low) / Math.Min(pulse.RiseTime, pulse.FallTime), Math.Abs(pulse.High - pulse.Low));
        }

        var (steepest, low, high, _) = Sample(waveform, period);
        return (steepest, high - low);
    }

    private static (double Steepest, double Low, double High, double Mean) Sample(Waveform waveform, double period)
    {
        double low = double.PositiveInfinity, high = double.NegativeInfinity, steepest = 0, area = 0;
        double dt = period / Samples, previous = waveform.ValueAt(0);
        for (int i = 1; i <= Samples; i++)
        {
            double v = waveform.ValueAt(i * dt);
            steepest = Math.Max(steepest, Math.Abs(v - previous) / dt);
            area += 0.5 * (v + previous) * dt;
            low = Math.Min(low, v);
            high = Math.Max(high, v);
            previous = v;
        }

        return (steepest, low, high, area / period);
    }
}
