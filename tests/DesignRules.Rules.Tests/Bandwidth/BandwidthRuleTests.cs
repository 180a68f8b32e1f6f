namespace DesignRules.Rules.Tests.Bandwidth;

/// <summary>Bandwidth rules: closed-loop bandwidth and gain error at the band top, precision-rectifier loop gain.</summary>
public sealed class BandwidthRuleTests
{
    [Theory]
    [InlineData("bandwidth/closed-loop-gain-100-slow-amplifier.yaml")]
    [InlineData("bandwidth/closed-loop-gain-2.yaml")]
    [InlineData("bandwidth/bandwidth-requirement-not-met.yaml")]
    [InlineData("bandwidth/noise-gain-10-inverting.yaml")]
    [InlineData("bandwidth/noise-gain-10-non-inverting.yaml")]
    [InlineData("bandwidth/rectifier-slow-amplifier-20khz.yaml")]
    [InlineData("bandwidth/rectifier-fast-amplifier-1khz.yaml")]
    public void Each_fixture_yields_exactly_its_stated_bandwidth_findings(string fixture) => RuleFixture.Verify(fixture);
}
