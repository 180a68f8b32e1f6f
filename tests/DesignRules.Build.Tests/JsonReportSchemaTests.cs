using System.Text.Json;
using Json.Schema;
using DesignRules.Loading;
using DesignRules.Reports;
using DesignRules.Rules;

namespace DesignRules.Build.Tests;

/// <summary>
/// The JSON report follows its published JSON Schema (draft 2020-12, src/DesignRules.Core/Schemas/report.schema.json,
/// in the package's schemas/ folder), and every stage of every design carries its key figures by stable key.
/// </summary>
public sealed class JsonReportSchemaTests
{
    private static readonly Lazy<CheckReport> Example = new(() =>
    {
        var root = Path.Combine(TestPaths.RepositoryRoot, "example-design");
        var files = RepositoryFiles.Find([root], out _);
        return DesignCheck.Run(files, new CheckOptions(Path.Combine(root, RuleSetLoader.DefaultFileName), new DateOnly(2026, 12, 1)));
    });

    private static readonly Lazy<JsonSchema> Schema = new(() => JsonSchema.FromText(
        File.ReadAllText(Path.Combine(TestPaths.RepositoryRoot, "src", "DesignRules.Core", "Schemas", JsonReport.SchemaName)),
        new BuildOptions { SchemaRegistry = new SchemaRegistry() }));

    private static IReadOnlyList<string> Problems(byte[] json)
    {
        using var document = JsonDocument.Parse(json);
        var results = Schema.Value.Evaluate(document.RootElement, new EvaluationOptions { OutputFormat = OutputFormat.List });
        return results.IsValid ? [] : [.. (results.Details ?? []).SelectMany(d => (d.Errors ?? new Dictionary<string, string>())
            .Select(e => $"{d.InstanceLocation} ({e.Key} at {d.EvaluationPath}): {e.Value}"))];
    }

    private static JsonElement ExampleDocument() =>
        JsonDocument.Parse(JsonReport.ToBytes(Example.Value, new ReportSettings(TestPaths.RepositoryRoot, null, "0.0.0"))).RootElement;

    [Fact]
    public void The_example_repository_report_is_valid_against_the_published_schema()
    {
        var problems = Problems(JsonReport.ToBytes(Example.Value, new ReportSettings(TestPaths.RepositoryRoot, null, "0.0.0")));
        Assert.True(problems.Count == 0, string.Join('\n', problems));
    }

    [Fact]
    public void The_hand_made_report_with_a_non_finite_value_is_valid_too()
    {
        var problems = Problems(JsonReport.ToBytes(ReportFixtures.Report(), ReportFixtures.Settings));
        Assert.True(problems.Count == 0, string.Join('\n', problems));
    }

    [Fact]
    public void A_fix_with_alternatives_is_valid_against_the_schema_and_lists_them_after_the_value_to_write()
    {
        var folder = Directory.CreateTempSubdirectory("designrules-fix-alternatives-").FullName;
        try
        {
            var design = Path.Combine(folder, "clip.yaml");
            File.WriteAllText(design, SarifFixTests.ClippingStage);
            var report = DesignCheck.Run([design], new CheckOptions(null, new DateOnly(2026, 12, 1)));
            var json = JsonReport.ToBytes(report, new ReportSettings(folder, null, "0.0.0"));

            Assert.Empty(Problems(json));
            var fix = JsonDocument.Parse(json).RootElement.GetProperty("findings").EnumerateArray()
                .Single(f => f.GetProperty("ruleId").GetString() == "DR201").GetProperty("fix");
            Assert.Equal("preferred-value", fix.GetProperty("kind").GetString());
            Assert.Equal("maximum-amplitude", Assert.Single(fix.GetProperty("alternatives").EnumerateArray()).GetProperty("kind").GetString());
        }
        finally
        {
            Directory.Delete(folder, recursive: true);
        }
    }

    [Fact]
    public void The_schema_refuses_a_figure_without_a_key_and_a_report_of_another_version()
    {
        var text = System.Text.Encoding.UTF8.GetString(JsonReport.ToBytes(ReportFixtures.Report(), ReportFixtures.Settings));
        Assert.NotEmpty(Problems(System.Text.Encoding.UTF8.GetBytes(text.Replace("\"key\": \"glitch.width\",", string.Empty, StringComparison.Ordinal))));
        Assert.NotEmpty(Problems(System.Text.Encoding.UTF8.GetBytes(text.Replace($"\"formatVersion\": {JsonReport.FormatVersion}", "\"formatVersion\": 1", StringComparison.Ordinal))));
    }

    [Fact]
    public void The_schema_states_the_version_the_writer_writes()
    {
        using var schema = JsonDocument.Parse(File.ReadAllText(Path.Combine(TestPaths.RepositoryRoot, "src", "DesignRules.Core", "Schemas", JsonReport.SchemaName)));
        Assert.Equal(JsonReport.FormatVersion, schema.RootElement.GetProperty("properties").GetProperty("formatVersion").GetProperty("const").GetInt32());
        Assert.Equal(JsonReport.FormatName, schema.RootElement.GetProperty("properties").GetProperty("format").GetProperty("const").GetString());
    }

    [Fact]
    public void Every_stage_of_every_example_design_lists_its_figures_by_a_key_unique_in_the_stage()
    {
        var kinds = FigureKinds.All.Select(k => k.Name).ToHashSet(StringComparer.Ordinal);
        var designs = ExampleDocument().GetProperty("designs").EnumerateArray().ToList();
        Assert.Equal(Example.Value.Designs.Count, designs.Count);
        foreach (var design in designs)
        {
            var stages = design.GetProperty("stages").EnumerateArray().ToList();
            var model = Example.Value.Designs.Single(d => d.Design.Id.Value == design.GetProperty("id").GetString()).Design;
            Assert.Equal(model.Stages.Select(s => s.Id.Value), stages.Select(s => s.GetProperty("id").GetString()));
            foreach (var stage in stages)
            {
                var keys = stage.GetProperty("figures").EnumerateArray().Select(f => f.GetProperty("key").GetString()!).ToList();
                Assert.NotEmpty(keys);
                Assert.Equal(keys.Count, keys.Distinct(StringComparer.Ordinal).Count());
                Assert.All(keys, k => Assert.Contains(k.Split('@')[0], kinds));
            }
        }
    }

    [Fact]
    public void A_judged_figure_carries_its_limit_and_a_margin_of_limit_minus_value_or_value_minus_limit()
    {
        var judged = ExampleDocument().GetProperty("designs").EnumerateArray()
            .SelectMany(d => d.GetProperty("stages").EnumerateArray()).SelectMany(s => s.GetProperty("figures").EnumerateArray())
            .Where(f => f.TryGetProperty("limit", out var l) && l.ValueKind == JsonValueKind.Number && f.GetProperty("value").ValueKind == JsonValueKind.Number)
            .ToList();
        Assert.NotEmpty(judged);
        Assert.All(judged, f =>
        {
            double value = f.GetProperty("value").GetDouble(), limit = f.GetProperty("limit").GetDouble(), margin = f.GetProperty("margin").GetDouble();
            double scale = Math.Max(1e-30, Math.Abs(limit) + Math.Abs(value));
            Assert.True(Math.Abs(Math.Abs(margin) - Math.Abs(limit - value)) <= 1e-12 * scale, $"{f.GetProperty("key")}: margin {margin} for {value} against {limit}");
        });
    }
}
