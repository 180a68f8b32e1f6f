using System.Reflection;
using System.Text.RegularExpressions;
using DesignRules.Diagnostics;
using DesignRules.Loading;
using DesignRules.Tests.Loading;
using DesignRules.Yaml;

namespace DesignRules.Tests.Conventions;

/// <summary>
/// Rule ids are typed and stable: one constant per catalogue entry and one entry per constant, every id in its
/// category's hundred, every released id keeping its title and category for ever, and no id spelt as a string
/// literal outside the catalogue, the constants and test data.
/// </summary>
public sealed partial class RuleIdTests
{
    private static IReadOnlyList<string> CatalogueIds => RuleCatalogue.Default.Rules.Select(r => r.Id).ToList();

    [Fact]
    public void Every_catalogue_id_has_a_constant_and_every_constant_is_a_catalogue_id()
    {
        var constants = RuleIds.All.Select(id => id.Value).ToList();
        Assert.Equal(constants.Count, constants.Distinct().Count());
        Assert.Equal(CatalogueIds.Order(StringComparer.Ordinal), constants.Order(StringComparer.Ordinal));
    }

    [Fact]
    public void Every_constant_is_a_public_static_readonly_field_named_in_words_not_digits()
    {
        var fields = typeof(RuleIds).GetFields(BindingFlags.Public | BindingFlags.Static).Where(f => f.FieldType == typeof(RuleId)).ToList();
        Assert.Equal(RuleIds.All.Count, fields.Count);
        Assert.All(fields, f =>
        {
            Assert.True(f.IsInitOnly, $"{f.Name} can be reassigned");
            Assert.DoesNotMatch("[0-9]", f.Name);
        });
    }

    [Theory]
    [InlineData("DR102", true)]
    [InlineData("DR1020", false)]
    [InlineData("dr102", false)]
    [InlineData("DR10", false)]
    [InlineData("", false)]
    public void A_rule_id_is_DR_and_three_digits(string text, bool wellFormed)
    {
        Assert.Equal(wellFormed, RuleId.IsWellFormed(text));
        if (!wellFormed)
        {
            Assert.Throws<ArgumentException>(() => RuleId.Parse(text));
        }
        else
        {
            Assert.Equal(text, (string)RuleId.Parse(text));
        }
    }

    [Fact]
    public void The_category_ranges_are_hundreds_in_order_without_overlap()
    {
        var ranges = RuleCategories.Ranges;
        Assert.Equal(ranges.Count, ranges.Select(r => r.Category).Distinct().Count());
        for (var i = 0; i < ranges.Count; i++)
        {
            Assert.Equal(0, ranges[i].First % 100);
            Assert.Equal(ranges[i].First + 99, ranges[i].Last);
            if (i > 0)
            {
                Assert.True(ranges[i].First > ranges[i - 1].Last, $"{ranges[i].Category} overlaps {ranges[i - 1].Category}");
            }
        }
    }

    [Fact]
    public void Every_catalogue_id_lies_in_the_range_of_its_category()
    {
        foreach (var rule in RuleCatalogue.Default.Rules)
        {
            Assert.True(RuleCategories.Ranges.Any(r => r.Category == rule.Category), $"{rule.Id}: category '{rule.Category}' has no range");
            Assert.Equal(rule.Category, RuleCategories.Of(RuleId.Parse(rule.Id)));
        }
    }

    [Fact]
    public void Every_catalogue_id_is_recorded_as_released_with_its_title_and_category()
    {
        var (released, _) = ReleasedIds();
        foreach (var rule in RuleCatalogue.Default.Rules)
        {
            Assert.True(released.TryGetValue(rule.Id, out var recorded), $"{rule.Id} is not in rules/released-ids.yaml; add it when it ships");
            Assert.Equal((recorded.Title, recorded.Category), (rule.Title, rule.Category));
        }
    }

    [Fact]
    public void A_released_id_keeps_its_meaning_and_is_never_dropped_without_being_retired()
    {
        var (released, retired) = ReleasedIds();
        foreach (var (id, recorded) in released)
        {
            Assert.True(RuleCatalogue.Default.TryGet(id, out var rule) && rule is not null,
                $"{id} ({recorded.Title}) was released and is gone from the catalogue; move it to 'retired:' with the reason");
            Assert.Equal(recorded.Category, rule!.Category);
            Assert.Equal(recorded.Title, rule.Title);
        }

        Assert.Empty(released.Keys.Intersect(retired));
    }

    [Fact]
    public void A_retired_id_is_never_reused_by_the_catalogue_or_a_constant()
    {
        var (_, retired) = ReleasedIds();
        Assert.Contains("DR104", retired);
        Assert.All(retired, id =>
        {
            Assert.DoesNotContain(id, CatalogueIds);
            Assert.DoesNotContain(RuleIds.All, c => c.Value == id);
        });
    }

