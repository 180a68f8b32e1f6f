using System.Globalization;
using System.Text.Json.Nodes;
using System.Text.RegularExpressions;
using YamlDotNet.Core;
using YamlDotNet.RepresentationModel;

namespace DesignRules.Tests.Schema;

/// <summary>
/// Reads YAML text as the JSON a schema-aware editor would see: mappings become objects, lists arrays, and plain
/// scalars are resolved as YAML 1.2's core schema does (null, true/false, integers and floats); quoted and block
/// scalars, and every other plain scalar, stay strings.
/// </summary>
internal static partial class YamlAsJson
{
    /// <summary>Converts the first document of <paramref name="yaml"/>; an empty text gives null.</summary>
    public static JsonNode? Convert(string yaml)
    {
        var stream = new YamlStream();
        using (var reader = new StringReader(yaml))
        {
            stream.Load(reader);
        }

        return stream.Documents.Count == 0 ? null : ToJson(stream.Documents[0].RootNode, depth: 0);
    }

    private static JsonNode? ToJson(YamlNode node, int depth)
    {
        // YamlStream resolves aliases to shared nodes; the bound keeps a self-referencing alias from recursing forever.
        if (depth > 200)
        {
            throw new InvalidOperationException("YAML nested deeper than 200 levels");
        }

        switch (node)
        {
            case YamlMappingNode mapping:
                var obj = new JsonObject();
                foreach (var (key, value) in mapping.Children)
                {
                    var name = key is YamlScalarNode k ? k.Value ?? string.Empty : key.ToString();
                    obj[name] = ToJson(value, depth + 1);
                }

                return obj;
            case YamlSequenceNode sequence:
                var array = new JsonArray();
                foreach (var item in sequence.Children)
                {
                    array.Add(ToJson(item, depth + 1));
                }

                return array;
            case YamlScalarNode scalar:
                return Scalar(scalar);
            default:
                throw new InvalidOperationException($"unexpected YAML node {node.NodeType}");
        }
    }

    private static JsonNode? Scalar(YamlScalarNode scalar)
    {
        var text = scalar.Value ?? string.Empty;
        if (scalar.Style is not (ScalarStyle.Plain or ScalarStyle.Any) || !scalar.Tag.IsEmpty)
        {
            return JsonValue.Create(text);
        }

        switch (text)
        {
            case "" or "~" or "null" or "Null" or "NULL":
                return null;
            case "true" or "True" or "TRUE":
                return JsonValue.Create(true);
            case "false" or "False" or "FALSE":
                return JsonValue.Create(false);
        }

        if (IntegerPattern().IsMatch(text) && long.TryParse(text, NumberStyles.AllowLeadingSign, CultureInfo.InvariantCulture, out var integer))
        {
            return JsonValue.Create(integer);
        }

        if (FloatPattern().IsMatch(text)
            && double.TryParse(text, NumberStyles.Float, CultureInfo.InvariantCulture, out var real)
            && double.IsFinite(real))
        {
            return JsonValue.Create(real);
        }

        return JsonValue.Create(text);
    }

    // YAML 1.2 core schema: int is [-+]?[0-9]+ ; float is [-+]?(\.[0-9]+|[0-9]+(\.[0-9]*)?)([eE][-+]?[0-9]+)?
    // (.inf and .nan have no JSON form and stay strings).
    [GeneratedRegex("^[-+]?[0-9]+$", RegexOptions.CultureInvariant)]
    private static partial Regex IntegerPattern();

    [GeneratedRegex(@"^[-+]?(\.[0-9]+|[0-9]+(\.[0-9]*)?)([eE][-+]?[0-9]+)?$", RegexOptions.CultureInvariant)]
    private static partial Regex FloatPattern();
}
