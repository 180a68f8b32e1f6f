namespace DesignRules.Simulation.Tests;

public sealed class SweepAndInductorTests
{
    [Fact]
    public void DC_sweep_of_an_inverting_stage_is_linear_then_clips_at_the_swing_limits()
    {
        var model = Stages.GeneralPurpose with { SwingHeadroomPositive = 1, SwingHeadroomNegative = 1, OutputResistance = 1 };
        var values = Enumerable.Range(0, 101).Select(i => -3 + (0.06 * i)).ToArray();
        var sweep = Simulate.DcSweep(Stages.Inverting(new DcWaveform(0), model, 10e3, 1e3), "vin", values);
        Assert.True(sweep.Succeeded, sweep.Failure?.ToString());
        var vout = sweep.Voltage("out");
        Assert.Equal(101, vout.Length);

        // textbook: vout = −(Rf/Rin)·vin = −10·vin inside the swing range [−14, 14] V.
        Assert.Equal(-10 * values[50], vout[50], 1e-3);
        Assert.Equal(-10 * values[60], vout[60], 1e-2);
        Assert.Equal(14, vout[0], 0.01);
        Assert.Equal(-14, vout[^1], 0.01);
        Assert.Equal(values[60] / 1e3, -sweep.Current("vin")[60], 1e-7);
    }

    [Fact]
    public void RL_step_current_rises_with_time_constant_L_over_R()
    {
        const double r = 100, l = 10e-3, tau = l / r;
        var circuit = new Circuit()
            .AddVoltageSource("v1", "in", Circuit.Ground, new PiecewiseLinearWaveform([new(0, 0), new(1e-9, 1)]))
            .AddResistor("r1", "in", "a", r)
            .AddInductor("l1", "a", Circuit.Ground, l);
        var result = Simulate.Transient(circuit, new TransientOptions { StopTime = 5 * tau, MaxStep = tau / 50 });
        Assert.True(result.Succeeded, result.Failure?.ToString());
        var current = result.Current("l1");

        // textbook: i(t) = (V/R)(1 − e^(−t/τ)), τ = L/R.
        for (int i = 0; i < current.Length; i++)
        {
            double t = result.Time[i];
            if (t < 0.1 * tau) continue;
            double exact = (1 - Math.Exp(-t / tau)) / r;
            Assert.True(Math.Abs(current[i] - exact) < 1e-3 * exact, $"t = {t}: {current[i]} vs {exact}");
        }
    }

    [Fact]
    public void Ideal_controlled_source_buffers_a_divider_without_loading_it()
    {
        var circuit = new Circuit()
            .AddVoltageSource("v1", "in", Circuit.Ground, 10)
            .AddResistor("r1", "in", "mid", 1e3)
            .AddResistor("r2", "mid", Circuit.Ground, 1e3)
            .AddVoltageControlledVoltageSource("e1", "out", Circuit.Ground, "mid", Circuit.Ground, 2)
            .AddResistor("load", "out", Circuit.Ground, 10);
        var op = Simulate.OperatingPoint(circuit);
        Assert.Equal(10, op.Voltage("out"), 1e-9);
        Assert.Equal(-1, op.Current("e1"), 1e-9);
    }

    [Fact]
    public void Trapezoidal_integration_gives_the_same_RC_charge_curve()
    {
        var circuit = new Circuit()
            .AddVoltageSource("v1", "in", Circuit.Ground, new PiecewiseLinearWaveform([new(0, 0), new(1e-9, 1)]))
            .AddResistor("r1", "in", "out", 1e3)
            .AddCapacitor("c1", "out", Circuit.Ground, 1e-6);
        var result = Simulate.Transient(circuit, new TransientOptions { StopTime = 5e-3, MaxStep = 2e-5, Method = IntegrationMethod.Trapezoidal });
        Assert.True(result.Succeeded, result.Failure?.ToString());

        // textbook: v = 1 − e^(−t/RC).
        Assert.Equal(1 - Math.Exp(-5), result.Voltage("out")[^1], 1e-3);
    }
}
