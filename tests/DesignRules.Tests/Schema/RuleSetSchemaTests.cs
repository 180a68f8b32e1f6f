namespace DesignRules.Tests.Schema;

/// <summary>The rule-set file's schema accepts what the loader accepts: every section optional, levels and thresholds.</summary>
public sealed class RuleSetSchemaTests
{
    [Theory]
    [InlineData("rules:\n  DR702: off\n")]
    [InlineData("designs:\n  front-end:\n    stages:\n      gain: { DR103: { max-fraction: 2% } }\n")]
    [InlineData("rule-set:\n  monte-carlo: { samples: 1000, seed: 20261202, distribution: uniform }\n")]
    [InlineData("rule-set:\nrules: { DR301: { derating: 70%, severity: note } }\n")]
    public void Files_the_loader_reads_clean_are_valid(string yaml)
    {
        var (_, problems) = DesignRules.Loading.RuleSetLoader.Read("design-rules.yaml", yaml);
        Assert.Empty(problems);
        var results = SchemaCheck.Evaluate(SchemaCheck.RuleSet, YamlAsJson.Convert(yaml));
        Assert.True(results.IsValid, SchemaCheck.Describe(results));
    }

    [Theory]
    [InlineData("rules:\n  DR702: loud\n")]
    [InlineData("rules:\n  DR906: off\n")]
    [InlineData("rules:\n  DR301: { derating: 70 V }\n")]
    [InlineData("rule-set:\n  monte-carlo: { samples: 5 }\n")]
    [InlineData("rulez: {}\n")]
    public void Files_the_loader_refuses_are_invalid(string yaml)
    {
        var (_, problems) = DesignRules.Loading.RuleSetLoader.Read("design-rules.yaml", yaml);
        Assert.NotEmpty(problems);
        Assert.False(SchemaCheck.Evaluate(SchemaCheck.RuleSet, YamlAsJson.Convert(yaml)).IsValid, yaml);
    }

    [Fact]
    public void The_example_rule_set_file_is_valid()
    {
        var yaml = File.ReadAllText(SchemaTestFiles.InRepository("example-design", "design-rules.yaml"));
        var results = SchemaCheck.Evaluate(SchemaCheck.RuleSet, YamlAsJson.Convert(yaml));
        Assert.True(results.IsValid, SchemaCheck.Describe(results));
    }
}
