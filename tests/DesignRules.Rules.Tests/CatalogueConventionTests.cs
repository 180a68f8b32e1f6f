using DesignRules.Diagnostics;
using DesignRules.Figures;
using DesignRules.Rules.Evaluation;

namespace DesignRules.Rules.Tests;

/// <summary>The catalogue, the rule classes and the help pages stay in step.</summary>
public sealed class CatalogueConventionTests
{
    [Fact]
    public void Every_rule_in_the_catalogue_has_a_unique_id_of_the_form_DR_and_three_digits()
    {
        var ids = RuleCatalogue.Default.Rules.Select(r => r.Id).ToList();
        Assert.All(ids, id => Assert.Matches("^DR[0-9]{3}$", id));
        Assert.Equal(ids.Count, ids.Distinct().Count());
    }

    [Fact]
    public void Every_rule_in_the_catalogue_has_a_help_page_that_says_why_and_how_to_fix()
    {
        foreach (var rule in RuleCatalogue.Default.Rules)
        {
            var page = Path.Combine(RuleFixture.RepositoryRoot(), rule.HelpPage);
            Assert.True(File.Exists(page), $"{rule.Id}: no help page at {rule.HelpPage}");
            var text = File.ReadAllText(page);
            Assert.StartsWith($"# {rule.Id}: {rule.Title}", text, StringComparison.Ordinal);
            Assert.Contains("## Why this rule exists", text, StringComparison.Ordinal);
            Assert.Contains("## How to fix it", text, StringComparison.Ordinal);
        }
    }

    [Fact]
    public void Every_catalogue_rule_outside_the_design_file_group_has_exactly_one_rule_class_and_vice_versa()
    {
        // DR703 and DR704 are outcomes of applying waivers, not rules over a design; Waivers implements them.
        var catalogue = RuleCatalogue.Default.Rules.Where(r => r.Category != "design-file" && r.Id != RuleIds.ExpiredWaiver && r.Id != RuleIds.UnmatchedWaiver)
            .Select(r => r.Id).Order().ToList();
        var classes = RuleRegistry.All.Select(r => r.Id.Value).ToList();
        Assert.Equal(classes.Count, classes.Distinct().Count());
        Assert.Equal(catalogue, classes.Order().ToList());
    }

    [Fact]
    public void Every_message_placeholder_is_a_word_and_every_threshold_has_a_description()
    {
        foreach (var rule in RuleCatalogue.Default.Rules)
        {
            Assert.False(string.IsNullOrWhiteSpace(rule.MessageFormat), rule.Id);
            Assert.All(rule.Thresholds, t => Assert.False(string.IsNullOrWhiteSpace(t.Description), $"{rule.Id}.{t.Name}"));
        }
    }
}
