namespace DesignRules.Rules.Tests.Stress;

/// <summary>Stress rules: resistor power, diode reverse voltage and forward current against derated ratings.</summary>
public sealed class StressRuleTests
{
    [Theory]
    [InlineData("stress/resistor-power-dc.yaml")]
    [InlineData("stress/resistor-power-dc-light.yaml")]
    [InlineData("stress/resistor-power-sine.yaml")]
    [InlineData("stress/diode-reverse-schottky-peak-hold.yaml")]
    [InlineData("stress/diode-reverse-silicon-peak-hold.yaml")]
    [InlineData("stress/diode-forward-current-heavy.yaml")]
    [InlineData("stress/diode-forward-current-light.yaml")]
    public void Each_fixture_yields_exactly_its_stated_stress_findings(string fixture) => RuleFixture.Verify(fixture);
}
