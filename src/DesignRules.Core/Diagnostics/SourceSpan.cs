using System.Globalization;

namespace DesignRules.Diagnostics;

/// <summary>Where a piece of text stands in a file: 1-based lines and columns, end exclusive of nothing (the last character's column + 1).</summary>
/// <param name="File">The file path as the user named it (or relative to the repository root).</param>
/// <param name="Line">First line, from 1.</param>
/// <param name="Column">First column, from 1.</param>
/// <param name="EndLine">Line of the end position.</param>
/// <param name="EndColumn">Column just after the last character.</param>
public sealed record SourceSpan(string File, int Line, int Column, int EndLine, int EndColumn)
{
    /// <summary>A span covering a whole file when no better position is known.</summary>
    public static SourceSpan WholeFile(string file) => new(file, 1, 1, 1, 1);

    /// <summary>The compiler-style position text, <c>file(line,col)</c>.</summary>
    public override string ToString() =>
        string.Create(CultureInfo.InvariantCulture, $"{DiagnosticText.Escape(File)}({Line},{Column})");
}
