namespace DesignRules.Loading;

/// <summary>Bounds the loader enforces so that no input can make it hang or exhaust memory.</summary>
/// <param name="MaxFileCharacters">Largest file accepted, in characters (default 1 Mi).</param>
/// <param name="MaxExpandedNodes">Most YAML nodes a file may hold with aliases counted as what they expand to (default 200,000).</param>
/// <param name="MaxDepth">Deepest nesting of mappings and lists (default 64).</param>
/// <param name="MaxLibraryDepth">Longest chain of parts libraries using each other (default 16).</param>
public sealed record LoaderLimits(
    int MaxFileCharacters = 1 << 20,
    long MaxExpandedNodes = 200_000,
    int MaxDepth = 64,
    int MaxLibraryDepth = 16)
{
    /// <summary>The default bounds.</summary>
    public static LoaderLimits Default { get; } = new();
}
