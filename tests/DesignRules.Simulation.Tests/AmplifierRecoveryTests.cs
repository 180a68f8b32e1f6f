namespace DesignRules.Simulation.Tests;

public sealed class AmplifierRecoveryTests
{
    private const double Edge = 1e-7;

    private static TransientResult Overdriven(AmplifierModel model)
    {
        // Inverting gain −10 driven by ±5 V: the output would need ∓50 V, so it sits at a swing limit most of each half-cycle
        // and the summing node stays well overdriven (above SR/ωu) during the whole transition.
        var drive = new PulseWaveform(-5, 5, 100e-6, 0.5, Edge, Edge, Delay: 10e-6);
        var result = Simulate.Transient(Stages.Inverting(drive, model, 10e3, 1e3), new TransientOptions { StopTime = 120e-6, MaxStep = 50e-9 });
        Assert.True(result.Succeeded, result.Failure?.ToString());
        return result;
    }

    [Fact]
    public void Output_leaves_the_rail_as_soon_as_the_overdrive_reverses_without_wind_up()
    {
        var model = Stages.GeneralPurpose with { SwingHeadroomPositive = 1, SwingHeadroomNegative = 1 };
        var result = Overdriven(model);
        var v = result.Voltage("out");

        // Input rises at 10 µs: the output has been at +14 V since t = 0 and must fall at once.
        double leave = Stages.Crossing(result.Time, v, 13.9, 10e-6, rising: false) - 10e-6;
        Assert.InRange(leave, 0, Edge + 0.1e-6);

        // common practice: rail-to-rail transition takes ΔV/SR = 28 V / 8 V/µs = 3.5 µs; wind-up would add a long delay.
        double arrive = Stages.Crossing(result.Time, v, -13.9, 10e-6, rising: false) - 10e-6;
        Assert.InRange(arrive, 3.3e-6, 4.0e-6);

        // And back up when the input falls at 60 µs.
        double back = Stages.Crossing(result.Time, v, 13.9, 60e-6, rising: true) - 60e-6;
        Assert.InRange(back, 3.3e-6, 4.0e-6);
        var trace = result.Amplifier("u1");
        Assert.Contains(true, trace.AtSwingLimit);
        Assert.Contains(true, trace.SlewLimited);
    }

    [Fact]
    public void Overload_recovery_time_delays_the_departure_from_the_rail()
    {
        var model = Stages.GeneralPurpose with { SwingHeadroomPositive = 1, SwingHeadroomNegative = 1, OverloadRecoveryTime = 2e-6 };
        var result = Overdriven(model);
        var v = result.Voltage("out");

        // model definition: the output waits about the overload recovery time (2 µs), then slews 28 V at 8 V/µs.
        double leave = Stages.Crossing(result.Time, v, 13.5, 10e-6, rising: false) - 10e-6;
        Assert.InRange(leave, 1.6e-6, 2.6e-6);
        double arrive = Stages.Crossing(result.Time, v, -13.9, 10e-6, rising: false) - 10e-6;
        Assert.InRange(arrive, 3.3e-6 + 1.6e-6, 4.0e-6 + 2.6e-6);
    }
}
