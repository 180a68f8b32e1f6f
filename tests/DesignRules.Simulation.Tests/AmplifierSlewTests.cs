namespace DesignRules.Simulation.Tests;

public sealed class AmplifierSlewTests
{
    private static TransientResult FollowerStep(AmplifierModel model, double low, double high, double stop)
    {
        var step = new PulseWaveform(low, high, 2 * stop, 0.5, 1e-9, 1e-9, Delay: 1e-6);
        var circuit = Stages.NonInverting(step, model, 0, 0);
        var result = Simulate.Transient(circuit, new TransientOptions { StopTime = stop, MaxStep = 10e-9 });
        Assert.True(result.Succeeded, result.Failure?.ToString());
        return result;
    }

    private static double Slope(TransientResult result, double from, double to, bool rising)
    {
        var v = result.Voltage("out");
        double t1 = Stages.Crossing(result.Time, v, from, 0, rising), t2 = Stages.Crossing(result.Time, v, to, 0, rising);
        return Math.Abs(to - from) / (t2 - t1);
    }

    [Fact]
    public void A_large_step_ramps_at_the_slew_rate()
    {
        var result = FollowerStep(Stages.GeneralPurpose, -6.5, 6.5, 4e-6);

        // model definition: slew rate 8 V/µs; measured from 10 % to 60 % of the step, where the input stage is saturated.
        Assert.InRange(Slope(result, -5.2, 1.3, rising: true), 0.98 * 8e6, 1.02 * 8e6);

        // common practice: a 13 V swing at 8 V/µs takes about 13/8 = 1.6 µs (plus a short small-signal tail).
        double settle = Stages.Crossing(result.Time, result.Voltage("out"), 6.4) - 1e-6;
        Assert.InRange(settle, 1.6e-6, 2.2e-6);
        var stress = AmplifierStress.Measure(result, "u1");
        Assert.InRange(stress.PeakSlewDemand, 0.98 * 8e6, 1.02 * 8e6);
        Assert.InRange(stress.TimeSlewLimited, 1.1e-6, 1.7e-6);
    }

    [Fact]
    public void Rising_and_falling_slew_rates_are_honoured_separately()
    {
        var model = Stages.GeneralPurpose with { SlewRateRising = 10e6, SlewRateFalling = 4e6 };
        var step = new PulseWaveform(-5, 5, 10e-6, 0.5, 1e-9, 1e-9, Delay: 1e-6);
        var result = Simulate.Transient(Stages.NonInverting(step, model, 0, 0), new TransientOptions { StopTime = 11e-6, MaxStep = 10e-9 });
        Assert.True(result.Succeeded, result.Failure?.ToString());

        // model definition: 10 V/µs rising, 4 V/µs falling.
        Assert.InRange(Slope(result, -4, 1, rising: true), 0.98 * 10e6, 1.02 * 10e6);
        Assert.InRange(Slope(result, 4, -1, rising: false), 0.98 * 4e6, 1.02 * 4e6);
    }

    [Fact]
    public void A_sine_above_the_full_power_bandwidth_distorts_toward_a_triangle_with_slope_equal_to_the_slew_rate()
    {
        // textbook: full-power bandwidth = SR/(2π·Vp) = 1 V/µs / (2π · 10 V) ≈ 15.9 kHz.
        var model = AmplifierModel.SinglePole(1e6, 1e5, 1e6);
        double fpbw = 1e6 / (2 * Math.PI * 10);
        double Thd(double f, out AmplifierStress stress)
        {
            var circuit = Stages.NonInverting(new SineWaveform(10, f), model, 0, 0);
            var result = Simulate.Transient(circuit, new TransientOptions { StopTime = 6 / f, MaxStep = 1 / (f * 400) });
            Assert.True(result.Succeeded, result.Failure?.ToString());
            stress = AmplifierStress.Measure(result, "u1", 2 / f);
            return Distortion.Measure(result.Time, result.Voltage("out"), f, from: 2 / f).TotalHarmonicDistortion;
        }

        double below = Thd(0.5 * fpbw, out var calm);
        double above = Thd(3 * fpbw, out var slewing);
        Assert.True(below < 0.005, $"THD below FPBW {below}");
        Assert.True(above > 0.05, $"THD above FPBW {above}");
        Assert.Equal(0, calm.TimeSlewLimited);
        Assert.InRange(slewing.PeakSlewDemand, 0.98e6, 1.02e6);

        // textbook: a triangle wave has THD = √(π⁴/96 − 1) ≈ 12.1 %; a fully slewing output approaches it.
        Assert.InRange(above, 0.05, 0.13);
    }
}
