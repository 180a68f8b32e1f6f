using System.Runtime.CompilerServices;
using System.Text;
using System.Text.Json;
using System.Text.Json.Nodes;
using DesignRules.Quantities;
using Json.Schema;

namespace DesignRules.Tests.Schema;

/// <summary>The two file kinds and the schema that describes each.</summary>
internal enum FileKind
{
    Design,
    Parts,
}

/// <summary>Validates YAML files against the JSON Schemas embedded in the Core assembly.</summary>
internal static class SchemaCheck
{
    private static readonly Lazy<JsonSchema> DesignSchema = new(() => Build("design.schema.json"));
    private static readonly Lazy<JsonSchema> PartsSchema = new(() => Build("parts.schema.json"));

    private static readonly Lazy<JsonSchema> RuleSetSchema = new(() => Build("rule-set.schema.json"));

    /// <summary>The schema of the rule-set file.</summary>
    public static JsonSchema RuleSet => RuleSetSchema.Value;

    public static JsonSchema For(FileKind kind) => kind == FileKind.Design ? DesignSchema.Value : PartsSchema.Value;

    /// <summary>The text of an embedded schema, exactly as shipped in the Core assembly.</summary>
    public static string EmbeddedText(string fileName)
    {
        using var stream = typeof(Quantity).Assembly.GetManifestResourceStream("DesignRules.Schemas." + fileName)
            ?? throw new InvalidOperationException($"schema {fileName} is not embedded in the Core assembly");
        using var reader = new StreamReader(stream, Encoding.UTF8);
        return reader.ReadToEnd();
    }

    /// <summary>A design file starts with <c>design:</c>, a parts file with <c>library:</c>.</summary>
    public static FileKind KindOf(JsonNode? document) =>
        document is JsonObject o && o.ContainsKey("library") && !o.ContainsKey("design") ? FileKind.Parts : FileKind.Design;

    /// <summary>Evaluates YAML text against the schema of its kind, with <c>format</c> asserted.</summary>
    public static EvaluationResults Evaluate(string yaml, out FileKind kind)
    {
        var document = YamlAsJson.Convert(yaml);
        kind = KindOf(document);
        return Evaluate(For(kind), document);
    }

    public static EvaluationResults Evaluate(JsonSchema schema, JsonNode? document)
    {
        using var json = JsonDocument.Parse(document?.ToJsonString() ?? "null");
        return schema.Evaluate(json.RootElement, new EvaluationOptions { OutputFormat = OutputFormat.List, RequireFormatValidation = true });
    }

    /// <summary>Every error of a list-format result, one per line, for assertion messages.</summary>
    public static string Describe(EvaluationResults results)
    {
        var lines = new List<string>();
        foreach (var detail in results.Details ?? [])
        {
            foreach (var (keyword, message) in detail.Errors ?? new Dictionary<string, string>())
            {
                lines.Add($"{detail.InstanceLocation} ({keyword} at {detail.EvaluationPath}): {message}");
            }
        }

        foreach (var (keyword, message) in results.Errors ?? new Dictionary<string, string>())
        {
            lines.Add($"{results.InstanceLocation} ({keyword}): {message}");
        }

        return lines.Count == 0 ? "(no errors)" : string.Join(Environment.NewLine, lines);
    }

    private static JsonSchema Build(string fileName)
    {
        // A private registry per schema, so that building never collides with another test's registrations.
        var options = new BuildOptions { SchemaRegistry = new SchemaRegistry() };
        return JsonSchema.FromText(EmbeddedText(fileName), options);
    }
}

/// <summary>Where the files the schema tests read live.</summary>
internal static class SchemaTestFiles
{
    public static string Fixtures(string folder) => Path.Combine(AppContext.BaseDirectory, "Fixtures", "schema", folder);

    public static IEnumerable<string> FixtureNames(string folder) =>
        Directory.EnumerateFiles(Fixtures(folder), "*.yaml").Select(Path.GetFileName).OfType<string>().Order(StringComparer.Ordinal);

    /// <summary>The repository root, recorded at build time.</summary>
    public static string RepositoryRoot() => DesignRules.Tests.Loading.FixtureFiles.RepositoryRoot();

    public static string InRepository(params string[] parts) => Path.Combine([RepositoryRoot(), .. parts]);
}
