using DesignRules.Diagnostics;

namespace DesignRules.Yaml;

/// <summary>A YAML node that keeps its source span. The loader's own small tree, so every value stays located.</summary>
internal abstract class YamlNode(SourceSpan span)
{
    public SourceSpan Span { get; } = span;

    /// <summary>Nodes in the expanded subtree, aliases counted as what they expand to (saturating).</summary>
    public long ExpandedWeight { get; set; } = 1;

    /// <summary>Characters of keys and values in the expanded subtree, aliases counted as what they expand to (saturating).</summary>
    public long ExpandedCharacters { get; set; }

    /// <summary>Words for diagnostics: "a mapping", "a list", "a value".</summary>
    public abstract string ShapeName { get; }
}

internal sealed class YamlScalar(string value, bool quoted, SourceSpan span) : YamlNode(span)
{
    public string Value { get; } = value;

    /// <summary>True for quoted and block scalars, which YAML never reads as numbers, booleans or null.</summary>
    public bool Quoted { get; } = quoted;

    /// <summary>A plain empty scalar, <c>~</c> or <c>null</c>: YAML's null.</summary>
    public bool IsNull => !Quoted && (Value.Length == 0 || Value == "~" || Value is "null" or "Null" or "NULL");

    public override string ShapeName => IsNull ? "empty" : "a single value";
}

internal sealed class YamlMapping(SourceSpan span) : YamlNode(span)
{
    public List<KeyValuePair<YamlScalar, YamlNode>> Entries { get; } = [];

    public override string ShapeName => "a mapping (key: value lines)";
}

internal sealed class YamlSequence(SourceSpan span) : YamlNode(span)
{
    public List<YamlNode> Items { get; } = [];

    public override string ShapeName => "a list";
}
