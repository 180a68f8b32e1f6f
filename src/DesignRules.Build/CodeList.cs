namespace DesignRules.Build;

/// <summary>A set of diagnostic codes written the MSBuild way: separated by semicolons, commas or spaces.</summary>
internal sealed class CodeList
{
    private readonly HashSet<string> codes;

    public CodeList(string? text) =>
        codes = new HashSet<string>(
            (text ?? string.Empty).Split([';', ',', ' ', '\t', '\r', '\n'], StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries),
            StringComparer.OrdinalIgnoreCase);

    public bool Contains(string code) => codes.Contains(code);
}
