using System.Text.RegularExpressions;
using DesignRules.Diagnostics;
using DesignRules.Loading;

namespace DesignRules.Rules.Tests;

/// <summary>
/// What the README offers to copy works: the minimal design loads and checks clean, the rule-set example loads without a
/// problem. (The long listing of every key is a reference, said to be one, not a file to paste.)
/// </summary>
public sealed partial class ReadmeExampleTests
{
    private static string Block(string marker)
    {
        var readme = File.ReadAllText(Path.Combine(RuleFixture.RepositoryRoot(), "README.md")).ReplaceLineEndings("\n");
        var match = Regex.Match(readme, "<!-- " + Regex.Escape(marker) + " -->\\s*```yaml\\n(.*?)```", RegexOptions.Singleline);
        Assert.True(match.Success, $"README has no yaml block after <!-- {marker} -->");
        return match.Groups[1].Value;
    }

    [Fact]
    public void The_minimal_design_of_the_README_checks_with_no_error_and_no_warning()
    {
        var root = Path.Combine(Path.GetTempPath(), "designrules-readme-" + Guid.NewGuid().ToString("N"));
        try
        {
            var file = Path.Combine(root, "designs", "line-driver.yaml");
            Directory.CreateDirectory(Path.GetDirectoryName(file)!);
            File.WriteAllText(file, Block("minimal-design"));
            var report = DesignCheck.Run([file], new CheckOptions(null, new DateOnly(2026, 12, 1)));
            Assert.Equal(1, report.DesignCount);
            Assert.True(report.ErrorCount == 0 && report.WarningCount == 0, RuleFixture.Describe(report));
        }
        finally
        {
            Directory.Delete(root, recursive: true);
        }
    }

    [Fact]
    public void The_rule_set_example_of_the_README_loads_without_a_problem()
    {
        var (_, diagnostics) = RuleSetLoader.Read("design-rules.yaml", Block("rule-set-example"));
        Assert.DoesNotContain(diagnostics, d => d.Severity == Severity.Error);
    }
}
