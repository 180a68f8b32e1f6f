namespace DesignRules.Rules.Tests.Slew;

/// <summary>DR102 judges a slewing event against the slowest slew rate over the design's range, as DR101 does, and names that end.</summary>
public sealed class SlewDemandDeratingTests
{
    [Fact]
    public void A_follower_that_keeps_up_with_its_edges_at_25_C_is_clean()
    {
        var report = RuleFixture.Verify("slew/edge-derated-at-25-only.yaml");
        var demand = Demand(report);

        // A follower must follow the square's edge: 2 V span over its 3.6 µs rise time = 0.556 V/µs (the slope of a
        // linear ramp), against the class's 0.6 V/µs at 25 °C.
        Assert.InRange(demand.Value, 2 / 3.6e-6 * 0.98, 2 / 3.6e-6 * 1.02);
        Assert.Equal(0.6e6, demand.Limit!.Value, 1e-3);
        Assert.Null(demand.Temperature);
    }

    [Fact]
    public void The_same_follower_over_0_to_85_C_fails_at_the_hot_end_where_its_derated_slew_rate_is_slowest()
    {
        var report = RuleFixture.Verify("slew/edge-derated-hot-end-fails.yaml");
        var finding = Assert.Single(report.Findings, f => f.RuleId == Diagnostics.RuleIds.SlewDemand);
        Assert.Contains("0.528 V/µs at 85 °C", finding.Message, StringComparison.Ordinal);

        // The slew rate derated by hand: 0.6 V/µs × (1 − 0.002 × (85 − 25)) = 0.528 V/µs at 85 °C, below the edge's
        // 2 V / 3.6 µs = 0.556 V/µs.
        var demand = Demand(report);
        Assert.Equal(0.528e6, demand.Limit!.Value, 1e-3);
        Assert.Equal(85, demand.Temperature);
        Assert.True(demand.Value > demand.Limit.Value);
    }

    private static Figure Demand(CheckReport report) =>
        report.Designs.Single().StageFigures.Single(s => s.Key == "buffer").Value.Single(f => f.Key == FigureKinds.SlewDemand.At("buffer.out"));
}
