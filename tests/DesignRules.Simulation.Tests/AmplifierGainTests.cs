namespace DesignRules.Simulation.Tests;

public sealed class AmplifierGainTests
{
    [Fact]
    public void Open_loop_response_has_the_DC_gain_and_the_dominant_pole_at_GBW_over_A0()
    {
        var model = Stages.GeneralPurpose;
        var circuit = new Circuit()
            .AddVoltageSource("vin", "in", Circuit.Ground, new DcWaveform(0))
            .AddAmplifier("u1", "in", Circuit.Ground, "out", model, Stages.Rails)
            .AddResistor("load", "out", Circuit.Ground, 1e9);
        var ac = Simulate.AcSweep(circuit, AcSweep.Decades("vin", 0.01, 1e7, 20));
        Assert.True(ac.Succeeded, ac.Failure?.ToString());

        // textbook single-pole op-amp: A(f) = A0/(1 + j·f/fp), fp = GBW/A0 = 10 Hz; |A(GBW)| ≈ 1.
        Assert.Equal(1e5, FrequencyResponse.At(ac, "out", null, 0.01).Gain, 1e5 * 1e-3);
        double pole = FrequencyResponse.Bandwidth(ac, "out")!.Value;
        Assert.Equal(10, pole, 10 * 0.01);
        var unity = FrequencyResponse.At(ac, "out", null, 1e6);
        Assert.Equal(1, unity.Gain, 0.01);
        Assert.Equal(-90, unity.PhaseDegrees, 1);
    }

    [Theory]
    [InlineData(9e3, 1e3, 10)]
    [InlineData(0, 1, 1)]
    public void Non_inverting_closed_loop_bandwidth_is_GBW_over_noise_gain_in_AC(double rf, double rg, double noiseGain)
    {
        var circuit = Stages.NonInverting(new DcWaveform(0), Stages.GeneralPurpose, rf, rg);
        var ac = Simulate.AcSweep(circuit, AcSweep.Decades("vin", 10, 1e7, 50));
        Assert.True(ac.Succeeded, ac.Failure?.ToString());

        // textbook: closed-loop −3 dB bandwidth of a single-pole op-amp = GBW / noise gain.
        double expected = 1e6 / noiseGain;
        Assert.InRange(FrequencyResponse.Bandwidth(ac, "out", "in")!.Value, 0.95 * expected, 1.05 * expected);
    }

    [Fact]
    public void Inverting_closed_loop_bandwidth_uses_the_noise_gain_not_the_signal_gain()
    {
        var circuit = Stages.Inverting(new DcWaveform(0), Stages.GeneralPurpose, 10e3, 10e3);
        var ac = Simulate.AcSweep(circuit, AcSweep.Decades("vin", 10, 1e7, 50));
        Assert.True(ac.Succeeded, ac.Failure?.ToString());

        // textbook: inverting gain −1 has noise gain 1 + Rf/Rin = 2, so f−3dB = GBW/2.
        Assert.Equal(1, FrequencyResponse.At(ac, "out", "in", 10).Gain, 1e-3);
        Assert.InRange(FrequencyResponse.Bandwidth(ac, "out", "in")!.Value, 0.95 * 5e5, 1.05 * 5e5);
    }

    [Fact]
    public void Small_signal_step_rise_time_is_0_35_over_the_closed_loop_bandwidth()
    {
        var step = new PiecewiseLinearWaveform([new(0, 0), new(1e-6, 0), new(1.001e-6, 1e-3)]);
        var circuit = Stages.NonInverting(step, Stages.GeneralPurpose, 9e3, 1e3);
        var result = Simulate.Transient(circuit, new TransientOptions { StopTime = 20e-6, MaxStep = 20e-9 });
        Assert.True(result.Succeeded, result.Failure?.ToString());
        var v = result.Voltage("out");
        double final = v[^1];

        // textbook: first-order step response, 10–90 % rise time = ln 9 · τ ≈ 0.35 / f−3dB, f−3dB = GBW/10 = 100 kHz.
        double rise = Stages.Crossing(result.Time, v, 0.9 * final) - Stages.Crossing(result.Time, v, 0.1 * final);
        Assert.InRange(rise, 0.95 * 0.35 / 1e5, 1.05 * 0.35 / 1e5);
        Assert.Equal(1e-2, final, 1e-2 * 2e-3);
    }

    [Fact]
    public void Sine_amplitude_at_the_closed_loop_bandwidth_is_down_3_dB_in_transient()
    {
        var circuit = Stages.NonInverting(new SineWaveform(1e-3, 1e5), Stages.GeneralPurpose, 9e3, 1e3);
        var result = Simulate.Transient(circuit, new TransientOptions { StopTime = 10e-5, MaxStep = 1e-5 / 200 });
        Assert.True(result.Succeeded, result.Failure?.ToString());

        // textbook: |H(f−3dB)| = G/√2 with f−3dB = GBW / noise gain = 100 kHz.
        var (amplitude, _) = SignalMath.FitSine(result.Time, result.Voltage("out"), 1e5, 9e-5);
        Assert.InRange(amplitude, 0.95 * 10e-3 / Math.Sqrt(2), 1.05 * 10e-3 / Math.Sqrt(2));
    }

    [Fact]
    public void Closed_loop_gain_error_is_noise_gain_over_open_loop_gain()
    {
        var model = AmplifierModel.SinglePole(1e6, 1e4, 8e6);
        var op = Simulate.OperatingPoint(Stages.NonInverting(new DcWaveform(0.1), model, 99e3, 1e3));
        Assert.True(op.Succeeded, op.Failure?.ToString());

        // textbook: G = G_ideal/(1 + NG/A0) so the relative error ≈ NG/A0 = 100/1e4 = 1 %.
        double error = 1 - (op.Voltage("out") / (0.1 * 100));
        Assert.InRange(error, 0.98 * (100.0 / 10100), 1.02 * (100.0 / 10100));
    }
}
