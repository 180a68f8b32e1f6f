namespace DesignRules.Simulation.Tests;

/// <summary>How the transient tells a time step that had to shrink below its floor.</summary>
public sealed class TransientFailureWordingTests
{
    [Fact]
    public void A_step_that_must_shrink_below_its_floor_names_the_floor_the_time_and_the_node()
    {
        // A 50 V edge of 1 ps into a bare junction and a 1 fF capacitor, with only two Newton–Raphson iterations per
        // step and a floor of 1 ns on the step: no step the floor allows can follow the edge.
        var circuit = new Circuit()
            .AddVoltageSource("v1", "a", Circuit.Ground, new PulseWaveform(0, 50, 1e-6, 0.5, 1e-12, 1e-12))
            .AddDiode("d1", "a", "b")
            .AddCapacitor("c1", "b", Circuit.Ground, 1e-15)
            .AddResistor("r1", "b", Circuit.Ground, 1e12);
        var result = Simulate.Transient(circuit, new TransientOptions { StopTime = 4e-6 }, SolverLimits.Default with { MinTimeStep = 1e-9, MaxTransientIterations = 2 });

        Assert.False(result.Succeeded);
        var failure = result.Failure!;
        Assert.Equal(FailureKind.StepShrank, failure.Kind);
        Assert.Contains("the time step shrank below 1 ns at t = ", failure.Reason, StringComparison.Ordinal);
        Assert.Contains("changed faster than a step that short can follow", failure.Reason, StringComparison.Ordinal);
        Assert.StartsWith("time step shrank away: ", failure.ToString(), StringComparison.Ordinal);
        Assert.DoesNotContain(nameof(FailureKind.StepShrank), failure.ToString(), StringComparison.Ordinal);
    }
}
