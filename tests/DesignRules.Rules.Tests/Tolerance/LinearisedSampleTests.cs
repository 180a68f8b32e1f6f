using DesignRules.Figures.Tolerance;
using DesignRules.Loading;
using DesignRules.Model;
using DesignRules.Rules.Evaluation;
using DesignRules.Rules.Evaluation.Tolerance;
using DesignRules.Simulation;

namespace DesignRules.Rules.Tests.Tolerance;

/// <summary>
/// Monte Carlo samples of the example's compressor chain (a linear preamp, an absolute-value rectifier behind it, an
/// averaging filter) solved with the engine's linearised steps give the stage transfers the full warm path gives, sample by
/// sample, within the engine's convergence tolerance, and the same clipping marks.
/// </summary>
public sealed class LinearisedSampleTests
{
    private static WorstCaseAnalysis Stage(string stageId)
    {
        var root = Path.Combine(RuleFixture.RepositoryRoot(), "example-design");
        var files = RepositoryFiles.Find([root], out _).Order(StringComparer.Ordinal).ToList();
        var design = DesignLoader.LoadFiles(files).Designs.Single(d => d.Id.Value == "compressor-vibration-envelope");
        var evaluation = new DesignEvaluation(design, RuleSet.Default);
        return ToleranceAnalyses.WorstCase(evaluation, ToleranceAnalyses.Stages(evaluation).Single(s => s.StageId == stageId));
    }

    [Theory]
    [InlineData("preamp")]
    [InlineData("rectifier")]
    [InlineData("smoothing")]
    public void Linearised_samples_agree_with_the_full_path_within_the_solver_tolerance(string stageId)
    {
        var worstCase = Stage(stageId);
        var circuit = worstCase.Circuit;
        var settings = new MonteCarloSettings(200, 20261203, ToleranceDistribution.Normal);
        for (int i = 0; i < settings.Samples; i++)
        {
            var v = SampleDraws.Draw(worstCase, settings, i);

            circuit.Linearised = true;
            var fast = circuit.Measure(v);
            circuit.Linearised = false;
            var full = circuit.Measure(v);
            circuit.Linearised = true;
            Assert.True(fast.Succeeded && full.Succeeded);
            Assert.Equal(full.Clipped, fast.Clipped);
            for (int l = 0; l < full.Outputs.Length; l++)
            {
                // Both are converged solutions of the same equations: each within 1e-6 relative plus 1 nV of the exact one
                // (SolverLimits.RelativeTolerance, VoltageTolerance), so within twice that of each other (and a margin).
                double allowed = (2e-6 * Math.Abs(full.Outputs[l])) + 1e-8;
                Assert.True(Math.Abs(fast.Outputs[l] - full.Outputs[l]) <= allowed, $"sample {i}, level {l}: {fast.Outputs[l]} vs {full.Outputs[l]}");
                Assert.True(Math.Abs(fast.Inputs[l] - full.Inputs[l]) <= (2e-6 * Math.Abs(full.Inputs[l])) + 1e-8, $"sample {i}, level {l} input");
            }
        }
    }

    [Theory]
    [InlineData("preamp")]
    [InlineData("rectifier")]
    public void Samples_stopped_at_the_stage_nodes_agree_with_the_test_on_every_unknown_of_the_chain(string stageId)
    {
        // The preamp drives the absolute-value rectifier, whose diodes at its zero crossing still settle when the preamp's
        // nodes have converged; the rectifier stage drives the linear smoothing filter.
        var worstCase = Stage(stageId);
        var circuit = worstCase.Circuit;
        var settings = new MonteCarloSettings(400, 20261204, ToleranceDistribution.Normal);
        for (int i = 0; i < settings.Samples; i++)
        {
            var v = SampleDraws.Draw(worstCase, settings, i);

            var stopped = circuit.Measure(v);
            circuit.FigureFocus = false;
            var everywhere = circuit.Measure(v);
            circuit.FigureFocus = true;
            Assert.True(stopped.Succeeded && everywhere.Succeeded);
            Assert.Equal(everywhere.Clipped, stopped.Clipped);
            for (int l = 0; l < everywhere.Outputs.Length; l++)
            {
                // Both within the engine's convergence test of the exact solution at the stage's nodes: 1e-6 relative plus
                // 1 nV each (SolverLimits.RelativeTolerance, VoltageTolerance), so within twice that of each other.
                double allowed = (2e-6 * Math.Abs(everywhere.Outputs[l])) + 2e-9;
                Assert.True(Math.Abs(stopped.Outputs[l] - everywhere.Outputs[l]) <= allowed, $"sample {i}, level {l}: {stopped.Outputs[l]} vs {everywhere.Outputs[l]}");
                Assert.True(Math.Abs(stopped.Inputs[l] - everywhere.Inputs[l]) <= (2e-6 * Math.Abs(everywhere.Inputs[l])) + 2e-9, $"sample {i}, level {l} input");
            }

            Assert.Equal(everywhere.CommonModeShift, stopped.CommonModeShift, 1e-8);
        }
    }

