using System.Numerics;

namespace DesignRules.Simulation.Tests;

/// <summary>The AC request names the one source that carries the small-signal stimulus and its amplitude.</summary>
public sealed class AcStimulusTests
{
    // Two sources feeding one node through equal resistors: each alone sees a divider of 1/2 to the node
    // (voltage divider and superposition, any circuits textbook).
    private static Circuit TwoSourcesIntoOneNode() => new Circuit()
        .AddVoltageSource("va", "a", Circuit.Ground, new SineWaveform(1, 1e3))
        .AddVoltageSource("vb", "b", Circuit.Ground, new SineWaveform(3, 1e3))
        .AddResistor("ra", "a", "mid", 1e3)
        .AddResistor("rb", "b", "mid", 1e3);

    [Fact]
    public void Only_the_requested_source_drives_the_sweep_whatever_the_other_sources_waveforms()
    {
        var fromA = Simulate.AcSweep(TwoSourcesIntoOneNode(), AcSweep.List("va", 1e3) with { Amplitude = 2 });
        Assert.True(fromA.Succeeded, fromA.Failure?.ToString());
        Assert.Equal(1.0, fromA.Voltage("mid")[0].Real, 12);
        Assert.Equal(0.0, fromA.Voltage("b")[0].Magnitude, 12);

        var fromB = Simulate.AcSweep(TwoSourcesIntoOneNode(), AcSweep.List("vb", 1e3));
        Assert.Equal(0.5, fromB.Voltage("mid")[0].Real, 12);
        Assert.Equal(Complex.Zero, fromB.Voltage("a")[0]);
    }

    [Fact]
    public void A_current_source_stimulus_of_1_mA_into_1_kilohm_gives_1_V()
    {
        // Ohm's law.
        var circuit = new Circuit().AddCurrentSource("i1", Circuit.Ground, "x", 0).AddResistor("r1", "x", Circuit.Ground, 1e3);
        var ac = Simulate.AcSweep(circuit, AcSweep.List("i1", 10) with { Amplitude = 1e-3 });
        Assert.Equal(1.0, ac.Voltage("x")[0].Real, 12);
    }
}
