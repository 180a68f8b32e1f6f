namespace DesignRules.Simulation.Tests;

public sealed class AmplifierLimitTests
{
    private static readonly AmplifierModel Model = Stages.GeneralPurpose with
    {
        SwingHeadroomPositive = 1.5,
        SwingHeadroomNegative = 1.0,
        OutputResistance = 1,
    };

    [Fact]
    public void Output_saturates_at_each_rail_minus_its_headroom()
    {
        var high = Simulate.OperatingPoint(Stages.Inverting(new DcWaveform(-2), Model, 100e3, 10e3));
        var low = Simulate.OperatingPoint(Stages.Inverting(new DcWaveform(2), Model, 100e3, 10e3));

        // model definition: output limited to [Vneg + 1.0, Vpos − 1.5] = [−14, 13.5] V (within the 1 mV clamp width and the I·Rout drop).
        Assert.Equal(13.5, high.Voltage("out"), 0.003);
        Assert.Equal(-14.0, low.Voltage("out"), 0.003);
        Assert.True(high.Amplifier("u1").AtSwingLimit);
        Assert.True(low.Amplifier("u1").AtSwingLimit);
        Assert.False(Simulate.OperatingPoint(Stages.Inverting(new DcWaveform(1), Model, 10e3, 10e3)).Amplifier("u1").AtSwingLimit);
    }

    [Fact]
    public void Output_resistance_divides_with_the_load()
    {
        var model = Stages.GeneralPurpose with { OutputResistance = 75 };
        var circuit = new Circuit()
            .AddAmplifier("u1", Circuit.Ground, Circuit.Ground, "out", model, Stages.Rails)
            .AddVoltageSource("vt", "t", Circuit.Ground, 1)
            .AddResistor("rl", "t", "out", 925);
        var op = Simulate.OperatingPoint(circuit);
        Assert.True(op.Succeeded, op.Failure?.ToString());

        // textbook divider: inputs shorted so the internal source is 0 V; v(out) = 1 V · 75/(75 + 925).
        Assert.Equal(0.075, op.Voltage("out"), 1e-6);
        Assert.Equal(-0.075 / 75, op.Current("u1"), 1e-9);
    }

    [Fact]
    public void Output_current_is_limited_into_a_heavy_load()
    {
        var model = Stages.GeneralPurpose with { OutputCurrentLimit = 20e-3 };
        var circuit = Stages.NonInverting(new DcWaveform(5), model, 0, 0).AddResistor("load", "out", Circuit.Ground, 100);
        var op = Simulate.OperatingPoint(circuit);
        Assert.True(op.Succeeded, op.Failure?.ToString());

        // model definition: |i| ≤ 20 mA, so the 100 Ω load sees at most 2 V instead of 5 V.
        Assert.InRange(op.Current("u1"), 0.99 * 20e-3, 20e-3);
        Assert.InRange(op.Voltage("out"), 1.98, 2.0);
        Assert.True(op.Amplifier("u1").CurrentLimited);
    }

    [Fact]
    public void Input_offset_appears_at_the_output_times_the_noise_gain()
    {
        var model = Stages.GeneralPurpose with { InputOffsetVoltage = 1e-3 };
        var op = Simulate.OperatingPoint(Stages.NonInverting(new DcWaveform(0), model, 99e3, 1e3));

        // textbook: output offset = Vos·(1 + Rf/Rin) = 1 mV · 100 = 100 mV (less a 0.1 % loop-gain error).
        Assert.Equal(0.1, op.Voltage("out"), 0.1 * 2e-3);
    }

    [Fact]
    public void Bias_current_into_the_inverting_input_shifts_the_output_by_Ib_times_Rf()
    {
        var model = Stages.GeneralPurpose with { InputBiasCurrentInverting = 100e-9, InputBiasCurrentNonInverting = 100e-9 };
        var op = Simulate.OperatingPoint(Stages.Inverting(new DcWaveform(0), model, 1e6, 1e6));

        // textbook: with the non-inverting input grounded, output shift = Ib·Rf = 100 nA · 1 MΩ = 0.1 V.
        Assert.Equal(0.1, op.Voltage("out"), 0.1 * 2e-3);
    }

    [Fact]
    public void Common_mode_and_differential_input_are_flagged()
    {
        var model = Stages.GeneralPurpose with { CommonModeHeadroomPositive = 2, MaxDifferentialInput = 0.5 };
        var circuit = Stages.NonInverting(new SineWaveform(14, 1e3), model, 0, 0);
        var result = Simulate.Transient(circuit, new TransientOptions { StopTime = 1e-3, MaxStep = 1e-6 });
        Assert.True(result.Succeeded, result.Failure?.ToString());
        var stress = AmplifierStress.Measure(result, "u1");

        // model definition: inputs above 15 − 2 = 13 V are outside the range: sin θ > 13/14 for about 24 % of a period.
        double expected = (Math.PI - (2 * Math.Asin(13.0 / 14))) / (2 * Math.PI) * 1e-3;
        Assert.InRange(stress.TimeOutsideCommonModeRange, 0.95 * expected, 1.05 * expected);
        Assert.False(stress.DifferentialInputExceeded);
    }
}
