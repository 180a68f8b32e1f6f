using DesignRules.Elaboration;
using DesignRules.Figures;
using DesignRules.Figures.Tolerance;
using DesignRules.Loading;
using DesignRules.Model;
using DesignRules.Rules.Evaluation;
using DesignRules.Simulation;

namespace DesignRules.Rules.Tests.Tolerance;

/// <summary>
/// The resistor-tolerance corner runs of the example's compressor chain (a preamp, an absolute-value rectifier, a 0.2 s
/// averaging filter; a band of 10 Hz..2 kHz, so every corner runs at both ends): run side by side they come back in the
/// corners' order with the bits of a run alone, and started from the nominal run's settled state they settle where a run
/// from the operating point settles, within the settling criterion.
/// </summary>
public sealed class CornerRunTests
{
    private static DesignAnalyses Compressor()
    {
        var root = Path.Combine(RuleFixture.RepositoryRoot(), "example-design");
        var files = RepositoryFiles.Find([root], out _).Order(StringComparer.Ordinal).ToList();
        var design = DesignLoader.LoadFiles(files).Designs.Single(d => d.Id.Value == "compressor-vibration-envelope");
        return new DesignEvaluation(design, RuleSet.Default).Analyses;
    }

    private static ElaboratedChain CornerChain(DesignAnalyses analyses, CornerRun run) =>
        ChainElaborator.Elaborate(analyses.Design, analyses.Chain(run.End).Options with { Values = run.Corner.Values });

    [Fact]
    public void Corner_runs_side_by_side_come_back_in_the_corners_order_with_the_bits_of_a_run_alone()
    {
        var analyses = Compressor();
        var runs = analyses.CornerRuns;

        // Four corners (gain high and low, every resistor low and high), each at the top and then the bottom band end.
        Assert.Equal(8, runs.Count);
        Assert.Equal(
            ["gain-high corner", "gain-high corner", "gain-low corner", "gain-low corner", "all-resistors-low corner", "all-resistors-low corner", "all-resistors-high corner", "all-resistors-high corner"],
            runs.Select(r => r.Corner.Name));
        Assert.Equal(Enumerable.Range(0, 8).Select(i => i % 2 == 0 ? BandEnd.Top : BandEnd.Bottom), runs.Select(r => r.End));

        foreach (var run in runs)
        {
            var alone = PeriodicSteadyState.RunFrom(CornerChain(analyses, run), SteadyStateLimits.Default, analyses.Steady(run.End));
            Assert.True(alone.Settled);
            Assert.Equal(alone.Window, run.Chain.Window);
            Assert.Equal(alone.Result.Time, run.Transient.Time);
            foreach (var node in run.Transient.Nodes)
            {
                Assert.Equal(alone.Result.Voltage(node), run.Transient.Voltage(node));
            }
        }
    }

    [Fact]
    public void A_corner_started_from_the_nominal_steady_state_settles_where_a_cold_start_settles()
    {
        var analyses = Compressor();
        foreach (var run in analyses.CornerRuns)
        {
            var chain = CornerChain(analyses, run);
            var cold = PeriodicSteadyState.Run(chain, SteadyStateLimits.Default);
            Assert.True(cold.Settled);

            foreach (var stage in chain.Stages)
            {
                // Each run is settled when the drift still to come of every stage output's period average is within
                // max(0.1 % of the node's excursion, 10 µV) (SteadyStateLimits.Default): each lies within that of the
                // periodic steady state, so the two lie within twice that of each other, in the average and in the extremes.
                var warmStats = Statistics(run.Transient, run.Chain.Window, stage.OutputNode);
                var coldStats = Statistics(cold.Result, cold.Window, stage.OutputNode);
                double allowed = 2 * Math.Max(1e-3 * Math.Max(coldStats.Excursion, warmStats.Excursion), 10e-6);
                Assert.True(Math.Abs(warmStats.Average - coldStats.Average) <= allowed, $"{run.Corner.Name} {run.End} {stage.OutputNode} average: {warmStats.Average} vs {coldStats.Average}");
                Assert.True(Math.Abs(warmStats.Max - coldStats.Max) <= allowed, $"{run.Corner.Name} {run.End} {stage.OutputNode} maximum: {warmStats.Max} vs {coldStats.Max}");
                Assert.True(Math.Abs(warmStats.Min - coldStats.Min) <= allowed, $"{run.Corner.Name} {run.End} {stage.OutputNode} minimum: {warmStats.Min} vs {coldStats.Min}");
            }
        }
    }

    [Fact]
    public void A_warm_start_needs_fewer_periods_than_a_cold_start()
    {
        // What the warm start is for: a corner's first run starts next to its steady state, where a cold start has to
        // fill the 0.2 s averaging filter first.
        var analyses = Compressor();
        int warm = 0, cold = 0;
        foreach (var run in analyses.CornerRuns)
        {
            var chain = CornerChain(analyses, run);
            warm += PeriodicSteadyState.RunFrom(chain, SteadyStateLimits.Default, analyses.Steady(run.End)).Periods;
            cold += PeriodicSteadyState.Run(chain, SteadyStateLimits.Default).Periods;
        }

        Assert.True(warm < cold, $"{warm} periods warm against {cold} cold");
    }

    private static (double Average, double Max, double Min, double Excursion) Statistics(TransientResult result, TransientWindow window, string node)
    {
        var time = result.Time;
        var v = result.Voltage(node);
        double max = double.NegativeInfinity, min = double.PositiveInfinity, excursion = 0;
        for (int i = 0; i < time.Count; i++)
        {
            if (time[i] < window.MeasureFrom) continue;
            max = Math.Max(max, v[i]);
            min = Math.Min(min, v[i]);
            excursion = Math.Max(excursion, Math.Abs(v[i]));
        }

        return (MeasurementWindow.Average(time, v, window.MeasureFrom, window.StopTime), max, min, excursion);
    }
}
