namespace DesignRules.Simulation.Tests;

public sealed class WaveformTests
{
    [Fact]
    public void Pulse_has_linear_edges_duty_cycle_and_breakpoints_at_every_corner()
    {
        var pulse = new PulseWaveform(0, 5, 10e-6, 0.3, 1e-6, 2e-6, Delay: 1e-6);
        Assert.Equal(0, pulse.ValueAt(0.5e-6));
        Assert.Equal(2.5, pulse.ValueAt(1.5e-6), 1e-9);
        Assert.Equal(5, pulse.ValueAt(3e-6));
        Assert.Equal(2.5, pulse.ValueAt(5e-6), 1e-9);
        Assert.Equal(0, pulse.ValueAt(7e-6));
        Assert.Equal([1e-6, 2e-6, 4e-6, 6e-6, 11e-6, 12e-6], pulse.Breakpoints(0, 12.5e-6).Select(b => Math.Round(b, 12)));
        Assert.Null(pulse.Validate());
        Assert.NotNull((pulse with { DutyCycle = 0.95 }).Validate());
    }

    [Fact]
    public void Triangle_peaks_at_quarter_periods_and_lists_them_as_breakpoints()
    {
        var triangle = new TriangleWaveform(2, 1e3, Offset: 1);
        Assert.Equal(1, triangle.ValueAt(0), 1e-12);
        Assert.Equal(3, triangle.ValueAt(0.25e-3), 1e-12);
        Assert.Equal(-1, triangle.ValueAt(0.75e-3), 1e-12);
        Assert.Equal([0.25e-3, 0.75e-3, 1.25e-3], triangle.Breakpoints(0, 1.5e-3).Select(b => Math.Round(b, 12)));
        Assert.Equal(1, triangle.DcValue);
    }

    [Fact]
    public void Piecewise_linear_interpolates_and_holds_its_ends()
    {
        var pwl = new PiecewiseLinearWaveform([new(1, 0), new(2, 10), new(4, 0)]);
        Assert.Equal(0, pwl.ValueAt(0));
        Assert.Equal(5, pwl.ValueAt(1.5));
        Assert.Equal(5, pwl.ValueAt(3));
        Assert.Equal(0, pwl.ValueAt(9));
        Assert.NotNull(new PiecewiseLinearWaveform([new(1, 0), new(1, 1)]).Validate());
    }

    [Fact]
    public void Sine_with_delay_holds_then_starts_at_its_phase()
    {
        var sine = new SineWaveform(1, 1e3, Offset: 0.5, Phase: Math.PI / 2, Delay: 1e-3);
        Assert.Equal(1.5, sine.ValueAt(0), 1e-12);
        Assert.Equal(-0.5, sine.ValueAt(1.5e-3), 1e-12);
        Assert.Equal(0.5, sine.DcValue);
        Assert.Equal([1e-3], sine.Breakpoints(0, 1));
    }

    [Fact]
    public void Sum_adds_values_and_merges_breakpoints()
    {
        var sum = new SumWaveform([new DcWaveform(1), PulseWaveform.Square(1, 1e3, 1e-6)]);
        Assert.Equal(2, sum.ValueAt(0.25e-3), 1e-12);
        Assert.Equal(0, sum.ValueAt(0.75e-3), 1e-12);
        Assert.Equal(4, sum.Breakpoints(0, 0.9e-3).Count);
    }
}
