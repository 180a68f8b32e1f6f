using System.Text.Json;
using System.Text.Json.Nodes;
using DesignRules.Blocks;
using DesignRules.Model;
using Json.Schema;

namespace DesignRules.Tests.Schema;

/// <summary>The schemas themselves: valid draft 2020-12, documented for editors, closed to unknown keys, in step with the loader.</summary>
public sealed class SchemasAreValidAndDocumented
{
    public static TheoryData<string> SchemaFiles() => new("design.schema.json", "parts.schema.json", "rule-set.schema.json");

    [Theory]
    [MemberData(nameof(SchemaFiles))]
    public void The_schema_is_valid_against_the_draft_2020_12_meta_schema(string file)
    {
        using var schema = JsonDocument.Parse(SchemaCheck.EmbeddedText(file));
        var results = MetaSchemas.Draft202012.Evaluate(schema.RootElement, new EvaluationOptions { OutputFormat = OutputFormat.List });
        Assert.True(results.IsValid, SchemaCheck.Describe(results));
        Assert.Equal("https://json-schema.org/draft/2020-12/schema", schema.RootElement.GetProperty("$schema").GetString());
        Assert.Equal($"https://designrules.invalid/schemas/{file}", schema.RootElement.GetProperty("$id").GetString());
    }

    [Theory]
    [MemberData(nameof(SchemaFiles))]
    public void The_schema_builds_with_every_reference_resolved(string file)
    {
        var schema = file.StartsWith("rule-set", StringComparison.Ordinal) ? SchemaCheck.RuleSet
            : SchemaCheck.For(file.StartsWith("design", StringComparison.Ordinal) ? FileKind.Design : FileKind.Parts);
        Assert.NotNull(schema);
    }

    [Theory]
    [MemberData(nameof(SchemaFiles))]
    public void The_embedded_schema_is_the_file_in_the_source_tree(string file)
    {
        var onDisk = File.ReadAllText(SchemaTestFiles.InRepository("src", "DesignRules.Core", "Schemas", file));
        Assert.Equal(onDisk.ReplaceLineEndings(), SchemaCheck.EmbeddedText(file).ReplaceLineEndings());
    }

    [Theory]
    [MemberData(nameof(SchemaFiles))]
    public void Every_property_has_a_title_and_a_description_for_editors(string file)
    {
        var missing = new List<string>();
        foreach (var (path, node) in Walk(JsonNode.Parse(SchemaCheck.EmbeddedText(file))!, "#"))
        {
            if (node["properties"] is not JsonObject properties)
            {
                continue;
            }

            foreach (var (name, property) in properties)
            {
                // 'false' forbids a key in a conditional branch; such branches restate no documentation.
                if (property is JsonObject p && !IsConditional(path) && (p["title"] is null || p["description"] is null))
                {
                    missing.Add($"{path}/properties/{name}");
                }
            }
        }

        Assert.True(missing.Count == 0, "without title or description: " + string.Join(", ", missing));
    }

    [Theory]
    [MemberData(nameof(SchemaFiles))]
    public void Every_object_with_named_properties_rejects_unknown_keys(string file)
    {
        var open = Walk(JsonNode.Parse(SchemaCheck.EmbeddedText(file))!, "#")
            .Where(x => x.Node["properties"] is JsonObject && x.Node["type"]?.GetValue<string>() == "object")
            .Where(x => x.Node["additionalProperties"] is not JsonValue v || v.GetValue<bool>())
            .Select(x => x.Path)
            .ToList();
        Assert.True(open.Count == 0, "objects open to unknown keys: " + string.Join(", ", open));
    }

    [Fact]
    public void The_design_schema_knows_every_block_of_the_catalog_with_its_values_and_slots()
    {
        var schema = JsonNode.Parse(SchemaCheck.EmbeddedText("design.schema.json"))!;
        var stage = schema["$defs"]!["stage"]!;
        var names = stage["properties"]!["block"]!["enum"]!.AsArray().Select(n => n!.GetValue<string>()).ToList();
        Assert.Equal(BlockCatalog.All.Keys.Order(StringComparer.Ordinal), names.Order(StringComparer.Ordinal));

        foreach (var rule in stage["allOf"]!.AsArray().Where(r => r!["if"]?["properties"]?["block"] is not null))
        {
            var block = BlockCatalog.All[rule!["if"]!["properties"]!["block"]!["const"]!.GetValue<string>()];
            var then = rule["then"]!;
            var values = then["properties"]!["values"]!;
            var valueNames = values["properties"]!.AsObject().Select(p => p.Key).Order(StringComparer.Ordinal);
            Assert.Equal(block.AllValues.Concat(block.Flags).Order(StringComparer.Ordinal), valueNames);
            var required = values["required"]?.AsArray().Select(n => n!.GetValue<string>()) ?? [];
            Assert.Equal(block.RequiredValues.Order(StringComparer.Ordinal), required.Order(StringComparer.Ordinal));

            var amplifierSlots = then["properties"]!["amplifiers"] is JsonObject a
                ? a["propertyNames"]!["enum"]!.AsArray().Select(n => n!.GetValue<string>())
                : [];
            Assert.Equal(block.AmplifierSlots.Concat(block.OptionalAmplifierSlots).Order(StringComparer.Ordinal), amplifierSlots.Order(StringComparer.Ordinal));
            var diodeSlots = then["properties"]!["diodes"] is JsonObject d
                ? d["propertyNames"]!["enum"]!.AsArray().Select(n => n!.GetValue<string>())
                : [];
            Assert.Equal(block.DiodeSlots.Order(StringComparer.Ordinal), diodeSlots.Order(StringComparer.Ordinal));
        }
    }

