using DesignRules.Simulation;

namespace DesignRules.Elaboration.Tests;

/// <summary>
/// Rectified sine averages at low frequency: a half-wave rectified sine of peak Vp averages Vp/π and a full-wave one
/// 2·Vp/π (handbook values for rectified sine averages: (1/T)∫|Vp·sin| over the conducting half-cycles).
/// </summary>
public sealed class RectifiedAverageTests
{
    private const double Peak = 5;

    [Fact]
    public void Two_diode_half_wave_output_averages_minus_vp_over_pi()
    {
        // This library's two-diode form passes the positive half-cycle inverted, so its average is −Vp/π.
        double mean = MeanOutput("{ id: rect, block: half-wave-inverting, amplifier: jfet-input-15v, diode: silicon-small-signal, values: { rin: 10k, rf: 10k } }");
        AssertWithin(-Peak / Math.PI, mean, 0.01);
    }

    [Fact]
    public void Follower_half_wave_output_averages_vp_over_pi()
    {
        double mean = MeanOutput("{ id: rect, block: half-wave-follower, amplifier: jfet-input-15v, diode: silicon-small-signal, values: { rload: 10k } }");
        AssertWithin(Peak / Math.PI, mean, 0.01);
    }

    [Fact]
    public void Absolute_value_output_averages_two_vp_over_pi()
    {
        double mean = MeanOutput("{ id: rect, block: absolute-value, amplifier: jfet-input-15v, diode: silicon-small-signal, values: { r1: 10k, r2: 10k, r3: 10k, r4: 5k, r5: 10k } }");
        AssertWithin(2 * Peak / Math.PI, mean, 0.01);
    }

    private static double MeanOutput(string stage)
    {
        var design = TestDesigns.Load($$"""
            design:
              id: average
            supplies: { positive: 15 V, negative: -15 V }
            source: { waveform: sine, amplitude: {{Peak}} V, frequency: 100 Hz }
            load: { resistance: 100k }
            stages:
              - {{stage}}
            """);
        var chain = TestDesigns.Elaborate(design);
        var result = Simulate.Transient(chain.Circuit, chain.Window.ToOptions());
        Assert.True(result.Succeeded, result.Failure?.ToString());
        return Waveforms.Mean(result.Time, result.Voltage(chain.OutputNode), chain.Window.MeasureFrom, chain.Window.StopTime);
    }

    private static void AssertWithin(double expected, double actual, double relative) =>
        Assert.True(Math.Abs(actual - expected) <= relative * Math.Abs(expected), $"mean {actual} vs {expected}");
}
