namespace DesignRules.Rules.Tests.Hygiene;

/// <summary>Value hygiene: preferred values and requirements that no rule checks.</summary>
public sealed class HygieneRuleTests
{
    [Theory]
    [InlineData("hygiene/preferred-values.yaml")]
    [InlineData("hygiene/off-series-value.yaml")]
    [InlineData("hygiene/glitch-on-linear-stage.yaml")]
    [InlineData("hygiene/yield-without-accuracy.yaml")]
    public void Each_fixture_yields_exactly_its_stated_hygiene_findings(string fixture) => RuleFixture.Verify(fixture);

    [Fact]
    public void An_off_series_value_names_the_nearest_E24_value()
    {
        var report = RuleFixture.Verify("hygiene/off-series-value.yaml");
        var finding = Assert.Single(report.Findings, f => f.RuleId == "DR701");
        // IEC 60063 E24: the decade 20..22 holds 20 and 22; 20.5k is nearest 20k.
        Assert.Contains("nearest is 20 kΩ", finding.Message, StringComparison.Ordinal);
    }
}
