namespace DesignRules.Simulation.Tests;

/// <summary>
/// Where the caller names the nodes its figures read before the reference sweep, warm samples solve only the equations
/// those nodes reach: a stage behind that draws a current no voltage changes (an amplifier input's bias current, a
/// capacitor at DC) is left out exactly, while a stage that loads the named nodes through a resistor is kept. Either way
/// the named nodes agree with a cold sweep of the changed circuit within the solver's tolerance.
/// </summary>
public sealed class SolvedUnknownsTests
{
    private static readonly double[] Levels = [-0.3, -0.03, 0, 0.03, 0.3];

    /// <summary>
    /// A non-inverting stage (gain 1 + rf/rg, an amplifier of 80 dB open-loop gain) fed through a source resistance; behind it either an averaging filter (a
    /// resistor into a capacitor, buffered by a follower) driving a load, whose input at DC draws only the follower's bias
    /// current, or an inverting stage whose input resistor runs into its amplifier's virtual ground and so loads the stage.
    /// </summary>
    private static Circuit Chain(double rf, double rg, double offset, bool loading)
    {
        var circuit = new Circuit()
            .AddVoltageSource("vin", "src", Circuit.Ground, new DcWaveform(0))
            .AddResistor("rs", "src", "in", 1e3)
            .AddAmplifier("u1", "in", "fb", "pre", Stages.GeneralPurpose with { OpenLoopGain = 1e4, InputOffsetVoltage = offset }, Stages.Rails)
            .AddResistor("rf", "pre", "fb", rf)
            .AddResistor("rg", "fb", Circuit.Ground, rg);
        return loading
            ? circuit
                .AddResistor("ri", "pre", "sum", 1e3)
                .AddAmplifier("u2", Circuit.Ground, "sum", "out", Stages.GeneralPurpose, Stages.Rails)
                .AddResistor("rfb", "sum", "out", 1e3)
                .AddResistor("load", "out", Circuit.Ground, 2e3)
            : circuit
                .AddResistor("r", "pre", "hold", 200e3)
                .AddCapacitor("c", "hold", Circuit.Ground, 1e-6)
                .AddAmplifier("u2", "hold", "out", "out", Stages.GeneralPurpose with { InputBiasCurrentNonInverting = 5e-9 }, Stages.Rails)
                .AddResistor("load", "out", Circuit.Ground, 2e3);
    }

    private static void Sample(bool loading, Action<VariedDcSolver, DcSolutions, DcSolutions, DcSweepResult> check)
    {
        const double rf = 30.1e3, rg = 10e3;
        var solver = VariedDcSolver.Compile(Chain(rf, rg, 0, loading), out _)!;
        solver.SetFigureNodes(["in", "fb", "pre"]);
        var reference = solver.ReferenceSweep("vin", Levels);
        Assert.True(reference.Succeeded, reference.Failure?.ToString());
        var random = new Random(20261206);
        for (int s = 0; s < 100; s++)
        {
            // 1 % resistors and a 2 mV offset, drawn uniformly (the kind of spread a Monte Carlo sample draws).
            double f = rf * (1 + (0.01 * ((2 * random.NextDouble()) - 1)));
            double g = rg * (1 + (0.01 * ((2 * random.NextDouble()) - 1)));
            double offset = 2e-3 * ((2 * random.NextDouble()) - 1);
            solver.SetResistance("rf", f);
            solver.SetResistance("rg", g);
            solver.SetAmplifierInputs("u1", offset, 0, 0);
            var warm = solver.Sweep("vin", Levels, reference);
            var cold = Simulate.DcSweep(Chain(f, g, offset, loading), "vin", Levels);
            Assert.True(warm.Succeeded && cold.Succeeded);
            check(solver, reference, warm, cold);
        }
    }

    /// <summary>
    /// Two converged solutions agree within what the engine's convergence test allows each of them: 1e-6 relative plus a
    /// few nanovolts (<see cref="SolverLimits.RelativeTolerance"/>, <see cref="SolverLimits.VoltageTolerance"/>).
    /// </summary>
    private static void AssertSameSolution(DcSweepResult cold, DcSolutions warm, string node)
    {
        var c = cold.Voltage(node);
        var w = warm.Voltage(node);
        for (int i = 0; i < c.Length; i++)
        {
            Assert.True(Math.Abs(c[i] - w[i]) <= (2e-6 * Math.Abs(c[i])) + 1e-8, $"{node} at {Levels[i]} V: warm {w[i]}, cold {c[i]}");
        }
    }

    [Fact]
    public void A_stage_whose_next_stage_draws_only_a_bias_current_is_solved_without_the_stages_behind_it()
    {
        Sample(loading: false, (solver, reference, warm, cold) =>
        {
            var solved = reference.Linearisation!.Unknowns;
            Assert.True(solved.Length < solver.Size, $"{solved.Length} of {solver.Size} unknowns solved");
            foreach (string node in new[] { "in", "fb", "pre", "hold" }) AssertSameSolution(cold, warm, node);

            // The follower behind is not solved: its output keeps the reference value although its input moved.
            Assert.Equal(reference.Voltage("out"), warm.Voltage("out"));
        });
    }

    [Fact]
    public void A_stage_loaded_by_the_next_one_through_a_resistor_is_solved_with_it()
    {
        Sample(loading: true, (solver, reference, warm, cold) =>
        {
            Assert.Equal(solver.Size, reference.Linearisation!.Unknowns.Length);
            foreach (string node in new[] { "in", "fb", "pre", "sum", "out" }) AssertSameSolution(cold, warm, node);
        });
    }

    [Fact]
    public void Leaving_out_a_stage_that_loads_would_move_the_figure_nodes_beyond_the_tolerance()
    {
        // The reason the loading stage must be kept: without it the stage output moves by the load current times the
        // stage's closed-loop output impedance (Rout/(1 + A0·β), textbook feedback result), far more than the solver's
        // tolerance at full scale, so the comparison with the cold sweep above would fail if it were left out.
        var loaded = Simulate.DcSweep(Chain(30.1e3, 10e3, 1e-3, loading: true), "vin", Levels).Voltage("pre");
        var alone = Simulate.DcSweep(Chain(30.1e3, 10e3, 1e-3, loading: false), "vin", Levels).Voltage("pre");
        double allowed = (2e-6 * Math.Abs(loaded[4])) + 1e-8;
        Assert.True(Math.Abs(loaded[4] - alone[4]) > 5 * allowed, $"loaded {loaded[4]}, alone {alone[4]}");
    }
}
