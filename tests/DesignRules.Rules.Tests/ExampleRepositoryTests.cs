using DesignRules.Diagnostics;
using DesignRules.Loading;

namespace DesignRules.Rules.Tests;

/// <summary>The example hardware repository is evaluated with no errors, and its warnings are explained in its README.</summary>
public sealed class ExampleRepositoryTests
{
    internal static CheckReport Check()
    {
        var root = Path.Combine(RuleFixture.RepositoryRoot(), "example-design");
        var files = RepositoryFiles.Find([root], out _);
        var ruleSet = Path.Combine(root, RuleSetLoader.DefaultFileName);
        return DesignCheck.Run(files, new CheckOptions(File.Exists(ruleSet) ? ruleSet : null, new DateOnly(2026, 12, 1)));
    }

    [Fact]
    public void Designs_checked_side_by_side_come_out_in_file_order_with_the_findings_of_a_check_one_at_a_time()
    {
        var root = Path.Combine(RuleFixture.RepositoryRoot(), "example-design");
        var files = RepositoryFiles.Find([root], out _);
        var options = new CheckOptions(Path.Combine(root, RuleSetLoader.DefaultFileName), new DateOnly(2026, 12, 1));
        var alone = DesignCheck.Run(files, options with { MaxDegreeOfParallelism = 1 });
        var side = DesignCheck.Run(files, options with { MaxDegreeOfParallelism = 2 });
        Assert.True(alone.Designs.Count > 2);

        // File order (by path), whichever design finished first.
        Assert.Equal(alone.Designs.Select(d => d.Design.File).Order(StringComparer.Ordinal), alone.Designs.Select(d => d.Design.File));
        Assert.Equal(alone.Designs.Select(d => d.Design.File), side.Designs.Select(d => d.Design.File));
        static string Describe(Finding f) => $"{f.Span.File}({f.Span.Line},{f.Span.Column}) {f.RuleId} {f.Message}";
        Assert.Equal(alone.Findings.Select(Describe), side.Findings.Select(Describe));
        Assert.Equal(
            alone.Designs.SelectMany(d => d.StageFigures.SelectMany(s => s.Value.Select(f => $"{s.Key} {f.Key} {f.Value:R}"))),
            side.Designs.SelectMany(d => d.StageFigures.SelectMany(s => s.Value.Select(f => $"{s.Key} {f.Key} {f.Value:R}"))));
    }

    [Fact]
    public void The_example_designs_are_evaluated_with_no_errors()
    {
        var report = Check();
        Assert.True(report.DesignCount >= 3, $"{report.DesignCount} designs");
        Assert.True(report.ErrorCount == 0, RuleFixture.Describe(report));
    }

    [Fact]
    public void No_finding_of_the_examples_leaves_a_placeholder_in_its_message()
    {
        var report = Check();
        Assert.All(report.Findings, f => Assert.DoesNotMatch(@"\{[a-z0-9-]+\}", f.Message));
    }

    [Fact]
    public void Every_warning_of_the_examples_is_explained_in_their_README()
    {
        var readme = File.ReadAllText(Path.Combine(RuleFixture.RepositoryRoot(), "example-design", "README.md"));
        foreach (var warning in Check().Findings.Where(f => f.Severity == Severity.Warning && !f.IsWaived))
        {
            Assert.Contains(warning.RuleId, readme, StringComparison.Ordinal);
        }
    }

    [Fact]
    public void Two_runs_give_the_same_findings_and_figures()
    {
        var a = Check();
        var b = Check();
        Assert.Equal(RuleFixture.Describe(a), RuleFixture.Describe(b));
        Assert.Equal(
            a.Designs.SelectMany(d => d.StageFigures).SelectMany(s => s.Value).Select(f => $"{f.Name}={f.Value:R}"),
            b.Designs.SelectMany(d => d.StageFigures).SelectMany(s => s.Value).Select(f => $"{f.Name}={f.Value:R}"));
    }
}
