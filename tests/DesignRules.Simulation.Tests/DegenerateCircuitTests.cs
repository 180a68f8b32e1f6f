namespace DesignRules.Simulation.Tests;

public sealed class DegenerateCircuitTests
{
    [Fact]
    public void A_node_reached_only_through_a_capacitor_is_reported_as_floating_by_name()
    {
        var circuit = new Circuit()
            .AddVoltageSource("v1", "in", Circuit.Ground, 1)
            .AddResistor("r1", "in", Circuit.Ground, 1e3)
            .AddCapacitor("c1", "in", "island", 1e-9)
            .AddResistor("r2", "island", "island2", 1e3);
        var op = Simulate.OperatingPoint(circuit);
        Assert.False(op.Succeeded);
        Assert.Equal(FailureKind.NoDcReturn, op.Failure!.Kind);
        Assert.Contains(op.Failure.Node, new[] { "island", "island2" });
        Assert.Contains("no DC path", op.Failure.Reason);
    }

    [Fact]
    public void An_amplifier_input_with_no_bias_return_is_reported_as_floating()
    {
        var circuit = new Circuit()
            .AddVoltageSource("v1", "in", Circuit.Ground, new SineWaveform(1, 1e3))
            .AddCapacitor("c1", "in", "plus", 1e-6)
            .AddAmplifier("u1", "plus", "out", "out", AmplifierModel.SinglePole(1e6, 1e5, 1e6), new SupplyRails(15, -15));
        var result = Simulate.Transient(circuit, new TransientOptions { StopTime = 1e-3 });
        Assert.False(result.Succeeded);
        Assert.Equal("plus", result.Failure!.Node);
    }

    [Fact]
    public void Two_voltage_sources_in_parallel_give_a_singular_matrix_failure_naming_a_source()
    {
        var circuit = new Circuit()
            .AddVoltageSource("v1", "a", Circuit.Ground, 1)
            .AddVoltageSource("v2", "a", Circuit.Ground, 2)
            .AddResistor("r1", "a", Circuit.Ground, 1e3);
        var op = Simulate.OperatingPoint(circuit);
        Assert.Equal(FailureKind.Undetermined, op.Failure!.Kind);
        Assert.Contains(op.Failure.ElementId, new[] { "v1", "v2" });
    }

    [Fact]
    public void Bad_element_values_are_recorded_as_problems_and_fail_every_analysis()
    {
        var circuit = new Circuit()
            .AddVoltageSource("v1", "a", Circuit.Ground, 1)
            .AddResistor("r1", "a", Circuit.Ground, 0)
            .AddResistor("r1", "a", Circuit.Ground, 1e3);
        Assert.Equal(2, circuit.Problems.Count);
        Assert.Equal("r1", Simulate.OperatingPoint(circuit).Failure!.ElementId);
        Assert.False(Simulate.Transient(circuit, new TransientOptions { StopTime = 1 }).Succeeded);
        Assert.False(Simulate.AcSweep(circuit, AcSweep.List("v1", 1e3)).Succeeded);
        Assert.False(Simulate.DcSweep(circuit, "v1", [1, 2]).Succeeded);
    }

    [Fact]
    public void Unusable_requests_are_failures_not_exceptions()
    {
        var circuit = new Circuit().AddVoltageSource("v1", "a", Circuit.Ground, 1).AddResistor("r1", "a", Circuit.Ground, 1e3);
        Assert.Equal(FailureKind.UnusableRequest, Simulate.DcSweep(circuit, "r1", [1]).Failure!.Kind);
        Assert.Equal(FailureKind.UnusableRequest, Simulate.AcSweep(circuit, AcSweep.List("v1")).Failure!.Kind);
        Assert.Equal(FailureKind.UnusableRequest, Simulate.Transient(circuit, new TransientOptions { StopTime = -1 }).Failure!.Kind);
        Assert.Equal(FailureKind.UnusableElement, Simulate.OperatingPoint(new Circuit()).Failure!.Kind);
    }

    [Fact]
    public void An_AC_stimulus_on_an_element_that_is_not_an_independent_source_is_an_unusable_request()
    {
        var circuit = new Circuit().AddVoltageSource("v1", "a", Circuit.Ground, 1).AddResistor("r1", "a", Circuit.Ground, 1e3);
        Assert.Equal(FailureKind.UnusableRequest, Simulate.AcSweep(circuit, AcSweep.List("r1", 1e3)).Failure!.Kind);
        Assert.Equal(FailureKind.UnusableRequest, Simulate.AcSweep(circuit, AcSweep.List("nothing", 1e3)).Failure!.Kind);
        Assert.Equal(FailureKind.UnusableRequest, Simulate.AcSweep(circuit, AcSweep.List("v1", 1e3) with { Amplitude = double.NaN }).Failure!.Kind);
    }

    [Fact]
    public void Only_the_name_ground_is_the_reference_node_and_0_is_an_ordinary_node()
    {
        Assert.True(Circuit.IsReference("ground"));
        Assert.False(Circuit.IsReference("0"));
        Assert.False(Circuit.IsReference("Ground"));

        // A node named 0 reached only through capacitors has no DC return, as any other such node would; were it the
        // reference, the circuit would be sound.
        var circuit = new Circuit()
            .AddVoltageSource("v1", "a", Circuit.Ground, 1)
            .AddResistor("r1", "a", Circuit.Ground, 1e3)
            .AddCapacitor("c1", "a", "0", 1e-9)
            .AddCapacitor("c2", "0", Circuit.Ground, 1e-9);
        var failure = Simulate.OperatingPoint(circuit).Failure!;
        Assert.Equal(FailureKind.NoDcReturn, failure.Kind);
        Assert.Equal("0", failure.Node);
    }

    [Fact]
    public void A_step_limit_ends_the_transient_with_a_located_failure_and_the_points_so_far()
    {
        var circuit = new Circuit()
            .AddVoltageSource("v1", "in", Circuit.Ground, new SineWaveform(1, 1e3))
            .AddResistor("r1", "in", "out", 1e3)
            .AddCapacitor("c1", "out", Circuit.Ground, 1e-7);
        var result = Simulate.Transient(circuit, new TransientOptions { StopTime = 1e-2, MaxStep = 1e-6 }, SolverLimits.Default with { MaxTransientSteps = 100 });
        Assert.Equal(FailureKind.BudgetSpent, result.Failure!.Kind);
        Assert.NotNull(result.Failure.Time);
        Assert.True(result.Time.Count > 50);
    }
}
