namespace DesignRules.Simulation.Waveforms;

/// <summary>
/// A symmetric triangle between Offset − Amplitude and Offset + Amplitude. Like a sine it starts at the offset,
/// rising, at t = Delay (with <paramref name="Phase"/> in radians advancing it as it would a sine), peaks a quarter
/// period later and reaches its minimum at three quarters. Before the delay it holds its starting value.
/// </summary>
/// <param name="Amplitude">Peak amplitude, in V or A.</param>
/// <param name="Frequency">Frequency in Hz (positive).</param>
/// <param name="Offset">DC offset.</param>
/// <param name="Phase">Phase in radians (2π is one period).</param>
/// <param name="Delay">Start delay in s.</param>
public sealed record TriangleWaveform(double Amplitude, double Frequency, double Offset = 0, double Phase = 0, double Delay = 0) : Waveform
{
    /// <inheritdoc />
    public override double ValueAt(double time)
    {
        double cycles = (Frequency * Math.Max(time - Delay, 0)) + (Phase / (2 * Math.PI));
        double u = cycles - Math.Floor(cycles);
        double shape = u < 0.25 ? 4 * u : u < 0.75 ? 2 - (4 * u) : (4 * u) - 4;
        return Offset + (Amplitude * shape);
    }

    /// <inheritdoc />
    public override double DcValue => Offset;

    internal override void CollectBreakpoints(double start, double stop, List<double> into, int limit)
    {
        double period = 1 / Frequency;
        double shift = (Phase / (2 * Math.PI)) - Math.Floor(Phase / (2 * Math.PI));
        double a = ((0.25 - shift + 1) % 1) * period;
        double b = ((0.75 - shift + 1) % 1) * period;
        CollectPeriodic(start, stop, Delay, period, [a, b], into, limit);
    }

    internal override string? Validate()
    {
        if (!IsFinite(Amplitude) || !IsFinite(Offset) || !IsFinite(Phase)) return "triangle amplitude, offset and phase must be finite";
        if (!(Frequency > 0) || !IsFinite(Frequency)) return "triangle frequency must be positive";
        if (!(Delay >= 0) || !IsFinite(Delay)) return "triangle delay must be zero or positive";
        return null;
    }
}
