namespace DesignRules.Loading;

/// <summary>Bounds the loader enforces so that no input can make it hang or exhaust memory (the README lists them).</summary>
/// <param name="MaxFileCharacters">Largest file text accepted, in characters (default 1 Mi).</param>
/// <param name="MaxExpandedNodes">Most YAML nodes a file may hold with aliases counted as what they expand to (default 200,000).</param>
/// <param name="MaxDepth">Deepest nesting of mappings and lists (default 64).</param>
/// <param name="MaxLibraryDepth">Longest chain of parts libraries using each other (default 16).</param>
/// <param name="MaxFileBytes">Largest file read from disk, in bytes, counted while reading (default 1 MiB).</param>
/// <param name="MaxExpandedCharacters">Most characters of keys and values a file may hold with aliases counted as what they expand to (default 4 Mi).</param>
/// <param name="MaxFiles">Most design, parts and rule-set files one run reads, parts libraries included (default 1,000).</param>
public sealed record LoaderLimits(
    int MaxFileCharacters = 1 << 20,
    long MaxExpandedNodes = 200_000,
    int MaxDepth = 64,
    int MaxLibraryDepth = 16,
    int MaxFileBytes = 1 << 20,
    long MaxExpandedCharacters = 4L << 20,
    int MaxFiles = 1_000)
{
    /// <summary>The default bounds.</summary>
    public static LoaderLimits Default { get; } = new();
}
