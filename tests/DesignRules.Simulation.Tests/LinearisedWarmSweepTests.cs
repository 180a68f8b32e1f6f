namespace DesignRules.Simulation.Tests;

/// <summary>
/// Warm sweeps from a reference sweep that take linearised steps (the reference Jacobian factored once, the changed
/// values as low-rank updates, the full residual checked at every step) give the cold sweep's solution, and a sample that
/// leaves the linear region is solved by further steps or the fuller path, never by the linear step alone.
/// </summary>
public sealed class LinearisedWarmSweepTests
{
    private static readonly double[] Levels = [-0.3, -0.03, 0, 0.03, 0.3];

    /// <summary>
    /// A non-inverting stage (gain 1 + rf/rg) fed through a source resistance, driving a precision half-wave rectifier
    /// (a diode in a follower's loop) with a load: the stage is linear, the chain behind it is not.
    /// </summary>
    private static Circuit Chain(double rf, double rg, double offset, SupplyRails rails, bool rectifier = true)
    {
        var circuit = new Circuit()
            .AddVoltageSource("vin", "src", Circuit.Ground, new DcWaveform(0))
            .AddResistor("rs", "src", "in", 1e3)
            .AddAmplifier("u1", "in", "fb", "pre", Stages.GeneralPurpose with { InputOffsetVoltage = offset }, rails)
            .AddResistor("rf", "pre", "fb", rf)
            .AddResistor("rg", "fb", Circuit.Ground, rg);
        return rectifier
            ? circuit
                .AddAmplifier("u2", "pre", "rect", "o2", Stages.GeneralPurpose, rails)
                .AddDiode("d1", "o2", "rect")
                .AddResistor("load", "rect", Circuit.Ground, 10e3)
            : circuit.AddResistor("load", "pre", Circuit.Ground, 10e3);
    }

    /// <summary>
    /// Two converged solutions agree within what the engine's convergence test allows each of them: 1e-6 relative plus a
    /// few nanovolts (<see cref="SolverLimits.RelativeTolerance"/>, <see cref="SolverLimits.VoltageTolerance"/>).
    /// </summary>
    private static void AssertSameSolution(DcSweepResult cold, DcSolutions warm, string node, string what)
    {
        var c = cold.Voltage(node);
        var w = warm.Voltage(node);
        for (int i = 0; i < c.Length; i++)
        {
            double allowed = (2e-6 * Math.Abs(c[i])) + 1e-8;
            Assert.True(Math.Abs(c[i] - w[i]) <= allowed, $"{what}: {node} at {Levels[i]} V: warm {w[i]}, cold {c[i]}");
        }
    }

    [Fact]
    public void Samples_of_a_linear_stage_before_a_rectifier_agree_with_the_cold_sweep_across_many_draws()
    {
        const double rf = 30.1e3, rg = 10e3;
        var solver = VariedDcSolver.Compile(Chain(rf, rg, 0, Stages.Rails), out _)!;
        var reference = solver.ReferenceSweep("vin", Levels);
        Assert.True(reference.Succeeded, reference.Failure?.ToString());
        var random = new Random(20261203);
        const int samples = 150;
        for (int s = 0; s < samples; s++)
        {
            // 1 % resistors and a 2 mV offset, drawn uniformly (the kind of spread a Monte Carlo sample draws).
            double f = rf * (1 + (0.01 * ((2 * random.NextDouble()) - 1)));
            double g = rg * (1 + (0.01 * ((2 * random.NextDouble()) - 1)));
            double offset = 2e-3 * ((2 * random.NextDouble()) - 1);
            solver.SetResistance("rf", f);
            solver.SetResistance("rg", g);
            solver.SetAmplifierInputs("u1", offset, 0, 0);
            var warm = solver.Sweep("vin", Levels, reference);
            var cold = Simulate.DcSweep(Chain(f, g, offset, Stages.Rails), "vin", Levels);
            Assert.True(warm.Succeeded && cold.Succeeded);
            foreach (string node in new[] { "in", "pre", "rect" }) AssertSameSolution(cold, warm, node, $"sample {s}");

            // textbook: a non-inverting stage's gain is 1 + rf/rg (less a part in A0·β, here about 4e-5).
            var pre = warm.Voltage("pre");
            Assert.Equal(1 + (f / g), (pre[4] - pre[0]) / 0.6, 1e-3);
        }

        // The linear stage is solved by linearised steps at every level where the rectifier keeps its diode's state; at
        // 0 V, where the rectifier sits at its zero crossing, further Newton steps (or the fuller path) may be needed.
        Assert.True(solver.LinearisedValues >= samples * 4, $"{solver.LinearisedValues} of {samples * Levels.Length} levels linearised");
    }

