using DesignRules.Quantities;

namespace DesignRules.Tests.Quantities;

public sealed class RkmCodesFollowIec60062
{
    // IEC 60062 RKM code: the letter stands in for the decimal point and gives the multiplier
    // (R = 1 for ohms, p n µ m k M G T); examples from memory of the standard's tables.
    [Theory]
    [InlineData("R47", Dimension.Resistance, 0.47)]
    [InlineData("4R7", Dimension.Resistance, 4.7)]
    [InlineData("47R", Dimension.Resistance, 47.0)]
    [InlineData("4k7", Dimension.Resistance, 4700.0)]
    [InlineData("4K7", Dimension.Resistance, 4700.0)]
    [InlineData("47k", Dimension.Resistance, 47000.0)]
    [InlineData("4M7", Dimension.Resistance, 4.7e6)]
    [InlineData("2M2", Dimension.Resistance, 2.2e6)]
    [InlineData("1G5", Dimension.Resistance, 1.5e9)]
    [InlineData("0R", Dimension.Resistance, 0.0)]
    [InlineData("4k7Ω", Dimension.Resistance, 4700.0)]
    [InlineData("4k7 ohm", Dimension.Resistance, 4700.0)]
    [InlineData("1n5", Dimension.Capacitance, 1.5e-9)]
    [InlineData("1n5F", Dimension.Capacitance, 1.5e-9)]
    [InlineData("p68", Dimension.Capacitance, 0.68e-12)]
    [InlineData("6p8", Dimension.Capacitance, 6.8e-12)]
    [InlineData("2u2", Dimension.Capacitance, 2.2e-6)]
    [InlineData("2µ2", Dimension.Capacitance, 2.2e-6)]
    [InlineData("2m2", Dimension.Inductance, 2.2e-3)]
    [InlineData("-1k5", Dimension.Voltage, -1500.0)]
    [InlineData("3k3 Hz", Dimension.Frequency, 3300.0)]
    public void Rkm_codes_read_as_their_value(string text, Dimension dimension, double expected) =>
        QuantityAssert.Close(expected, QuantityAssert.Parses(text, dimension).Value);

    [Fact]
    public void The_rkm_mark_R_means_ohms_so_it_is_a_resistance_where_a_voltage_is_expected()
    {
        var error = QuantityAssert.Fails("4R7", Dimension.Voltage, QuantityErrorKind.WrongDimension);
        Assert.Equal(Dimension.Resistance, error.Found);
    }

    [Theory]
    [InlineData("4R7F", Dimension.Capacitance)]
    [InlineData("4k7kΩ", Dimension.Resistance)]
    [InlineData("4k7.5", Dimension.Resistance)]
    [InlineData("4r7", Dimension.Resistance)]
    [InlineData("R", Dimension.Resistance)]
    [InlineData("1n5dB", Dimension.Ratio)]
    public void Rkm_codes_with_extra_marks_are_malformed(string text, Dimension dimension) =>
        QuantityAssert.Fails(text, dimension, QuantityErrorKind.Malformed);
}
