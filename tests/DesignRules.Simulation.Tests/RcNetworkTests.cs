namespace DesignRules.Simulation.Tests;

public sealed class RcNetworkTests
{
    private const double R = 1e3, C = 1e-6, Tau = R * C;

    private static Circuit RcLowPass(Waveform drive) => new Circuit()
        .AddVoltageSource("vin", "in", Circuit.Ground, drive)
        .AddResistor("r1", "in", "out", R)
        .AddCapacitor("c1", "out", Circuit.Ground, C);

    [Fact]
    public void Step_response_follows_the_exponential_charge_curve()
    {
        const double rise = 1e-6;
        var drive = new PiecewiseLinearWaveform([new(0, 0), new(rise, 1)]);
        var result = Simulate.Transient(RcLowPass(drive), new TransientOptions { StopTime = 5 * Tau, MaxStep = Tau / 50 });
        Assert.True(result.Succeeded, result.Failure?.ToString());
        var v = result.Voltage("out");

        // textbook: RC driven by a ramp of duration Tr to 1 V: v = (t − τ(1 − e^(−t/τ)))/Tr while ramping,
        // then v = 1 − (τ/Tr)(e^(Tr/τ) − 1)e^(−t/τ) (which is V(1 − e^(−t/τ)) for Tr → 0).
        static double Exact(double t) => t < rise
            ? (t - (Tau * (1 - Math.Exp(-t / Tau)))) / rise
            : 1 - (Tau / rise * (Math.Exp(rise / Tau) - 1) * Math.Exp(-t / Tau));
        for (int i = 0; i < v.Length; i++)
        {
            double t = result.Time[i];
            if (t < 0.05 * Tau) continue;
            double exact = Exact(t);
            Assert.True(Math.Abs(v[i] - exact) <= 1e-3 * exact, $"t = {t}: {v[i]} vs {exact}");
        }

        Assert.Equal(1 - Math.Exp(-5), v[^1], 1e-3 * (1 - Math.Exp(-5)));
    }

    [Fact]
    public void Sine_steady_state_has_the_closed_form_amplitude_and_phase()
    {
        double f = 1 / (2 * Math.PI * Tau);
        double w = 2 * Math.PI * f;
        var result = Simulate.Transient(RcLowPass(new SineWaveform(1, f)), new TransientOptions { StopTime = 6 / f, MaxStep = 1 / (f * 200) });
        Assert.True(result.Succeeded, result.Failure?.ToString());
        var v = result.Voltage("out");

        // textbook: H(jω) = 1/(1 + jωRC): |H| = 1/√(1 + (ωRC)²), ∠H = −atan(ωRC); at ω = 1/RC: 0.70711, −45°.
        double gain = 1 / Math.Sqrt(1 + ((w * Tau) * (w * Tau)));
        double phase = -Math.Atan(w * Tau);
        var (amplitude, measuredPhase) = SignalMath.FitSine(result.Time, v, f, 5 / f);
        Assert.True(Math.Abs(amplitude - gain) < 1e-3 * gain, $"amplitude {amplitude} vs {gain}");
        Assert.True(Math.Abs(measuredPhase - phase) < 1e-3 * Math.Abs(phase), $"phase {measuredPhase} vs {phase}");

        // textbook: full response v = |H|·sin(ωt + ∠H) + |H|²·ωτ·e^(−t/τ) (transient term decays by 5 periods).
        for (int i = 0; i < v.Length; i++)
        {
            double t = result.Time[i];
            double exact = (gain * Math.Sin((w * t) + phase)) + (gain * gain * w * Tau * Math.Exp(-t / Tau));
            Assert.True(Math.Abs(v[i] - exact) < 1e-3 * gain, $"t = {t}: {v[i]} vs {exact}");
        }
    }

    [Fact]
    public void Ac_sweep_of_the_low_pass_matches_the_transfer_function()
    {
        var circuit = RcLowPass(new DcWaveform(0));
        var ac = Simulate.AcSweep(circuit, AcSweep.Decades("vin", 1, 1e5, 10));
        Assert.True(ac.Succeeded, ac.Failure?.ToString());
        var vout = ac.Voltage("out");
        for (int i = 0; i < vout.Length; i++)
        {
            // textbook: H(jω) = 1/(1 + jωRC).
            var exact = 1 / new System.Numerics.Complex(1, 2 * Math.PI * ac.Frequencies[i] * Tau);
            Assert.True((vout[i] - exact).Magnitude < 1e-9, $"f = {ac.Frequencies[i]}");
        }
    }

    [Fact]
    public void Sweeps_that_share_one_operating_point_give_the_bits_of_separate_sweeps_and_the_transfer_function()
    {
        var circuit = RcLowPass(new DcWaveform(0.5));
        var sweeps = Simulate.AcSweeps(circuit);
        var plans = new[] { AcSweep.Decades("vin", 1, 1e5, 10), AcSweep.List("vin", 150, 1 / (2 * Math.PI * Tau), 170) };
        foreach (var plan in plans)
        {
            var shared = sweeps.Run(plan);
            var alone = Simulate.AcSweep(circuit, plan);
            Assert.True(shared.Succeeded, shared.Failure?.ToString());
            Assert.Equal(alone.Frequencies, shared.Frequencies);
            Assert.Equal(alone.OperatingPoint.Voltage("out"), shared.OperatingPoint.Voltage("out"));
            var vout = shared.Voltage("out");
            Assert.Equal(alone.Voltage("out"), vout);
            for (int i = 0; i < vout.Length; i++)
            {
                // textbook: H(jω) = 1/(1 + jωRC), whatever the DC level the sweep is linearised at.
                var exact = 1 / new System.Numerics.Complex(1, 2 * Math.PI * shared.Frequencies[i] * Tau);
                Assert.True((vout[i] - exact).Magnitude < 1e-9, $"f = {shared.Frequencies[i]}");
            }
        }

        // A request the circuit cannot serve fails in the session as it fails alone, and the session still sweeps after it.
        var bad = sweeps.Run(AcSweep.List("no-such-source", 100));
        Assert.Equal(Simulate.AcSweep(circuit, AcSweep.List("no-such-source", 100)).Failure, bad.Failure);
        Assert.True(sweeps.Run(plans[1]).Succeeded);
    }
}
