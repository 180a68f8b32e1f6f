using System.Globalization;

namespace DesignRules.Diagnostics;

/// <summary>A located problem: an id, a severity, a message that says what to do, and where.</summary>
/// <param name="Id">The descriptor id, e.g. <c>DR901</c>.</param>
/// <param name="Severity">How serious it is.</param>
/// <param name="Message">The full message.</param>
/// <param name="Span">Where in which file.</param>
/// <param name="HelpPage">The help page path relative to the repository root.</param>
public sealed record Diagnostic(string Id, Severity Severity, string Message, SourceSpan Span, string HelpPage)
{
    /// <summary>The compiler-style line: <c>file(line,col): error DR901: message</c>.</summary>
    public override string ToString() => string.Create(
        CultureInfo.InvariantCulture,
        $"{Span}: {Severity.ToString().ToLowerInvariant()} {Id}: {Message}");
}
