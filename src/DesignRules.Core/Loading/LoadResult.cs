using DesignRules.Diagnostics;
using DesignRules.Model;

namespace DesignRules.Loading;

/// <summary>What loading produced: the designs that loaded, the parts libraries read, and every located problem.</summary>
/// <param name="Designs">Designs that loaded completely, in input order.</param>
/// <param name="Libraries">Parts libraries read (built-in first), in the order first reached.</param>
/// <param name="Diagnostics">Every problem found, in file order.</param>
public sealed record LoadResult(IReadOnlyList<Design> Designs, IReadOnlyList<PartsLibrary> Libraries, IReadOnlyList<Diagnostic> Diagnostics)
{
    /// <summary>Every file the loader read or looked for (full paths, sorted): the files named and the parts files they use.</summary>
    public IReadOnlyList<string> Files { get; init; } = [];

    /// <summary>True when any diagnostic is an error.</summary>
    public bool HasErrors => Diagnostics.Any(d => d.Severity == Severity.Error);
}
