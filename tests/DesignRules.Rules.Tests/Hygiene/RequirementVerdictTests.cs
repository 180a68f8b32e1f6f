using DesignRules.Rules.Evaluation;

namespace DesignRules.Rules.Tests.Hygiene;

/// <summary>
/// A requirement is "met" only where a rule of the requirement table judged it: nothing a page or report shows as met was
/// left unchecked.
/// </summary>
public sealed class RequirementVerdictTests
{
    public static TheoryData<string> Designs()
    {
        var data = new TheoryData<string>();
        foreach (var file in Directory.EnumerateFiles(Path.Combine(RuleFixture.RepositoryRoot(), "example-design", "designs"), "*.yaml").Order(StringComparer.Ordinal))
        {
            data.Add(file);
        }

        foreach (var fixture in new[] { "hygiene/glitch-on-linear-stage.yaml", "hygiene/yield-without-accuracy.yaml", "filters/sallen-key-cutoff-1pct-capacitors.yaml" })
        {
            data.Add(RuleFixture.Path(fixture));
        }

        return data;
    }

    [Theory]
    [MemberData(nameof(Designs))]
    public void Every_met_requirement_was_judged_by_a_rule_the_table_names_for_it(string file)
    {
        var report = DesignCheck.Run([file], new CheckOptions(null, new DateOnly(2026, 12, 1)));
        Assert.NotEmpty(report.Designs.SelectMany(d => d.Requirements));
        foreach (var verdict in report.Designs.SelectMany(d => d.Requirements).Where(v => v.Verdict == "met"))
        {
            Assert.NotEmpty(verdict.JudgedBy);
            Assert.All(verdict.JudgedBy, rule => Assert.Contains(rule, RequirementTable.Rules[verdict.Name]));
        }
    }

    [Fact]
    public void A_glitch_requirement_on_a_linear_stage_is_not_checked_and_says_so()
    {
        // No rule judges a zero-crossing glitch on a stage that does not rectify: the verdict must say "not checked", and DR702
        // must name it, never "met".
        var report = DesignCheck.Run([RuleFixture.Path("hygiene/glitch-on-linear-stage.yaml")], new CheckOptions(null, new DateOnly(2026, 12, 1)));
        var glitch = Assert.Single(report.Designs.SelectMany(d => d.Requirements), v => v.Name == "glitch");
        Assert.Equal("not checked", glitch.Verdict);
        Assert.Empty(glitch.JudgedBy);
        Assert.Contains(report.Findings, f => f.RuleId == "DR702" && f.Message.Contains("`glitch`", StringComparison.Ordinal));
    }

    [Fact]
    public void Every_requirement_kind_of_the_table_names_at_least_one_rule_of_the_catalogue()
    {
        var catalogue = DesignRules.Diagnostics.RuleCatalogue.Default.Rules.Select(r => r.Id).ToHashSet(StringComparer.Ordinal);
        Assert.All(RequirementTable.All, kind =>
        {
            Assert.NotEmpty(kind.Rules);
            Assert.All(kind.Rules, id => Assert.Contains(id, catalogue));
        });
        Assert.Equal(RequirementTable.All.Count, RequirementTable.All.Select(k => k.Key).Distinct(StringComparer.Ordinal).Count());
    }
}
