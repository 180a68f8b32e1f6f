using System.Reflection;
using System.Text.RegularExpressions;
using DesignRules.Diagnostics;
using DesignRules.Elaboration;
using DesignRules.Loading;
using DesignRules.Figures;
using DesignRules.Rules.Evaluation;
using DesignRules.Simulation;

namespace DesignRules.Rules.Tests;

/// <summary>
/// People read messages in our own words: no enum member name (a code name such as a failure kind) appears in any
/// message, help page, template or string the tool prints.
/// </summary>
public sealed partial class MessageWordingTests
{
    private static readonly Assembly[] Libraries =
    [
        typeof(RuleCatalogue).Assembly, typeof(Circuit).Assembly, typeof(ChainElaborator).Assembly, typeof(DesignCheck).Assembly,
    ];

    /// <summary>Every member name of every enum in the libraries that is not a plain English word (two words run together, or a digit).</summary>
    private static IReadOnlyList<string> CodeNames() =>
        [.. Libraries.SelectMany(a => a.GetTypes()).Where(t => t.IsEnum).SelectMany(Enum.GetNames)
            .Where(n => CompoundName().IsMatch(n)).Distinct().Order(StringComparer.Ordinal)];

    private static List<string> CodeNamesIn(string text) =>
        [.. CodeNames().Where(n => Regex.IsMatch(text, $@"\b{n}\b", RegexOptions.CultureInvariant))];

    [Fact]
    public void The_list_of_code_names_holds_the_failure_kinds() =>
        Assert.Contains(nameof(FailureKind.StepShrank), CodeNames());

    [Fact]
    public void No_failure_kind_reaches_the_analysis_failed_message_by_its_enum_name()
    {
        foreach (var kind in Enum.GetValues<FailureKind>())
        {
            var failure = new SimulationFailure(kind, "a reason") { ElementId = "rect.u1", Node = "rect.sum", Time = 12.5e-6 };
            var message = DesignEvaluation.FailureMessage("transient", "vibration-envelope", failure);
            Assert.DoesNotContain(kind.ToString(), message, StringComparison.Ordinal);
            Assert.Contains(FailureWording.Name(kind), message, StringComparison.Ordinal);
            Assert.Contains(FailureWording.Advice(kind), message, StringComparison.Ordinal);
            Assert.Empty(CodeNamesIn(message));
        }
    }

    [Fact]
    public void Every_failure_kind_has_a_name_and_a_sentence_of_its_own()
    {
        var kinds = Enum.GetValues<FailureKind>();
        Assert.Equal(kinds.Length, kinds.Select(FailureWording.Name).Distinct().Count());
        Assert.Equal(kinds.Length, kinds.Select(FailureWording.Advice).Distinct().Count());
        Assert.All(kinds, k => Assert.EndsWith(".", FailureWording.Advice(k), StringComparison.Ordinal));
    }

    [Fact]
    public void No_string_literal_in_the_sources_spells_an_enum_member_name()
    {
        var root = RuleFixture.RepositoryRoot();
        var offenders = new List<string>();
        foreach (var file in Directory.EnumerateFiles(Path.Combine(root, "src"), "*.cs", SearchOption.AllDirectories))
        {
            var lines = File.ReadAllLines(file);
            for (int i = 0; i < lines.Length; i++)
            {
                var code = lines[i].TrimStart();
                if (code.StartsWith("//", StringComparison.Ordinal))
                {
                    continue;
                }

                foreach (Match literal in StringLiteral().Matches(code))
                {
                    offenders.AddRange(CodeNamesIn(literal.Value).Select(n => $"{Path.GetRelativePath(root, file)}({i + 1}): {n}"));
                }
            }
        }

        Assert.True(offenders.Count == 0, string.Join(Environment.NewLine, offenders));
    }

    [Fact]
    public void No_catalogue_message_help_page_template_or_README_spells_an_enum_member_name()
    {
        var root = RuleFixture.RepositoryRoot();
        var texts = RuleCatalogue.Default.Rules.Select(d => ($"catalogue {d.Id}", d.Title + " " + d.MessageFormat))
            .Concat(Directory.EnumerateFiles(Path.Combine(root, "rules"), "*.md").Select(f => (f, File.ReadAllText(f))))
            .Concat(Directory.EnumerateFiles(Path.Combine(root, "templates")).Select(f => (f, File.ReadAllText(f))))
            .Concat([("README.md", File.ReadAllText(Path.Combine(root, "README.md")))]);
        var offenders = texts.SelectMany(t => CodeNamesIn(t.Item2).Select(n => $"{t.Item1}: {n}")).ToList();
        Assert.True(offenders.Count == 0, string.Join(Environment.NewLine, offenders));
    }

    [Fact]
    public void No_finding_of_the_examples_or_of_a_bad_design_file_spells_an_enum_member_name()
    {
        var root = RuleFixture.RepositoryRoot();
        var example = Path.Combine(root, "example-design");
        var files = RepositoryFiles.Find([example], out _)
            .Concat(Directory.EnumerateFiles(Path.Combine(root, "tests", "DesignRules.Tests", "Fixtures", "loader", "bad"), "*.yaml"))
            .Concat(Directory.EnumerateFiles(Path.Combine(root, "tests", "DesignRules.Tests", "Fixtures", "schema", "reject"), "*.yaml"));
        var messages = new List<string>();
        foreach (var file in files)
        {
            messages.AddRange(DesignLoader.LoadFiles([file]).Diagnostics.Select(d => d.Message));
        }

        messages.AddRange(DesignCheck.Run(RepositoryFiles.Find([example], out _), new CheckOptions(null, new DateOnly(2026, 12, 1))).Findings.Select(f => f.Message));
        Assert.NotEmpty(messages);
        var offenders = messages.SelectMany(m => CodeNamesIn(m).Select(n => $"{n} in: {m}")).ToList();
        Assert.True(offenders.Count == 0, string.Join(Environment.NewLine, offenders));
    }

    [GeneratedRegex("^[A-Z][a-z]+[A-Z0-9]")]
    private static partial Regex CompoundName();

    [GeneratedRegex("\"(?:[^\"\\\\]|\\\\.)*\"")]
    private static partial Regex StringLiteral();
}
