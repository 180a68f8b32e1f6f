using System.Text.Json;
using System.Text.Json.Nodes;
using Json.Schema;

namespace DesignRules.Build.Tests;

/// <summary>
/// The OASIS SARIF 2.1.0 JSON Schema (errata 01, OASIS Standard; Standards/sarif-schema-2.1.0.json, whitespace compacted)
/// and what code scanning needs beyond it. The schema is written in draft-04, which JsonSchema.Net does not read; its
/// keywords mean the same in draft-07, so it is read as draft-07 (without its draft-04 "id", which only names the file).
/// </summary>
internal static class SarifSchema
{
    private static readonly Lazy<JsonSchema> Schema = new(() =>
    {
        var node = JsonNode.Parse(File.ReadAllText(Path.Combine(AppContext.BaseDirectory, "Standards", "sarif-schema-2.1.0.json")))!.AsObject();
        node["$schema"] = "http://json-schema.org/draft-07/schema#";
        node.Remove("id");
        return JsonSchema.FromText(node.ToJsonString(), new BuildOptions { SchemaRegistry = new SchemaRegistry() });
    });

    /// <summary>Every problem of <paramref name="sarif"/> against the schema, with formats asserted; empty when valid.</summary>
    public static IReadOnlyList<string> Problems(string sarif)
    {
        using var document = JsonDocument.Parse(sarif);
        var results = Schema.Value.Evaluate(document.RootElement, new EvaluationOptions { OutputFormat = OutputFormat.List, RequireFormatValidation = true });
        if (results.IsValid)
        {
            return [];
        }

        var problems = new List<string>();
        foreach (var detail in results.Details ?? [])
        {
            foreach (var (keyword, message) in detail.Errors ?? new Dictionary<string, string>())
            {
                problems.Add($"{detail.InstanceLocation} ({keyword} at {detail.EvaluationPath}): {message}");
            }
        }

        return problems.Count > 0 ? problems : ["invalid (no detail)"];
    }

    /// <summary>
    /// What code scanning shows beyond the schema's minimum, which the schema cannot require: the tool's address and
    /// version, each rule's full description, help text and Markdown, tags, and each result's partial fingerprint.
    /// </summary>
    public static IReadOnlyList<string> MissingCodeScanningFields(string sarif)
    {
        using var document = JsonDocument.Parse(sarif);
        var missing = new List<string>();
        var run = document.RootElement.GetProperty("runs")[0];
        var driver = run.GetProperty("tool").GetProperty("driver");
        foreach (var name in new[] { "informationUri", "version" })
        {
            if (!driver.TryGetProperty(name, out var value) || value.GetString() is not { Length: > 0 })
            {
                missing.Add("tool.driver." + name);
            }
        }

        foreach (var rule in driver.GetProperty("rules").EnumerateArray())
        {
            var id = rule.GetProperty("id").GetString();
            if (!rule.TryGetProperty("fullDescription", out var full) || full.GetProperty("text").GetString() is not { Length: > 0 })
            {
                missing.Add($"{id}.fullDescription");
            }

            if (!rule.TryGetProperty("help", out var help) || help.GetProperty("text").GetString() is not { Length: > 0 }
                || !help.TryGetProperty("markdown", out var markdown) || markdown.GetString() is not { Length: > 0 })
            {
                missing.Add($"{id}.help");
            }

            if (!rule.TryGetProperty("properties", out var properties) || !properties.TryGetProperty("tags", out var tags) || tags.GetArrayLength() == 0)
            {
                missing.Add($"{id}.properties.tags");
            }
        }

        foreach (var result in run.GetProperty("results").EnumerateArray())
        {
            if (!result.TryGetProperty("partialFingerprints", out var fingerprints) || !fingerprints.EnumerateObject().Any())
            {
                missing.Add($"{result.GetProperty("ruleId").GetString()}.partialFingerprints");
            }
        }

        return missing;
    }
}