    [Fact]
    public void Samples_stopped_at_the_stage_nodes_agree_with_the_cold_sweep_there_while_the_rectifier_behind_still_settles()
    {
        const double rf = 30.1e3, rg = 10e3;
        var solver = VariedDcSolver.Compile(Chain(rf, rg, 0, Stages.Rails), out _)!;
        var full = VariedDcSolver.Compile(Chain(rf, rg, 0, Stages.Rails), out _)!;
        var reference = solver.ReferenceSweep("vin", Levels);
        var fullReference = full.ReferenceSweep("vin", Levels);
        solver.SetFigureNodes(["in", "fb", "pre", Circuit.Ground]);
        var random = new Random(20261204);
        const int samples = 300;
        for (int s = 0; s < samples; s++)
        {
            // 1 % resistors and a 2 mV offset, drawn uniformly (the kind of spread a Monte Carlo sample draws).
            double f = rf * (1 + (0.01 * ((2 * random.NextDouble()) - 1)));
            double g = rg * (1 + (0.01 * ((2 * random.NextDouble()) - 1)));
            double offset = 2e-3 * ((2 * random.NextDouble()) - 1);
            foreach (var v in new[] { solver, full })
            {
                v.SetResistance("rf", f);
                v.SetResistance("rg", g);
                v.SetAmplifierInputs("u1", offset, 0, 0);
            }

            var warm = solver.Sweep("vin", Levels, reference);
            var everywhere = full.Sweep("vin", Levels, fullReference);
            var cold = Simulate.DcSweep(Chain(f, g, offset, Stages.Rails), "vin", Levels);
            Assert.True(warm.Succeeded && everywhere.Succeeded && cold.Succeeded);

            // The stage's nodes agree with the cold sweep and with the engine's test on every unknown, within the solver's
            // tolerance; the rectifier's own node is not a figure node and is not compared.
            foreach (string node in new[] { "in", "fb", "pre" })
            {
                AssertSameSolution(cold, warm, node, $"sample {s}");
                var w = warm.Voltage(node);
                var e = everywhere.Voltage(node);
                for (int i = 0; i < w.Length; i++)
                {
                    Assert.True(Math.Abs(w[i] - e[i]) <= (2e-6 * Math.Abs(e[i])) + 2e-9, $"sample {s}: {node} at {Levels[i]} V: {w[i]} vs {e[i]}");
                }
            }
        }

        // The stop is taken (at the rectifier's zero crossing, and where its diode's operating point still moves), and it
        // saves steps against the engine's test on every unknown.
        Assert.True(solver.FigureConvergedValues > 0, "no level stopped at the stage's nodes");
        Assert.True(solver.LinearisedSteps < full.LinearisedSteps, $"{solver.LinearisedSteps} steps stopping at the stage, {full.LinearisedSteps} on every unknown");
        Assert.Equal(0, full.FigureConvergedValues);
    }

    [Fact]
    public void A_figure_node_loaded_by_a_diode_is_not_stopped_before_the_diode_has_settled()
    {
        // A divider whose tap a diode clamps: the figure node is the diode's own, so it converges only with the diode.
        static Circuit Clamp(double top, double bottom) => new Circuit()
            .AddVoltageSource("vin", "src", Circuit.Ground, new DcWaveform(0))
            .AddResistor("top", "src", "tap", top)
            .AddResistor("bottom", "tap", Circuit.Ground, bottom)
            .AddDiode("d1", "tap", Circuit.Ground);
        double[] levels = [-3, -1, 0, 1, 3];
        var solver = VariedDcSolver.Compile(Clamp(10e3, 10e3), out _)!;
        var reference = solver.ReferenceSweep("vin", levels);
        solver.SetFigureNodes(["tap"]);
        var random = new Random(20261205);
        for (int s = 0; s < 100; s++)
        {
            // 5 % resistors: the diode's current moves by several per cent, well past what one linearised step settles.
            double top = 10e3 * (1 + (0.05 * ((2 * random.NextDouble()) - 1)));
            double bottom = 10e3 * (1 + (0.05 * ((2 * random.NextDouble()) - 1)));
            solver.SetResistance("top", top);
            solver.SetResistance("bottom", bottom);
            var warm = solver.Sweep("vin", levels, reference).Voltage("tap");
            var cold = Simulate.DcSweep(Clamp(top, bottom), "vin", levels).Voltage("tap");
            for (int i = 0; i < levels.Length; i++)
            {
                Assert.True(Math.Abs(warm[i] - cold[i]) <= (2e-6 * Math.Abs(cold[i])) + 1e-8, $"sample {s} at {levels[i]} V: warm {warm[i]}, cold {cold[i]}");
            }
        }
    }

