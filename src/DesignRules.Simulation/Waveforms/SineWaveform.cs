namespace DesignRules.Simulation.Waveforms;

/// <summary>
/// A sine: v(t) = Offset + Amplitude·sin(2π·Frequency·(t − Delay) + Phase) for t ≥ Delay, and the value at
/// t = Delay before it.
/// </summary>
/// <param name="Amplitude">Peak amplitude, in V or A.</param>
/// <param name="Frequency">Frequency in Hz (positive).</param>
/// <param name="Offset">DC offset, in V or A.</param>
/// <param name="Phase">Phase at t = Delay, in radians.</param>
/// <param name="Delay">Start delay in s.</param>
public sealed record SineWaveform(double Amplitude, double Frequency, double Offset = 0, double Phase = 0, double Delay = 0) : Waveform
{
    /// <inheritdoc />
    public override double ValueAt(double time)
    {
        double t = Math.Max(time - Delay, 0);
        return Offset + (Amplitude * Math.Sin((2 * Math.PI * Frequency * t) + Phase));
    }

    /// <inheritdoc />
    public override double DcValue => Offset;

    internal override void CollectBreakpoints(double start, double stop, List<double> into, int limit)
    {
        if (Delay > 0 && Delay >= start && Delay <= stop && into.Count < limit) into.Add(Delay);
    }

    internal override string? Validate()
    {
        if (!IsFinite(Amplitude) || !IsFinite(Offset) || !IsFinite(Phase)) return "sine amplitude, offset and phase must be finite";
        if (!(Frequency > 0) || !IsFinite(Frequency)) return "sine frequency must be positive";
        if (!(Delay >= 0) || !IsFinite(Delay)) return "sine delay must be zero or positive";
        return null;
    }
}
