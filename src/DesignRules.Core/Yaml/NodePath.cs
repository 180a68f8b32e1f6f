using DesignRules.Diagnostics;
using DesignRules.Loading;

namespace DesignRules.Yaml;

/// <summary>
/// The key path of the YAML node at a position, e.g. <c>stages[rectifier].values.r4</c>: list items with an <c>id</c>
/// are named by it, others by their index. It names what a finding is about independently of line numbers, so reports
/// can fingerprint a finding that moves when unrelated lines are added above it.
/// </summary>
public static class NodePath
{
    /// <summary>The path of the key or value that starts at (<paramref name="line"/>, <paramref name="column"/>), or null.</summary>
    public static string? At(string file, string text, int line, int column)
    {
        ArgumentNullException.ThrowIfNull(file);
        ArgumentNullException.ThrowIfNull(text);
        var tree = YamlTreeReader.Read(file, text, LoaderLimits.Default, []);
        return tree is null ? null : Find(tree, string.Empty, line, column, depth: 0);
    }

    private static string? Find(YamlNode node, string path, int line, int column, int depth)
    {
        if (depth > 64)
        {
            return null;
        }

        switch (node)
        {
            case YamlMapping mapping:
                foreach (var (key, value) in mapping.Entries)
                {
                    var child = path.Length == 0 ? key.Value : path + "." + key.Value;
                    if (Starts(key.Span, line, column))
                    {
                        return child;
                    }

                    if (Find(value, child, line, column, depth + 1) is { } found)
                    {
                        return found;
                    }
                }

                break;
            case YamlSequence sequence:
                for (var i = 0; i < sequence.Items.Count; i++)
                {
                    var item = sequence.Items[i];
                    var id = (item as YamlMapping)?.Entries.FirstOrDefault(e => e.Key.Value == "id").Value as YamlScalar;
                    var child = $"{path}[{id?.Value ?? i.ToString(System.Globalization.CultureInfo.InvariantCulture)}]";
                    if (Find(item, child, line, column, depth + 1) is { } found)
                    {
                        return found;
                    }
                }

                break;
        }

        return Starts(node.Span, line, column) ? (path.Length == 0 ? "." : path) : null;
    }

    private static bool Starts(SourceSpan span, int line, int column) => span.Line == line && span.Column == column;
}
