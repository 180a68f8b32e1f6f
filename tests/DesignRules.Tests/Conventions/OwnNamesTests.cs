using DesignRules.Diagnostics;
using DesignRules.Loading;
using DesignRules.Quantities;

namespace DesignRules.Tests.Conventions;

/// <summary>
/// Names of our own: the mega prefix is M only, the reference node is called <c>ground</c> only, and spelling hints
/// are given only for names long and close enough to say what was meant.
/// </summary>
public sealed class OwnNamesTests
{
    private const string Netlist = """
        design: { id: own-names }
        supplies: { positive: 15 V, negative: -15 V }
        source: { waveform: sine, amplitude: 1 V, frequency: 1 kHz }
        load: { resistance: 10k }
        stages:
          - id: divider
            netlist:
              input: IN
              output: OUT
              elements:
                - { id: r1, type: resistor, value: 10k, between: [IN, OUT] }
                - { id: r2, type: resistor, value: 10k, between: [OUT, LOW] }
                - { id: u1, type: amplifier, part: jfet-input-15v, pins: { plus: PLUS, minus: OUT, output: BUF } }
                - { id: r3, type: resistor, value: 10k, between: [BUF, LOW] }
                - { id: r4, type: resistor, value: 10k, between: [PLUS, LOW] }
        """;

    private static LoadResult Load(string text) => new DesignLoader().LoadText("own-names.yaml", text);

    private static string Design(string input = "in", string output = "out", string low = "ground", string plus = "ground") =>
        Netlist.Replace("IN", input, StringComparison.Ordinal).Replace("OUT", output, StringComparison.Ordinal)
            .Replace("LOW", low, StringComparison.Ordinal).Replace("PLUS", plus, StringComparison.Ordinal);

    [Fact]
    public void The_netlist_with_ground_spelt_ground_loads()
    {
        var result = Load(Design());
        Assert.False(result.HasErrors, string.Join(Environment.NewLine, result.Diagnostics));
        Assert.Single(result.Designs);
    }

    public static TheoryData<string, string> ZeroAsNode => new()
    {
        { "between", Design(low: "0") },
        { "pin", Design(plus: "0") },
        { "input", Design(input: "0") },
        { "output", Design(output: "0") },
    };

    [Theory]
    [MemberData(nameof(ZeroAsNode))]
    public void Zero_is_not_accepted_as_a_node_name_anywhere_and_the_hint_names_ground(string where, string text)
    {
        var result = Load(text);
        Assert.True(result.Designs.Count == 0, $"a node named 0 in the {where} was accepted");
        var findings = result.Diagnostics.Where(d => d.Id == "DR904").ToList();
        Assert.NotEmpty(findings);
        Assert.All(findings, f =>
        {
            Assert.Contains("the reference node is `ground`", f.Message, StringComparison.Ordinal);
            Assert.True(f.Span.Line > 1, "the finding points at the node");
        });
    }

    [Fact]
    public void No_builder_or_rule_spells_the_reference_node_as_a_string_literal()
    {
        // The reference node is one constant (Circuit.Ground, NetlistStage.Ground), never a literal in each builder.
        var root = Loading.FixtureFiles.RepositoryRoot();
        var offenders = new List<string>();
        foreach (var project in new[] { "DesignRules.Simulation", "DesignRules.Elaboration", "DesignRules.Rules" })
        {
            foreach (var file in Directory.EnumerateFiles(Path.Combine(root, "src", project), "*.cs", SearchOption.AllDirectories))
            {
                var lines = File.ReadAllLines(file);
                for (var i = 0; i < lines.Length; i++)
                {
                    var declaration = lines[i].Contains("const string", StringComparison.Ordinal);
                    if (!declaration && !lines[i].TrimStart().StartsWith("//", StringComparison.Ordinal) &&
                        (lines[i].Contains("\"0\"", StringComparison.Ordinal) || lines[i].Contains("\"ground\"", StringComparison.Ordinal)))
                    {
                        offenders.Add($"{Path.GetRelativePath(root, file)}({i + 1})");
                    }
                }
            }
        }

        Assert.True(offenders.Count == 0, "reference node as a literal: " + string.Join(", ", offenders));
    }

    [Fact]
    public void Every_dimension_refuses_meg_as_a_prefix_with_the_hint_to_write_M()
    {
        foreach (var dimension in Enum.GetValues<Dimension>())
        {
            foreach (var text in new[] { "1meg", "1 meg", "4.7megohm", "2.2MEG", "1Meg" })
            {
                Assert.False(Quantity.TryParse(text, dimension, out _, out var error), $"'{text}' parsed as {dimension}");
                Assert.Contains("write M", error!.Message, StringComparison.Ordinal);
            }
        }
    }

    [Fact]
    public void A_value_spelt_with_meg_in_a_design_is_DR904_at_the_value_with_the_hint_to_write_M()
    {
        var result = Load(Design().Replace("load: { resistance: 10k }", "load: { resistance: 1meg }", StringComparison.Ordinal));
        Assert.Empty(result.Designs);
        var finding = Assert.Single(result.Diagnostics, d => d.Id == "DR904");
        Assert.Contains("write M", finding.Message, StringComparison.Ordinal);
        Assert.Equal(4, finding.Span.Line);
    }

    [Fact]
    public void The_JSON_schemas_do_not_know_meg()
    {
        foreach (var file in new[] { "design.schema.json", "parts.schema.json" })
        {
            Assert.DoesNotContain("meg", Schema.SchemaCheck.EmbeddedText(file), StringComparison.OrdinalIgnoreCase);
        }
    }

    [Fact]
    public void A_dangling_one_letter_node_is_reported_without_a_guess_at_what_was_meant()
    {
        // Before, 'a' was one edit from the old reference name 0, and the hint suggested it.
        var result = Load(Design().Replace("between: [BUF, ground]", "between: [BUF, a]", StringComparison.Ordinal));
        var dangling = result.Diagnostics.Where(d => d.Id == "DR908").ToList();
        Assert.NotEmpty(dangling);
        Assert.All(dangling, d => Assert.DoesNotContain("Did you mean", d.Message, StringComparison.Ordinal));
    }

    [Theory]
    [InlineData("a")]
    [InlineData("x")]
    [InlineData("0")]
    public void A_one_letter_name_gets_no_spelling_suggestion(string word) =>
        Assert.Null(SpellingSuggestion.Closest(word, ["ground", "vpos", "vneg", "a1", "b", "in", "out", "x1"]));

    [Theory]
    [InlineData("grund", "ground")]
    [InlineData("vpso", "vpos")]
    [InlineData("outt", "out")]
    public void A_close_misspelling_of_a_longer_name_is_suggested(string word, string meant) =>
        Assert.Equal(meant, SpellingSuggestion.Closest(word, ["ground", "vpos", "vneg", "in", "out"]));

    [Theory]
    [InlineData("u3", "u1")]
    [InlineData("a", "ab")]
    [InlineData("r", "R")]
    public void A_candidate_that_is_half_a_different_name_or_less_or_a_one_letter_name_gets_no_suggestion(string word, string candidate) =>
        Assert.Null(SpellingSuggestion.Closest(word, [candidate]));
}