    [Fact]
    public void No_source_spells_a_rule_id_as_a_string_literal()
    {
        // Outside the catalogue (rules/catalogue.yaml) and its constants (RuleIds.cs), code names rules by constant.
        // Test code is exempt: an id a test expects is test data, checked against the catalogue by these tests.
        var root = FixtureFiles.RepositoryRoot();
        var offenders = new List<string>();
        var sources = Directory.EnumerateFiles(Path.Combine(root, "src"), "*.cs", SearchOption.AllDirectories)
            .Where(f => Path.GetFileName(f) != "RuleIds.cs")
            .Concat(Directory.EnumerateFiles(Path.Combine(root, "templates"), "*.sbn", SearchOption.AllDirectories));
        foreach (var file in sources)
        {
            var lines = File.ReadAllLines(file);
            for (var i = 0; i < lines.Length; i++)
            {
                if (IdLiteral().IsMatch(lines[i]))
                {
                    offenders.Add($"{Path.GetRelativePath(root, file)}({i + 1}): {lines[i].Trim()}");
                }
            }
        }

        Assert.True(offenders.Count == 0, "Rule ids spelt as literals (use RuleIds):\n" + string.Join('\n', offenders));
    }

    [Fact]
    public void The_literal_scan_finds_an_id_spelt_as_text()
    {
        Assert.Matches(IdLiteral(), "var rule = RuleCatalogue.Default[\"DR920\"];");
        Assert.Matches(IdLiteral(), "f.RuleId == $\"DR406\"");
        Assert.DoesNotMatch(IdLiteral(), "RuleCatalogue.Default[RuleIds.AnalysisFailed]; // DR920");
    }

    [Fact]
    public void No_rendered_message_still_holds_a_placeholder()
    {
        // Every catalogue message rendered with the arguments it declares (its placeholders, named or numbered)
        // leaves no '{name}' behind, and a text argument holding braces stays literal.
        foreach (var rule in RuleCatalogue.Default.Rules)
        {
            var names = Placeholder().Matches(rule.MessageFormat).Select(m => m.Groups[1].Value).Distinct().ToList();
            Assert.True(names.Count > 0 || !rule.MessageFormat.Contains('{', StringComparison.Ordinal), $"{rule.Id}: a brace that is no placeholder");
            string rendered = names.All(n => n.All(char.IsAsciiDigit))
                ? rule.Render(Enumerable.Range(0, names.Count == 0 ? 0 : names.Max(n => int.Parse(n, System.Globalization.CultureInfo.InvariantCulture)) + 1)
                    .Select(i => (object?)$"arg{i}").ToArray())
                : rule.Render(names.ToDictionary(n => n, n => $"<{n}>"));
            Assert.DoesNotMatch(Placeholder(), rendered);
            Assert.All(names, n => Assert.Contains(n.All(char.IsAsciiDigit) ? $"arg{n}" : $"<{n}>", rendered, StringComparison.Ordinal));
        }
    }

    [Fact]
    public void A_message_missing_an_argument_shows_the_placeholder_so_the_fixture_runs_catch_it()
    {
        // The fixture runs (RuleFixture.Verify) assert no finding holds a placeholder; that works only because a
        // missing argument stays visible instead of vanishing.
        var rendered = RuleCatalogue.Default[RuleIds.SlewDemand].Render(new Dictionary<string, string>(StringComparer.Ordinal) { ["node"] = "u1.out" });
        Assert.Matches(Placeholder(), rendered);
    }

    private static (Dictionary<string, (string Title, string Category)> Released, List<string> Retired) ReleasedIds()
    {
        var path = Path.Combine(FixtureFiles.RepositoryRoot(), "rules", "released-ids.yaml");
        var diagnostics = new List<Diagnostic>();
        var tree = YamlTreeReader.Read(path, File.ReadAllText(path), LoaderLimits.Default, diagnostics) as YamlMapping;
        Assert.Empty(diagnostics);
        Assert.NotNull(tree);
        static string Field(YamlMapping m, string key) => ((YamlScalar)m.Entries.Single(e => e.Key.Value == key).Value).Value;
        IEnumerable<YamlMapping> List(string key) => ((YamlSequence)tree!.Entries.Single(e => e.Key.Value == key).Value).Items.Cast<YamlMapping>();
        var released = new Dictionary<string, (string, string)>(StringComparer.Ordinal);
        foreach (var entry in List("released"))
        {
            Assert.True(released.TryAdd(Field(entry, "id"), (Field(entry, "title"), Field(entry, "category"))), $"{Field(entry, "id")} recorded twice");
        }

        return (released, List("retired").Select(e => Field(e, "id")).ToList());
    }

    [GeneratedRegex("\"DR[0-9]{3}\"|\\$\"DR[0-9]{3}", RegexOptions.CultureInvariant)]
    private static partial Regex IdLiteral();

    [GeneratedRegex(@"\{([a-z0-9-]+)\}", RegexOptions.CultureInvariant)]
    private static partial Regex Placeholder();
}