    [Theory]
    [InlineData(2.5e-3)]
    [InlineData(5e-3)]
    public void A_preamp_offset_that_carries_the_rectifier_across_its_diode_drop_is_solved_without_the_newton_fallback(double offset)
    {
        // The nominal chain has no offsets, so at the 0 V level the rectifier behind the preamp sits at its dead zone's centre
        // with both diodes off and its amplifier open-loop. A preamp offset of 2.5 mV (5 mV) puts about 10 mV (20 mV) on the
        // rectifier's input (the preamp's gain is 1 + 30.1k/10k = 4.01, textbook non-inverting gain), which its amplifier must
        // answer by swinging across a diode drop: steps from the open-loop Jacobian stall, and the level is started again from
        // the same sample's solution at a neighbouring level instead of falling back to Newton.
        var worstCase = Stage("preamp");
        var chain = worstCase.Circuit.Chain;
        var probe = worstCase.Circuit.Probe!;
        var levels = worstCase.Plan.Levels;
        var warm = VariedDcSolver.Compile(chain.Circuit, out _)!;
        warm.SetFigureNodes([probe.InputNode, probe.OutputNode, probe.ReferenceInputNode, .. probe.Amplifiers.Select(a => a.OutputNode)]);
        var reference = warm.ReferenceSweep(chain.SourceId, levels);
        Assert.True(reference.Succeeded);
        string amplifier = probe.Amplifiers.Single().ElementId;
        warm.SetAmplifierInputs(amplifier, offset, 0, 0);
        var sample = warm.Sweep(chain.SourceId, levels, reference);

        // The same values solved cold: every level by Newton from zero, continuation where needed (as Simulate.DcSweep).
        var cold = VariedDcSolver.Compile(chain.Circuit, out _)!;
        cold.SetAmplifierInputs(amplifier, offset, 0, 0);
        var exact = cold.Sweep(chain.SourceId, levels);
        Assert.True(sample.Succeeded && exact.Succeeded);

        int zero = Array.IndexOf(levels, 0.0);
        Assert.True(zero >= 0, "the preamp's levels include 0 V");
        Assert.True(exact.Voltage(probe.OutputNode)[zero] > 6e-3, "the offset puts more than a few millivolts on the rectifier's input");
        Assert.True(warm.AbandonedSteps > 0, "the steps from the 0 V level's own reference did not converge");
        Assert.True(warm.NeighbourStarts >= 1, "a level was started from its neighbour's solution");
        Assert.Equal(0, warm.LinearisedFallbacks);
        Assert.Equal(0, warm.FallbackNewtonIterations);
        Assert.Equal(levels.Length, warm.LinearisedValues);
        foreach (string node in new[] { probe.InputNode, probe.OutputNode })
        {
            var w = sample.Voltage(node);
            var c = exact.Voltage(node);
            for (int l = 0; l < levels.Length; l++)
            {
                // Both are converged solutions of the same equations: within 1e-6 relative plus 1 nV each of the exact one
                // (SolverLimits.RelativeTolerance, VoltageTolerance), so within twice that of each other (and a margin).
                Assert.True(Math.Abs(w[l] - c[l]) <= (2e-6 * Math.Abs(c[l])) + 1e-8, $"{node} at level {levels[l]}: warm {w[l]}, cold {c[l]}");
            }
        }
    }

    [Fact]
    public void The_preamp_yield_is_the_same_with_and_without_linearised_steps()
    {
        var worstCase = Stage("preamp");
        var settings = new MonteCarloSettings(300, 20261202, ToleranceDistribution.Normal);
        var fast = MonteCarloYield.Run(worstCase, settings, maxDegreeOfParallelism: 1);
        worstCase.Circuit.Linearised = false;
        var full = MonteCarloYield.Run(worstCase, settings, maxDegreeOfParallelism: 1);
        worstCase.Circuit.Linearised = true;
        for (int i = 0; i < fast.Samples; i++)
        {
            Assert.Equal(full.Errors[i], fast.Errors[i], 1e-7);
            Assert.Equal(full.Gains[i], fast.Gains[i], 1e-6);
        }

        Assert.Equal(full.PassingWithin(0.03), fast.PassingWithin(0.03));
    }
}
