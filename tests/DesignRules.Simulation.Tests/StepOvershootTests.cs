namespace DesignRules.Simulation.Tests;

/// <summary>Phase margin and step overshoot of a second-order loop against the textbook relations.</summary>
public sealed class StepOvershootTests
{
    // A follower whose amplifier has GBW fu and a second pole f2 has, with the dominant pole taken as an integrator, the
    // unity-feedback loop T(s) = ωn²/(s(s + 2ζωn)) with ωn² = ωu·ω2 and ζ = ½·√(f2/fu).
    // For that loop (Ogata, Modern Control Engineering, 5th ed., §5-3 and §7-7):
    //   overshoot Mp = exp(−ζπ/√(1 − ζ²)),  phase margin γ = atan(2ζ / √(√(1 + 4ζ⁴) − 2ζ²)).
    [Theory]
    [InlineData(0.3)]
    [InlineData(0.5)]
    [InlineData(0.7)]
    public void A_second_order_follower_overshoots_and_keeps_the_margin_the_damping_ratio_predicts(double zeta)
    {
        const double fu = 1e6;
        double f2 = 4 * zeta * zeta * fu;
        var model = AmplifierModel.SinglePole(fu, 1e7, 1e9) with { SecondPoleFrequency = f2, OutputResistance = 1e-3 };
        const double step = 1e-3; // small: every part of the amplifier stays linear
        var circuit = new Circuit()
            .AddVoltageSource("vin", "in", Circuit.Ground, new PiecewiseLinearWaveform([new(1e-6, 0), new(1.001e-6, step)]))
            .AddAmplifier("u1", "in", "out", "out", model, Stages.Rails)
            .AddResistor("rl", "out", Circuit.Ground, 1e9);

        double expectedOvershoot = Math.Exp(-zeta * Math.PI / Math.Sqrt(1 - (zeta * zeta)));
        double expectedMargin = Math.Atan(2 * zeta / Math.Sqrt(Math.Sqrt(1 + (4 * Math.Pow(zeta, 4))) - (2 * zeta * zeta))) * 180 / Math.PI;

        var loop = Simulate.LoopGain(circuit, LoopGainRequest.Decades(1, 1e9, 20)).Loop("u1")!.Margins;
        Assert.Equal(expectedMargin, loop.PhaseMargin!.Value, 0.05);

        var run = Simulate.Transient(circuit, new TransientOptions { StopTime = 1e-6 + (40 / (2 * Math.PI * Math.Sqrt(fu * f2) * zeta)), MaxStep = 1e-9 });
        Assert.True(run.Succeeded, run.Failure?.ToString());
        var response = StepResponse.Measure(run.Time, run.Voltage("out"), 1e-6, 0.01);
        Assert.Equal(step, response.Change, step * 1e-3);
        Assert.Equal(expectedOvershoot, response.Overshoot, 0.005);
        Assert.NotNull(response.SettlingTime);
    }

    [Fact]
    public void A_first_order_answer_has_no_overshoot_and_settles_in_about_4_6_time_constants_to_1_percent()
    {
        // An RC low-pass settles to within 1 % after τ·ln(100) ≈ 4.61 τ (exponential response, any circuits textbook).
        const double r = 1e3, c = 1e-6;
        var circuit = new Circuit()
            .AddVoltageSource("vin", "in", Circuit.Ground, new PiecewiseLinearWaveform([new(1e-3, 0), new(1e-3 + 1e-9, 1)]))
            .AddResistor("r", "in", "out", r)
            .AddCapacitor("c", "out", Circuit.Ground, c);
        var run = Simulate.Transient(circuit, new TransientOptions { StopTime = 1e-3 + (12 * r * c), MaxStep = r * c / 200 });
        var response = StepResponse.Measure(run.Time, run.Voltage("out"), 1e-3, 0.01);
        Assert.Equal(0, response.Overshoot, 1e-4);
        Assert.Equal(Math.Log(100) * r * c, response.SettlingTime!.Value, r * c * 0.02);
    }
}
