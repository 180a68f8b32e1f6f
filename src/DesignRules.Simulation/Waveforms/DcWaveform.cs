namespace DesignRules.Simulation.Waveforms;

/// <summary>A constant value.</summary>
/// <param name="Value">The constant, in V or A.</param>
public sealed record DcWaveform(double Value) : Waveform
{
    /// <inheritdoc />
    public override double ValueAt(double time) => Value;

    internal override void CollectBreakpoints(double start, double stop, List<double> into, int limit)
    {
    }

    internal override string? Validate() => IsFinite(Value) ? null : "DC value must be finite";
}