    [Theory]
    [MemberData(nameof(SchemaFiles))]
    public void Every_pattern_has_a_readable_message_for_editors(string file)
    {
        // A wrong unit in an editor shows the message, not the regular expression (patternErrorMessage and errorMessage
        // are the keywords YAML language servers read).
        var bare = Walk(JsonNode.Parse(SchemaCheck.EmbeddedText(file))!, "#")
            .Where(x => x.Node["pattern"] is JsonValue)
            .Where(x => x.Node["patternErrorMessage"]?.GetValue<string>() is not { Length: > 10 } message
                || message.Contains("(?:", StringComparison.Ordinal) || x.Node["errorMessage"] is null)
            .Select(x => x.Path)
            .ToList();
        Assert.True(bare.Count == 0, "patterns without a readable message: " + string.Join(", ", bare));
    }

    [Fact]
    public void Part_references_offer_exactly_the_builtin_part_ids_for_completion()
    {
        var library = DesignRules.Loading.DesignLoader.LoadFiles([]).Libraries.Single(l => l.File == DesignRules.Loading.DesignLoader.BuiltinLibraryFile);
        var stage = JsonNode.Parse(SchemaCheck.EmbeddedText("design.schema.json"))!["$defs"]!["stage"]!["properties"]!;
        static List<string> Examples(JsonNode node) => node["examples"]!.AsArray().Select(n => n!.GetValue<string>()).ToList();
        Assert.Equal(library.Amplifiers.Select(a => a.Id.Value), Examples(stage["amplifier"]!));
        Assert.Equal(library.Amplifiers.Select(a => a.Id.Value), Examples(stage["amplifiers"]!["additionalProperties"]!));
        Assert.Equal(library.Diodes.Select(d => d.Id.Value), Examples(stage["diode"]!));
        Assert.Equal(library.Resistors.Select(r => r.Id.Value), Examples(stage["resistors"]!));
        Assert.Equal(library.Capacitors.Select(c => c.Id.Value), Examples(stage["capacitors"]!));
    }

    [Fact]
    public void The_rule_set_schema_knows_every_rule_and_threshold_of_the_catalogue()
    {
        var rules = JsonNode.Parse(SchemaCheck.EmbeddedText("rule-set.schema.json"))!["$defs"]!["rules"]!["properties"]!.AsObject();
        var expected = DesignRules.Diagnostics.RuleCatalogue.Default.Rules.Where(r => r.Category != "design-file").ToList();
        Assert.Equal(expected.Select(r => r.Id), rules.Select(r => r.Key));
        foreach (var rule in expected)
        {
            var thresholds = rules[rule.Id]!["anyOf"]![1]!["properties"]!.AsObject().Select(p => p.Key).Where(k => k != "severity");
            Assert.Equal(rule.Thresholds.Select(t => t.Name), thresholds);
        }
    }

    private static bool IsConditional(string path) =>
        path.Contains("/then", StringComparison.Ordinal) || path.Contains("/else", StringComparison.Ordinal)
        || path.Contains("/if", StringComparison.Ordinal) || path.Contains("/anyOf", StringComparison.Ordinal)
        || path.Contains("/oneOf", StringComparison.Ordinal);

    /// <summary>Every object in the schema document with its JSON-pointer-like path.</summary>
    private static IEnumerable<(string Path, JsonObject Node)> Walk(JsonNode node, string path)
    {
        switch (node)
        {
            case JsonObject o:
                yield return (path, o);
                foreach (var (key, child) in o)
                {
                    if (child is not null)
                    {
                        foreach (var x in Walk(child, $"{path}/{key}"))
                        {
                            yield return x;
                        }
                    }
                }

                break;
            case JsonArray a:
                for (var i = 0; i < a.Count; i++)
                {
                    if (a[i] is { } child)
                    {
                        foreach (var x in Walk(child, $"{path}/{i}"))
                        {
                            yield return x;
                        }
                    }
                }

                break;
        }
    }
}
