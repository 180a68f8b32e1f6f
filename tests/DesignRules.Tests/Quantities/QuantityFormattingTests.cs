using CsCheck;
using DesignRules.Quantities;

namespace DesignRules.Tests.Quantities;

public sealed class ValuesAreWrittenInEngineeringNotation
{
    [Theory]
    [InlineData(4700.0, Dimension.Resistance, "4.7 kΩ")]
    [InlineData(10e-9, Dimension.Capacitance, "10 nF")]
    [InlineData(8e6, Dimension.SlewRate, "8 V/µs")]
    [InlineData(0.5e6, Dimension.SlewRate, "0.5 V/µs")]
    [InlineData(2500e6, Dimension.SlewRate, "2500 V/µs")]
    [InlineData(-12.0, Dimension.Voltage, "-12 V")]
    [InlineData(0.25, Dimension.Voltage, "250 mV")]
    [InlineData(50e-6, Dimension.TemperatureCoefficient, "50 ppm/°C")]
    [InlineData(18e-9, Dimension.VoltageNoiseDensity, "18 nV/√Hz")]
    [InlineData(0.4e-12, Dimension.CurrentNoiseDensity, "0.4 pA/√Hz")]
    [InlineData(0.125, Dimension.Power, "125 mW")]
    [InlineData(3e6, Dimension.Frequency, "3 MHz")]
    [InlineData(20.0, Dimension.Frequency, "20 Hz")]
    [InlineData(1.6e-6, Dimension.Time, "1.6 µs")]
    [InlineData(0.02, Dimension.Current, "20 mA")]
    [InlineData(10e-3, Dimension.Inductance, "10 mH")]
    [InlineData(25.0, Dimension.Temperature, "25 °C")]
    [InlineData(-40.0, Dimension.Temperature, "-40 °C")]
    [InlineData(2.0, Dimension.Ratio, "2")]
    [InlineData(-10.0, Dimension.Ratio, "-10")]
    [InlineData(0.005, Dimension.Ratio, "0.005")]
    [InlineData(199526.2314968879, Dimension.Ratio, "200000")]
    [InlineData(1e-9, Dimension.Ratio, "1e-9")]
    [InlineData(0.0, Dimension.Voltage, "0 V")]
    [InlineData(0.0, Dimension.Ratio, "0")]
    [InlineData(999.96, Dimension.Resistance, "1 kΩ")]
    [InlineData(1e-18, Dimension.Capacitance, "0.001 fF")]
    [InlineData(2e15, Dimension.Resistance, "2000 TΩ")]
    [InlineData(1e-3, Dimension.SlewRate, "1e-9 V/µs")]
    [InlineData(double.NaN, Dimension.Voltage, "NaN V")]
    public void Each_value_is_written_with_three_significant_digits(double value, Dimension dimension, string expected) =>
        Assert.Equal(expected, new Quantity(value, dimension).Format());

    [Theory]
    [InlineData(4749.0, 2, "4.7 kΩ")]
    [InlineData(4749.0, 1, "5 kΩ")]
    [InlineData(4749.0, 4, "4.749 kΩ")]
    [InlineData(4749.0, 0, "5 kΩ")] // clamped to one digit
    [InlineData(1234567.0, 3, "1.23 MΩ")]
    [InlineData(1234567.0, 7, "1.234567 MΩ")]
    public void The_number_of_significant_digits_is_the_callers_choice(double value, int digits, string expected) =>
        Assert.Equal(expected, new Quantity(value, Dimension.Resistance).Format(digits));

    [Theory]
    [InlineData(0.01, "1 %")]
    [InlineData(0.005, "0.5 %")]
    [InlineData(0.99, "99 %")]
    [InlineData(-0.001, "-0.1 %")]
    public void Ratios_are_written_as_percent_when_asked(double value, string expected) =>
        Assert.Equal(expected, new Quantity(value, Dimension.Ratio).FormatPercent());

    [Fact]
    public void Negative_zero_is_written_as_zero() =>
        Assert.Equal("0 V", new Quantity(-0.0, Dimension.Voltage).Format());

    [Fact]
    public void To_string_is_the_three_digit_format() =>
        Assert.Equal("4.7 kΩ", new Quantity(4700, Dimension.Resistance).ToString());
}

public sealed class FormattedValuesReadBack
{
    private static readonly Gen<Quantity> Quantities =
        Gen.Select(Gen.Double[1.0, 10.0], Gen.Int[-20, 20], Gen.Bool, Gen.Enum<Dimension>())
            .Select((mantissa, exponent, negative, dimension) =>
                new Quantity((negative ? -1 : 1) * mantissa * Math.Pow(10, exponent), dimension));

    [Fact]
    public void Fifteen_digit_text_reads_back_as_the_same_value() =>
        Quantities.Sample(q =>
        {
            var back = QuantityAssert.Parses(q.Format(15), q.Dimension);
            QuantityAssert.Close(q.Value, back.Value, 1e-13);
        }, iter: 10_000, seed: "7e_xvcf8Rfb1");

    [Fact]
    public void Three_digit_text_reads_back_within_its_rounding() =>
        Quantities.Sample(q =>
        {
            var back = QuantityAssert.Parses(q.Format(), q.Dimension);
            QuantityAssert.Close(q.Value, back.Value, 5e-3);
        }, iter: 10_000, seed: "7e_xvcf8Rfb1");

    [Fact]
    public void Percent_text_reads_back_as_the_same_ratio() =>
        Gen.Double[-2.0, 2.0].Sample(r =>
        {
            var q = new Quantity(r, Dimension.Ratio);
            QuantityAssert.Close(r, QuantityAssert.Parses(q.FormatPercent(15), Dimension.Ratio).Value, 1e-13);
        }, iter: 10_000, seed: "7e_xvcf8Rfb1");

    [Fact]
    public void Zero_reads_back_in_every_dimension()
    {
        foreach (var dimension in Enum.GetValues<Dimension>())
        {
            Assert.Equal(0.0, QuantityAssert.Parses(new Quantity(0, dimension).Format(), dimension).Value);
        }
    }
}
