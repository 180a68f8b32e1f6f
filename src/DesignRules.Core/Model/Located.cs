using DesignRules.Diagnostics;

namespace DesignRules.Model;

/// <summary>A value together with the span of the YAML text it was read from.</summary>
/// <typeparam name="T">The value's type.</typeparam>
/// <param name="Value">The value.</param>
/// <param name="Span">Where it was written.</param>
public sealed record Located<T>(T Value, SourceSpan Span)
{
    /// <inheritdoc />
    public override string ToString() => Value?.ToString() ?? string.Empty;
}
