using DesignRules.Quantities;

namespace DesignRules.Tests.Quantities;

/// <summary>Shared checks for the quantity tests.</summary>
internal static class QuantityAssert
{
    public static Quantity Parses(string text, Dimension expected)
    {
        bool ok = Quantity.TryParse(text, expected, out var q, out var error);
        Assert.True(ok, $"'{text}' should parse as {expected} but gave: {error?.Message}");
        Assert.Null(error);
        Assert.Equal(expected, q.Dimension);
        return q;
    }

    public static QuantityError Fails(string? text, Dimension expected, QuantityErrorKind kind)
    {
        bool ok = Quantity.TryParse(text, expected, out _, out var error);
        Assert.False(ok, $"'{text}' should not parse as {expected}");
        Assert.NotNull(error);
        Assert.Equal(kind, error.Kind);
        Assert.False(string.IsNullOrWhiteSpace(error.Message));
        return error;
    }

    public static void Close(double expected, double actual, double relative = 1e-12)
    {
        double allowed = relative * Math.Max(Math.Abs(expected), double.Epsilon);
        Assert.True(Math.Abs(expected - actual) <= allowed, $"expected {expected:R} but got {actual:R}");
    }
}
