namespace DesignRules.Rules.Tests.Loading;

/// <summary>Loading rules: output current, source impedance, high-impedance outputs and loading between stages.</summary>
public sealed class LoadingRuleTests
{
    [Theory]
    [InlineData("loading/output-current-heavy-load.yaml")]
    [InlineData("loading/output-current-light-load.yaml")]
    [InlineData("loading/source-impedance-inverting.yaml")]
    [InlineData("loading/source-impedance-follower.yaml")]
    [InlineData("loading/high-impedance-output-biased-load.yaml")]
    [InlineData("loading/high-impedance-output-ground-load.yaml")]
    [InlineData("loading/high-impedance-output-netlist.yaml")]
    [InlineData("loading/high-impedance-output-unbuffered-peak.yaml")]
    [InlineData("loading/interstage-unbuffered-average.yaml")]
    [InlineData("loading/interstage-buffered-average.yaml")]
    [InlineData("loading/interstage-unbuffered-average-into-load.yaml")]
    public void Each_fixture_yields_exactly_its_stated_loading_findings(string fixture) => RuleFixture.Verify(fixture);
}
