using System.Text.Json;

namespace DesignRules.Build.Tests;

/// <summary>Findings reduced to what must agree between runs and formats: rule, path, line, column, level.</summary>
internal static class FindingKeys
{
    public static List<string> FromSarif(string path)
    {
        using var doc = JsonDocument.Parse(File.ReadAllBytes(path));
        return [.. doc.RootElement.GetProperty("runs")[0].GetProperty("results").EnumerateArray().Select(r =>
        {
            var location = r.GetProperty("locations")[0].GetProperty("physicalLocation");
            var region = location.GetProperty("region");
            return Key(r.GetProperty("ruleId").GetString()!, Uri.UnescapeDataString(location.GetProperty("artifactLocation").GetProperty("uri").GetString()!),
                region.GetProperty("startLine").GetInt32(), region.GetProperty("startColumn").GetInt32(), r.GetProperty("level").GetString()!);
        })];
    }

    public static List<string> FromJson(string path)
    {
        using var doc = JsonDocument.Parse(File.ReadAllBytes(path));
        return [.. doc.RootElement.GetProperty("findings").EnumerateArray().Select(f => Key(f.GetProperty("ruleId").GetString()!,
            f.GetProperty("file").GetString()!, f.GetProperty("line").GetInt32(), f.GetProperty("column").GetInt32(), f.GetProperty("severity").GetString()!))];
    }

    private static string Key(string rule, string file, int line, int column, string level) => $"{rule} {file}({line},{column}) {level}";
}
