namespace DesignRules.Simulation.Waveforms;

/// <summary>The sum of several waveforms (for example a sine riding on a slow ramp, or two tones).</summary>
/// <param name="Terms">Waveforms added together (at least one).</param>
public sealed record SumWaveform(IReadOnlyList<Waveform> Terms) : Waveform
{
    /// <inheritdoc />
    public override double ValueAt(double time)
    {
        double sum = 0;
        foreach (var term in Terms) sum += term.ValueAt(time);
        return sum;
    }

    /// <inheritdoc />
    public override double DcValue
    {
        get
        {
            double sum = 0;
            foreach (var term in Terms) sum += term.DcValue;
            return sum;
        }
    }

    internal override void CollectBreakpoints(double start, double stop, List<double> into, int limit)
    {
        foreach (var term in Terms) term.CollectBreakpoints(start, stop, into, limit);
    }

    internal override string? Validate()
    {
        if (Terms is null || Terms.Count == 0) return "a sum waveform needs at least one term";
        foreach (var term in Terms)
        {
            if (term is null) return "a sum waveform term is missing";
            if (term.Validate() is { } problem) return problem;
        }

        return null;
    }
}
