using DesignRules.Loading;
using DesignRules.Model;

namespace DesignRules.Tests.Loading;

/// <summary>The noise requirements a stage may state: <c>snr</c> in dB, <c>noise</c> at the output or referred to the input, <c>noise-band</c>.</summary>
public sealed class NoiseRequirementTests
{
    private static Requirements? Read(string requires, out LoadResult result)
    {
        result = new DesignLoader().LoadText("noise-probe.yaml", $$"""
            design:
              id: noise-probe
            supplies: { positive: 15 V, negative: -15 V }
            source: { waveform: sine, amplitude: 10 mV, frequency: 1 kHz }
            load: { resistance: 10k }
            stages:
              - id: amp
                block: inverting
                amplifier: jfet-input-15v
                values: { rin: 10k, rf: 100k }
                requires: {{requires}}
            """);
        // A design with an error is not returned: only its diagnostics are.
        return result.Designs.SingleOrDefault()?.Stages[0].Requirements;
    }

    [Fact]
    public void A_signal_to_noise_ratio_in_decibels_is_an_amplitude_ratio()
    {
        var r = Read("{ snr: 60 dB }", out var result);
        Assert.Empty(result.Diagnostics);

        // 60 dB as a voltage ratio is 10^(60/20) = 1000 (definition of the decibel for amplitudes).
        Assert.Equal(1000, r!.SignalToNoise!.Value.Value, 1e-9);
    }

    [Fact]
    public void A_bare_noise_voltage_is_at_the_output_and_the_long_form_names_where()
    {
        var output = Read("{ noise: 40 uV }", out var first);
        var input = Read("{ noise: { rms: 2 uV, at: input }, noise-band: 20 Hz..20 kHz }", out var second);
        Assert.Empty(first.Diagnostics);
        Assert.Empty(second.Diagnostics);
        Assert.Equal((40e-6, NoiseReference.Output), (output!.Noise!.Rms.Value.Value, output.Noise.At.Value));
        Assert.Equal((2e-6, NoiseReference.Input), (input!.Noise!.Rms.Value.Value, input.Noise.At.Value));
        Assert.Equal((20.0, 20e3), (input.NoiseBand!.Value.Low.Value, input.NoiseBand.Value.High.Value));
    }

    [Theory]
    [InlineData("{ noise: { rms: 2 uV, at: sensor } }", "DR914")]
    [InlineData("{ noise: { at: input } }", "DR902")]
    [InlineData("{ snr: 60 V }", "DR903")]
    [InlineData("{ snr: -10 dB }", "DR905")]
    [InlineData("{ noise: -5 uV }", "DR905")]
    [InlineData("{ noise-band: 0 Hz..20 kHz }", "DR905")]
    public void A_malformed_noise_requirement_is_a_located_diagnostic(string requires, string id)
    {
        Assert.Null(Read(requires, out var result));
        var diagnostic = Assert.Single(result.Diagnostics);
        Assert.Equal(id, diagnostic.Id);
        Assert.Equal(11, diagnostic.Span.Line);
    }
}
