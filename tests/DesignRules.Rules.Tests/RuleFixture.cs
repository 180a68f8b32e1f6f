using System.Reflection;
using System.Text.RegularExpressions;
using DesignRules.Model;
using DesignRules.Rules;

namespace DesignRules.Rules.Tests;

/// <summary>
/// Runs rule fixtures. A fixture is a design file whose first lines state what it must produce:
/// <c># expect: DR101 error at 31:16</c> (one line per expected finding) or <c># expect: clean DR101</c>
/// (the rule must not fire). The stated findings are all of them: a finding no line states fails the fixture, so a
/// new finding, true or not, is seen and judged. Fixtures live under Fixtures/&lt;category&gt;/ and are copied beside the
/// tests.
/// </summary>
internal static partial class RuleFixture
{
    public static string Path(string relative) => System.IO.Path.Combine(AppContext.BaseDirectory, "Fixtures", relative);

    public static string RepositoryRoot() =>
        typeof(RuleFixture).Assembly.GetCustomAttributes<AssemblyMetadataAttribute>().Single(a => a.Key == "RepositoryRoot").Value!;

    /// <summary>Checks one fixture file against its expectations and returns the report for further asserts.</summary>
    public static CheckReport Verify(string relative, string? ruleSet = null)
    {
        var file = Path(relative);
        var report = DesignCheck.Run([file], new CheckOptions(ruleSet is null ? null : Path(ruleSet), new DateOnly(2026, 12, 1)));
        var expectations = File.ReadLines(file).TakeWhile(l => l.StartsWith('#')).Select(l => Expectation().Match(l)).Where(m => m.Success).ToList();
        Assert.True(expectations.Count > 0, $"{relative}: no '# expect:' line");
        foreach (var e in expectations)
        {
            var id = e.Groups["id"].Value;
            if (e.Groups["clean"].Success)
            {
                Assert.True(report.Findings.All(f => f.RuleId != id), $"{relative}: {id} fired:\n" + Describe(report));
                continue;
            }

            var severity = Enum.Parse<DesignRules.Diagnostics.Severity>(e.Groups["severity"].Value, ignoreCase: true);
            var line = int.Parse(e.Groups["line"].Value);
            var col = int.Parse(e.Groups["col"].Value);
            Assert.True(
                report.Findings.Any(f => f.RuleId == id && f.Severity == severity && f.Span.Line == line && f.Span.Column == col),
                $"{relative}: expected {id} {severity} at {line}:{col}; got:\n" + Describe(report));
        }

        var stated = expectations.Where(e => !e.Groups["clean"].Success)
            .Select(e => (e.Groups["id"].Value, e.Groups["severity"].Value, int.Parse(e.Groups["line"].Value), int.Parse(e.Groups["col"].Value)))
            .ToHashSet();
        var unstated = report.Findings
            .Where(f => !stated.Contains((f.RuleId, f.Severity.ToString().ToLowerInvariant(), f.Span.Line, f.Span.Column)))
            .ToList();
        Assert.True(unstated.Count == 0, $"{relative}: findings no '# expect:' line states:\n" + string.Join('\n', unstated.Select(f => $"  {f.RuleId} {f.Severity} {f.Span.Line}:{f.Span.Column} {f.Message}")));

        Assert.DoesNotContain(report.Findings, f => f.RuleId.StartsWith("DR9", StringComparison.Ordinal));
        // Every argument the catalogue message declares was given: no '{name}' placeholder is left in any message.
        Assert.All(report.Findings, f => Assert.False(LeftPlaceholder().IsMatch(f.Message), $"{relative}: {f.RuleId} left a placeholder: {f.Message}"));
        return report;
    }

    public static string Describe(CheckReport report) =>
        string.Join('\n', report.Findings.Select(f => $"  {f.RuleId} {f.Severity} {f.Span.Line}:{f.Span.Column} {f.Message}"));

    [GeneratedRegex(@"\{[a-z0-9-]+\}", RegexOptions.CultureInvariant)]
    private static partial Regex LeftPlaceholder();

    [GeneratedRegex(@"^# expect: (?:(?<clean>clean) (?<id>DR\d{3})|(?<id>DR\d{3}) (?<severity>error|warning|note) at (?<line>\d+):(?<col>\d+))\s*$")]
    private static partial Regex Expectation();
}
