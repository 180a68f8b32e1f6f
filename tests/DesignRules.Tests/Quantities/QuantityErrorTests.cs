using CsCheck;
using DesignRules.Quantities;

namespace DesignRules.Tests.Quantities;

public sealed class BadValuesComeBackAsErrors
{
    [Theory]
    [InlineData("5 V", Dimension.Resistance, Dimension.Voltage)]
    [InlineData("10 nF", Dimension.Resistance, Dimension.Capacitance)]
    [InlineData("1 kHz", Dimension.Time, Dimension.Frequency)]
    [InlineData("8 V/us", Dimension.Voltage, Dimension.SlewRate)]
    [InlineData("10 mA", Dimension.Voltage, Dimension.Current)]
    [InlineData("125 mW", Dimension.Current, Dimension.Power)]
    [InlineData("10 mH", Dimension.Capacitance, Dimension.Inductance)]
    [InlineData("50 ppm/°C", Dimension.Ratio, Dimension.TemperatureCoefficient)]
    [InlineData("50 ppm", Dimension.TemperatureCoefficient, Dimension.Ratio)]
    [InlineData("1%", Dimension.Voltage, Dimension.Ratio)]
    [InlineData("106 dB", Dimension.Voltage, Dimension.Ratio)]
    [InlineData("25 °C", Dimension.Voltage, Dimension.Temperature)]
    [InlineData("18 nV/rtHz", Dimension.Voltage, Dimension.VoltageNoiseDensity)]
    [InlineData("10R", Dimension.Capacitance, Dimension.Resistance)]
    [InlineData("4.7 kΩ", Dimension.Ratio, Dimension.Resistance)]
    public void A_unit_of_another_dimension_is_a_wrong_dimension_error_naming_both(string text, Dimension expected, Dimension found)
    {
        var error = QuantityAssert.Fails(text, expected, QuantityErrorKind.WrongDimension);
        Assert.Equal(found, error.Found);
        Assert.Contains($"'{text}'", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void The_wrong_dimension_message_reads_as_a_sentence()
    {
        var error = QuantityAssert.Fails("5 V", Dimension.Resistance, QuantityErrorKind.WrongDimension);
        Assert.Equal("'5 V' is a voltage but a resistance is expected", error.Message);
    }

    [Theory]
    [InlineData("4.7meg")]
    [InlineData("4.7megohm")]
    [InlineData("1 Meg")]
    [InlineData("2MEG")]
    public void Mega_spelt_out_is_refused_with_the_hint_to_write_M(string text)
    {
        var error = QuantityAssert.Fails(text, Dimension.Resistance, QuantityErrorKind.Malformed);
        Assert.Contains("write M", error.Message, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("abc")]
    [InlineData("4.7 kX")]
    [InlineData("4..7")]
    [InlineData("1e")]
    [InlineData("k")]
    [InlineData("--5")]
    [InlineData("5 Ω Ω")]
    [InlineData("4 .7")]
    [InlineData("1,5k")]
    [InlineData("5 k Ω")]
    [InlineData("5 mdB")]
    [InlineData("5 kppm")]
    [InlineData("4.7 kohmx")]
    [InlineData("4.7 KΩs")]
    [InlineData("±4.7k")]
    [InlineData("4k7k")]
    [InlineData("20..30")]
    [InlineData("-")]
    [InlineData("±")]
    [InlineData("0x10")]
    public void Text_that_is_no_value_is_malformed_and_says_what_was_expected(string text)
    {
        var error = QuantityAssert.Fails(text, Dimension.Resistance, QuantityErrorKind.Malformed);
        Assert.Contains(QuantityForms.Example(Dimension.Resistance), error.Message, StringComparison.Ordinal);
        Assert.Null(error.Found);
    }

    [Theory]
    [InlineData("±15 V", Dimension.Voltage)]
    [InlineData("±1 kHz", Dimension.Frequency)]
    public void Plus_minus_is_only_for_tolerance_like_values(string text, Dimension expected)
    {
        var error = QuantityAssert.Fails(text, expected, QuantityErrorKind.Malformed);
        Assert.Contains("±", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Text_longer_than_64_characters_is_malformed()
    {
        QuantityAssert.Parses(new string('1', 64), Dimension.Ratio);
        QuantityAssert.Fails(new string('1', 65), Dimension.Ratio, QuantityErrorKind.Malformed);
        QuantityAssert.Fails(new string('1', 100_000) + " V", Dimension.Voltage, QuantityErrorKind.Malformed);
    }

    [Theory]
    [InlineData(null)]
    [InlineData("")]
    [InlineData("   ")]
    [InlineData("\t\n")]
    public void Missing_text_is_an_empty_error(string? text) =>
        QuantityAssert.Fails(text, Dimension.Voltage, QuantityErrorKind.Empty);

    [Theory]
    [InlineData("NaN")]
    [InlineData("nan V")]
    [InlineData("Infinity")]
    [InlineData("-inf")]
    [InlineData("∞")]
    [InlineData("1e400")]
    [InlineData("1e308k")]
    [InlineData("1e99999999999999999999")]
    public void Non_finite_values_are_rejected(string text) =>
        QuantityAssert.Fails(text, Dimension.Voltage, QuantityErrorKind.NotFinite);

    [Fact]
    public void Decibels_too_large_for_a_double_are_rejected() =>
        QuantityAssert.Fails("10000 dB", Dimension.Ratio, QuantityErrorKind.NotFinite);

    [Fact]
    public void Tiny_exponents_underflow_to_zero_without_error() =>
        Assert.Equal(0.0, QuantityAssert.Parses("1e-99999999999999", Dimension.Voltage).Value);
}

public sealed class ParsingNeverThrows
{
    private const string ValueCharacters = "0123456789..eE+-±−kKmMuµμnpfGTRrΩΩohmsVAFHWz/°C%dBp√()rtq ,\t";

    [Fact]
    public void Random_strings_give_a_value_or_an_error_never_an_exception() =>
        Gen.Select(Gen.String, Gen.Enum<Dimension>()).Sample(CheckOutcome, iter: 10_000, seed: "7e_xvcf8Rfb1");

    [Fact]
    public void Random_strings_made_of_value_characters_give_a_value_or_an_error_never_an_exception() =>
        Gen.Select(Gen.String[Gen.Char[ValueCharacters], 0, 20], Gen.Enum<Dimension>()).Sample(CheckOutcome, iter: 10_000, seed: "7e_xvcf8Rfb1");

    [Fact]
    public void Random_ranges_give_a_range_or_an_error_never_an_exception() =>
        Gen.Select(Gen.String[Gen.Char[ValueCharacters], 0, 12], Gen.String[Gen.Char[ValueCharacters], 0, 12], Gen.Enum<Dimension>())
            .Sample((low, high, dimension) =>
            {
                bool ok = QuantityRange.TryParse(low + ".." + high, dimension, out var range, out var error);
                Assert.Equal(ok, error is null);
                if (ok)
                {
                    Assert.True(range.Low.Value <= range.High.Value);
                }
            }, iter: 10_000, seed: "7e_xvcf8Rfb1");

    private static void CheckOutcome(string text, Dimension dimension)
    {
        bool ok = Quantity.TryParse(text, dimension, out var q, out var error);
        if (ok)
        {
            Assert.Null(error);
            Assert.Equal(dimension, q.Dimension);
            Assert.True(double.IsFinite(q.Value));
        }
        else
        {
            Assert.NotNull(error);
            Assert.False(string.IsNullOrWhiteSpace(error.Message));
            Assert.Equal(error.Kind == QuantityErrorKind.WrongDimension, error.Found is not null);
        }
    }
}
