using DesignRules.Elaboration;
using DesignRules.Figures;
using DesignRules.Figures.Stability;
using DesignRules.Loading;
using DesignRules.Simulation;

namespace DesignRules.Rules.Tests.Stability;

/// <summary>
/// The stability analyses are named members of the figures layer, computed once per design and shared: one loop per
/// amplifier (whatever number of rules and plots read it), one step analysis, one capacitive-load search per loop and
/// threshold.
/// </summary>
public sealed class StabilityAnalysesSharingTests
{
    [Theory]
    [InlineData("stability/follower-driving-cable.yaml")]
    [InlineData("stability/line-driver-beyond-stated-load.yaml")]
    public void Every_amplifier_has_exactly_one_loop_and_every_reader_gets_the_same_analyses(string fixture)
    {
        var design = DesignLoader.LoadFiles([RuleFixture.Path(fixture)]).Designs.Single();
        var analyses = new DesignAnalyses(design, Model.MonteCarloSettings.Default, new NoFailures());

        var loops = analyses.LoopGains;
        Assert.Same(loops, analyses.LoopGains);
        Assert.Same(analyses.Steps, analyses.Steps);
        var amplifiers = loops.Chain.Stages.SelectMany(s => s.Amplifiers).Select(a => a.ElementId).ToList();
        Assert.NotEmpty(amplifiers);
        Assert.Equal(amplifiers, loops.Loops.Select(l => l.ElementId));
        foreach (var loop in loops.Loops)
        {
            Assert.Same(analyses.CapacitiveLoad(loop, 45), analyses.CapacitiveLoad(loop, 45));
        }
    }

    private sealed class NoFailures : IAnalysisFailures
    {
        public void Failed(string analysis, SimulationFailure failure, ElaboratedChain chain) =>
            throw new Xunit.Sdk.XunitException($"{analysis} failed: {failure}");

        public void Unsettled(BandEnd end, SettledTransient steady)
        {
        }
    }
}
