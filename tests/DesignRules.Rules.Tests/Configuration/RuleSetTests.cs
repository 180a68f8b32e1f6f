using DesignRules.Loading;
using DesignRules.Model;

namespace DesignRules.Rules.Tests.Configuration;

/// <summary>The rule-set file changes levels and thresholds per rule, design and stage, and sets Monte Carlo.</summary>
public sealed class RuleSetTests
{
    [Fact]
    public void A_stage_setting_overrides_the_global_one()
    {
        var report = DesignCheck.Run([RuleFixture.Path("hygiene/off-series-value.yaml")],
            new CheckOptions(RuleFixture.Path("rule-sets/quiet-hygiene.yaml"), new DateOnly(2026, 12, 1)));
        Assert.DoesNotContain(report.Findings, f => f.RuleId == "DR701");
    }

    [Fact]
    public void A_global_setting_raises_a_warning_to_an_error()
    {
        var (ruleSet, diagnostics) = RuleSetLoader.Load(RuleFixture.Path("rule-sets/quiet-hygiene.yaml"));
        Assert.Empty(diagnostics);
        Assert.Equal(RuleLevel.Error, ruleSet.Rules["DR701"].Level!.Value);
        Assert.Equal(new MonteCarloSettings(200, 7, ToleranceDistribution.Uniform), ruleSet.MonteCarlo);
    }

    [Fact]
    public void Mistakes_in_the_rule_set_file_are_located_diagnostics()
    {
        var (_, diagnostics) = RuleSetLoader.Load(RuleFixture.Path("rule-sets/bad-rule-set.yaml"));
        Assert.Contains(diagnostics, d => d.Id == "DR905" && d.Span.Line == 2);                    // samples below 10
        Assert.Contains(diagnostics, d => d.Id == "DR914" && d.Span.Line == 4 && d.Message.Contains("DR701", StringComparison.Ordinal));
        Assert.Contains(diagnostics, d => d.Id == "DR914" && d.Span.Line == 5 && d.Message.Contains("loud", StringComparison.Ordinal));
        Assert.Contains(diagnostics, d => d.Id == "DR901" && d.Span.Line == 5 && d.Message.Contains("derating", StringComparison.Ordinal));
    }

    [Theory]
    [InlineData("rules:\n  DR702: off\n")]
    [InlineData("designs:\n  any-design:\n    rules: { DR702: off }\n")]
    [InlineData("rule-set:\n")]
    public void Every_section_of_the_rule_set_file_is_optional(string yaml)
    {
        var (ruleSet, diagnostics) = RuleSetLoader.Read("design-rules.yaml", yaml);
        Assert.Empty(diagnostics);
        Assert.Equal(MonteCarloSettings.Default, ruleSet.MonteCarlo);
    }
}
