namespace DesignRules.Rules.Tests.Hygiene;

/// <summary>Value hygiene: preferred values and requirements that no rule checks.</summary>
public sealed class HygieneRuleTests
{
    [Theory]
    [InlineData("hygiene/preferred-values.yaml")]
    [InlineData("hygiene/off-series-value.yaml")]
    [InlineData("hygiene/glitch-on-linear-stage.yaml")]
    [InlineData("hygiene/yield-without-accuracy.yaml")]
    [InlineData("hygiene/capacitor-off-series.yaml")]
    [InlineData("hygiene/noise-without-band.yaml")]
    public void Each_fixture_yields_exactly_its_stated_hygiene_findings(string fixture) => RuleFixture.Verify(fixture);

    [Fact]
    public void An_off_series_value_names_the_nearest_E24_value()
    {
        var report = RuleFixture.Verify("hygiene/off-series-value.yaml");
        var finding = Assert.Single(report.Findings, f => f.RuleId == "DR701");
        // IEC 60063 E24: the decade 20..22 holds 20 and 22; 20.5k is nearest 20k.
        Assert.Contains("nearest is 20 kΩ", finding.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void An_off_series_capacitor_names_the_nearest_E12_value()
    {
        var report = RuleFixture.Verify("hygiene/capacitor-off-series.yaml");
        var finding = Assert.Single(report.Findings, f => f.RuleId == "DR710");
        // IEC 60063 E12: the decade 18..22 holds 18 and 22; 20n lies nearer 22n in the log sense (≈0.041 vs ≈0.046 decades),
        // and 10n is an E12 value, so only c1 is reported.
        Assert.Contains("`antialias.c1`", finding.Message, StringComparison.Ordinal);
        Assert.Contains("nearest is 22 nF", finding.Message, StringComparison.Ordinal);
    }
}