    [Fact]
    public void Figure_nodes_must_be_nodes_of_the_circuit()
    {
        var solver = VariedDcSolver.Compile(Chain(30.1e3, 10e3, 0, Stages.Rails), out _)!;
        Assert.Throws<KeyNotFoundException>(() => solver.SetFigureNodes(["nowhere"]));
    }

    [Fact]
    public void A_linear_sample_is_solved_in_one_step_confirmed_by_a_second_or_third()
    {
        var solver = VariedDcSolver.Compile(Chain(30.1e3, 10e3, 0, Stages.Rails, rectifier: false), out _)!;
        var reference = solver.ReferenceSweep("vin", Levels);
        solver.SetResistance("rf", 30.1e3 * 1.01);
        solver.SetAmplifierInputs("u1", 1e-3, 0, 0);
        var warm = solver.Sweep("vin", Levels, reference);
        var cold = Simulate.DcSweep(Chain(30.1e3 * 1.01, 10e3, 1e-3, Stages.Rails, rectifier: false), "vin", Levels);
        Assert.Equal(Levels.Length, solver.LinearisedValues);
        Assert.True(solver.LinearisedSteps <= 3 * Levels.Length, $"{solver.LinearisedSteps} steps for {Levels.Length} levels");
        Assert.True(warm.Succeeded && cold.Succeeded);
        AssertSameSolution(cold, warm, "pre", "linear sample");
    }

    [Fact]
    public void A_sample_pushed_into_clipping_is_not_solved_by_the_linear_step_and_matches_the_cold_sweep()
    {
        // ±2.5 V rails: gain 4 keeps ±0.3 V at ±1.2 V; a sample with rf five times larger (gain 16) asks for ±4.8 V and clips.
        var rails = new SupplyRails(2.5, -2.5);
        var solver = VariedDcSolver.Compile(Chain(30.1e3, 10e3, 0, rails, rectifier: false), out _)!;
        var reference = solver.ReferenceSweep("vin", Levels);
        Assert.True(reference.Succeeded);

        solver.SetResistance("rf", 30.1e3 * 1.01);
        solver.Sweep("vin", Levels, reference);
        int linearSteps = solver.LinearisedSteps;
        Assert.True(linearSteps <= 3 * Levels.Length, $"{linearSteps} steps for a linear sample");

        solver.SetResistance("rf", 150e3);
        var warm = solver.Sweep("vin", Levels, reference);
        int clippedSteps = solver.LinearisedSteps - linearSteps;
        var cold = Simulate.DcSweep(Chain(150e3, 10e3, 0, rails, rectifier: false), "vin", Levels);
        Assert.True(warm.Succeeded && cold.Succeeded);
        AssertSameSolution(cold, warm, "pre", "clipped sample");

        // The two clipped levels (±0.3 V) took more than the step and its confirmation, or left for the fuller path.
        Assert.True(clippedSteps > (3 * 3) + (2 * 2) || solver.LinearisedFallbacks > 0, $"{clippedSteps} steps, {solver.LinearisedFallbacks} fallbacks");
        var pre = warm.Voltage("pre");
        Assert.True(pre[4] > 2.4 && pre[0] < -2.4, $"clipped output {pre[0]} … {pre[4]}");
    }

    [Fact]
    public void A_diode_whose_forward_voltage_changes_is_solved_to_the_cold_sweep_from_a_linearised_reference()
    {
        var solver = VariedDcSolver.Compile(Chain(30.1e3, 10e3, 0, Stages.Rails), out _)!;
        var reference = solver.ReferenceSweep("vin", Levels);
        double saturation = solver.DiodeSaturationCurrent("d1");
        solver.SetDiodeSaturationCurrent("d1", saturation * 0.25);
        var warm = solver.Sweep("vin", Levels, reference);
        var changed = new Circuit()
            .AddVoltageSource("vin", "src", Circuit.Ground, new DcWaveform(0))
            .AddResistor("rs", "src", "in", 1e3)
            .AddAmplifier("u1", "in", "fb", "pre", Stages.GeneralPurpose, Stages.Rails)
            .AddResistor("rf", "pre", "fb", 30.1e3)
            .AddResistor("rg", "fb", Circuit.Ground, 10e3)
            .AddAmplifier("u2", "pre", "rect", "o2", Stages.GeneralPurpose, Stages.Rails)
            .AddDiode("d1", "o2", "rect", DiodeModel.SmallSignal with { SaturationCurrent = DiodeModel.SmallSignal.SaturationCurrent * 0.25 })
            .AddResistor("load", "rect", Circuit.Ground, 10e3);
        var cold = Simulate.DcSweep(changed, "vin", Levels);
        Assert.True(warm.Succeeded && cold.Succeeded);
        AssertSameSolution(cold, warm, "rect", "diode sample");
        AssertSameSolution(cold, warm, "o2", "diode sample");
    }
}
