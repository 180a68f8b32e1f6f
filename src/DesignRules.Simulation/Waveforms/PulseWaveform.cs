namespace DesignRules.Simulation.Waveforms;

/// <summary>
/// A periodic pulse (square wave when the duty cycle is one half) with finite linear edges. Each period starts at
/// Delay + k·Period with the rising edge (Low → High over <paramref name="RiseTime"/>); the falling edge starts
/// <paramref name="DutyCycle"/>·Period after the start of the rising edge and lasts <paramref name="FallTime"/>.
/// Before Delay the value is Low.
/// </summary>
/// <param name="Low">Low level.</param>
/// <param name="High">High level.</param>
/// <param name="Period">Period in s.</param>
/// <param name="DutyCycle">Fraction of the period from the start of the rise to the start of the fall (0..1).</param>
/// <param name="RiseTime">Rise time in s (positive; edges are never ideal steps).</param>
/// <param name="FallTime">Fall time in s (positive).</param>
/// <param name="Delay">Start delay in s.</param>
public sealed record PulseWaveform(double Low, double High, double Period, double DutyCycle, double RiseTime, double FallTime, double Delay = 0) : Waveform
{
    /// <summary>A symmetric square wave Offset ± Amplitude at <paramref name="frequency"/> with equal edge times.</summary>
    /// <param name="amplitude">Half the peak-to-peak swing.</param>
    /// <param name="frequency">Frequency in Hz.</param>
    /// <param name="edgeTime">Rise and fall time in s.</param>
    /// <param name="offset">Centre level.</param>
    public static PulseWaveform Square(double amplitude, double frequency, double edgeTime, double offset = 0) =>
        new(offset - amplitude, offset + amplitude, 1 / frequency, 0.5, edgeTime, edgeTime);

    /// <inheritdoc />
    public override double ValueAt(double time)
    {
        if (time <= Delay) return Low;
        double local = (time - Delay) % Period;
        double highStart = DutyCycle * Period;
        if (local < RiseTime) return Low + ((High - Low) * local / RiseTime);
        if (local < highStart) return High;
        if (local < highStart + FallTime) return High - ((High - Low) * (local - highStart) / FallTime);
        return Low;
    }

    internal override void CollectBreakpoints(double start, double stop, List<double> into, int limit)
    {
        double highStart = DutyCycle * Period;
        CollectPeriodic(start, stop, Delay, Period, [0, RiseTime, highStart, highStart + FallTime], into, limit);
    }

    internal override string? Validate()
    {
        if (!IsFinite(Low) || !IsFinite(High)) return "pulse levels must be finite";
        if (!(Period > 0) || !IsFinite(Period)) return "pulse period must be positive";
        if (!(RiseTime > 0) || !(FallTime > 0)) return "pulse rise and fall times must be positive";
        if (!(DutyCycle > 0) || !(DutyCycle < 1)) return "pulse duty cycle must lie strictly between 0 and 1";
        if (DutyCycle * Period < RiseTime || (DutyCycle * Period) + FallTime > Period) return "pulse edges do not fit in the period at this duty cycle";
        if (!(Delay >= 0) || !IsFinite(Delay)) return "pulse delay must be zero or positive";
        return null;
    }
}
