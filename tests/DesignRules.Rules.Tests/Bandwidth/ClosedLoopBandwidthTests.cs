namespace DesignRules.Rules.Tests.Bandwidth;

/// <summary>DR501's recorded closed-loop bandwidth agrees with the single-pole textbook figure GBW / noise gain.</summary>
public sealed class ClosedLoopBandwidthTests
{
    [Theory]
    [InlineData("bandwidth/noise-gain-10-inverting.yaml")]
    [InlineData("bandwidth/noise-gain-10-non-inverting.yaml")]
    public void The_closed_loop_bandwidth_is_the_gain_bandwidth_over_the_noise_gain(string fixture)
    {
        var report = DesignCheck.Run([RuleFixture.Path(fixture)], new CheckOptions(null, new DateOnly(2026, 12, 1)));
        var figures = Assert.Single(report.Designs).StageFigures.Single(s => s.Key == "gain").Value;
        var bandwidth = figures.Single(f => f.Name == "closed-loop bandwidth").Value;

        // Textbook single-pole amplifier: f(-3 dB) = GBW / noise gain = 1.2 MHz (the part's gbw, built-in library) / (1 + 90k/10k) = 120 kHz.
        const double expected = 1.2e6 / 10;
        Assert.InRange(bandwidth, expected * 0.95, expected * 1.05);
    }

    [Fact]
    public void A_chain_level_bandwidth_requirement_is_checked_on_the_whole_chain() =>
        RuleFixture.Verify("bandwidth/chain-bandwidth-requirement.yaml");
}
