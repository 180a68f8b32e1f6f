using DesignRules.Quantities;

namespace DesignRules.Tests.Quantities;

public sealed class RangesAreReadAndWritten
{
    [Theory]
    [InlineData("20Hz..20kHz", Dimension.Frequency, 20.0, 20000.0)]
    [InlineData("20 Hz .. 20 kHz", Dimension.Frequency, 20.0, 20000.0)]
    [InlineData("  20 .. 20k  ", Dimension.Frequency, 20.0, 20000.0)]
    [InlineData("-1V..1V", Dimension.Voltage, -1.0, 1.0)]
    [InlineData("-40 °C .. 85 °C", Dimension.Temperature, -40.0, 85.0)]
    [InlineData("1V..1V", Dimension.Voltage, 1.0, 1.0)]
    [InlineData("R47..4k7", Dimension.Resistance, 0.47, 4700.0)]
    public void A_range_reads_as_its_two_ends(string text, Dimension dimension, double low, double high)
    {
        Assert.True(QuantityRange.TryParse(text, dimension, out var range, out var error), error?.Message);
        QuantityAssert.Close(low, range.Low.Value);
        QuantityAssert.Close(high, range.High.Value);
        Assert.Equal(dimension, range.Low.Dimension);
        Assert.Equal(dimension, range.High.Dimension);
    }

    [Theory]
    [InlineData("20kHz..20Hz", QuantityErrorKind.BadRange)]
    [InlineData("20Hz", QuantityErrorKind.Malformed)]
    [InlineData("20Hz..", QuantityErrorKind.Empty)]
    [InlineData("..20Hz", QuantityErrorKind.Empty)]
    [InlineData("20Hz..20x", QuantityErrorKind.Malformed)]
    [InlineData("20Hz..5V", QuantityErrorKind.WrongDimension)]
    [InlineData("20Hz..30Hz..40Hz", QuantityErrorKind.Malformed)]
    [InlineData("", QuantityErrorKind.Empty)]
    [InlineData(null, QuantityErrorKind.Empty)]
    public void A_bad_range_is_an_error_of_the_right_kind(string? text, QuantityErrorKind kind)
    {
        Assert.False(QuantityRange.TryParse(text, Dimension.Frequency, out _, out var error));
        Assert.Equal(kind, error.Kind);
    }

    [Fact]
    public void An_error_in_one_end_says_which_end()
    {
        Assert.False(QuantityRange.TryParse("20Hz..5V", Dimension.Frequency, out _, out var error));
        Assert.StartsWith("the high end of the range: '5V' is a voltage", error.Message, StringComparison.Ordinal);
        Assert.Equal(Dimension.Voltage, error.Found);
    }

    [Fact]
    public void A_range_is_written_with_spaced_dots_and_reads_back()
    {
        var range = new QuantityRange(new Quantity(20, Dimension.Frequency), new Quantity(20e3, Dimension.Frequency));
        Assert.Equal("20 Hz .. 20 kHz", range.Format());
        Assert.Equal("20 Hz .. 20 kHz", range.ToString());
        Assert.True(QuantityRange.TryParse(range.Format(15), Dimension.Frequency, out var back, out _));
        Assert.Equal(range, back);
    }
}
