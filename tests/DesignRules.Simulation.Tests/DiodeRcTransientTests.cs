using MathNet.Numerics.OdeSolvers;

namespace DesignRules.Simulation.Tests;

public sealed class DiodeRcTransientTests
{
    [Fact]
    public void Diode_clamped_RC_under_sine_drive_matches_a_fine_Runge_Kutta_solution()
    {
        const double r = 1e3, c = 1e-6, amplitude = 5, frequency = 100, stop = 2 / frequency;
        var model = new DiodeModel { SaturationCurrent = 1e-14, EmissionCoefficient = 1, SeriesResistance = 0, JunctionCapacitance = 0 };
        var circuit = new Circuit()
            .AddVoltageSource("vs", "in", Circuit.Ground, new SineWaveform(amplitude, frequency))
            .AddResistor("r1", "in", "x", r)
            .AddCapacitor("c1", "x", Circuit.Ground, c)
            .AddDiode("d1", "x", Circuit.Ground, model);
        var result = Simulate.Transient(circuit, new TransientOptions { StopTime = stop, MaxStep = 1 / (frequency * 500) });
        Assert.True(result.Succeeded, result.Failure?.ToString());
        var v = result.Voltage("x");

        // Reference: MathNet.Numerics RungeKutta.FourthOrder on the same node equation
        // C·dv/dt = (vs(t) − v)/R − Is·(exp(v/VT) − 1) − Gj·v (Gj the junction shunt), with a 0.1 µs step.
        double vt = PhysicalConstants.ThermalVoltage(PhysicalConstants.DefaultTemperature);
        const int steps = 200_000;
        double[] reference = RungeKutta.FourthOrder(0.0, 0, stop, steps, (t, y) =>
            ((((amplitude * Math.Sin(2 * Math.PI * frequency * t)) - y) / r) - (model.SaturationCurrent * (Math.Exp(y / vt) - 1)) - (SolverLimits.Default.JunctionShunt * y)) / c);
        var grid = Enumerable.Range(0, steps).Select(i => stop * i / (steps - 1)).ToArray();
        double peak = reference.Max(Math.Abs);
        for (int i = 0; i < v.Length; i++)
        {
            double expected = SignalMath.Interpolate(grid, reference, result.Time[i]);
            Assert.True(Math.Abs(v[i] - expected) < 5e-3 * peak, $"t = {result.Time[i]}: {v[i]} vs {expected}");
        }

        Assert.InRange(v.Max(), 0.5, 0.8);
        Assert.True(v.Min() < -3);
    }
}
