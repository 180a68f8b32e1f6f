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

/// <summary>The number inside a located quantity, so that callers never write <c>.Value.Value</c> chains.</summary>
public static class LocatedQuantity
{
    /// <summary>The quantity's number in SI units (ohms, farads, volts ...), without its unit and location.</summary>
    public static double Si(this Located<Quantities.Quantity> quantity)
    {
        ArgumentNullException.ThrowIfNull(quantity);
        return quantity.Value.Value;
    }
}
