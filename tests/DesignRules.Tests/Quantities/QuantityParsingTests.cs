using DesignRules.Quantities;

namespace DesignRules.Tests.Quantities;

public sealed class ValuesAreReadInEveryAcceptedForm
{
    [Theory]
    // resistance
    [InlineData("4.7k", Dimension.Resistance, 4700.0)]
    [InlineData("4.7 kΩ", Dimension.Resistance, 4700.0)]
    [InlineData("4.7kΩ", Dimension.Resistance, 4700.0)]
    [InlineData("4.7 k\u2126", Dimension.Resistance, 4700.0)] // ohm sign
    [InlineData("4.7kohm", Dimension.Resistance, 4700.0)]
    [InlineData("4.7 kOhms", Dimension.Resistance, 4700.0)]
    [InlineData("4.7 KOHM", Dimension.Resistance, 4700.0)]
    [InlineData("10R", Dimension.Resistance, 10.0)]
    [InlineData("600", Dimension.Resistance, 600.0)]
    [InlineData("  10k  ", Dimension.Resistance, 10000.0)]
    [InlineData("4.7Mohm", Dimension.Resistance, 4.7e6)]
    // voltage, current, power
    [InlineData("-12V", Dimension.Voltage, -12.0)]
    [InlineData("-12 V", Dimension.Voltage, -12.0)]
    [InlineData("\u221212 V", Dimension.Voltage, -12.0)] // minus sign
    [InlineData("+15 V", Dimension.Voltage, 15.0)]
    [InlineData("- 5 V", Dimension.Voltage, -5.0)]
    [InlineData("250 mV", Dimension.Voltage, 0.25)]
    [InlineData("0.7 V", Dimension.Voltage, 0.7)]
    [InlineData(".5V", Dimension.Voltage, 0.5)]
    [InlineData("5.V", Dimension.Voltage, 5.0)]
    [InlineData("1e3 V", Dimension.Voltage, 1000.0)]
    [InlineData("1E-3V", Dimension.Voltage, 1e-3)]
    [InlineData("2.5e+1 mV", Dimension.Voltage, 0.025)]
    [InlineData("20 mA", Dimension.Current, 0.02)]
    [InlineData("30 pA", Dimension.Current, 30e-12)]
    [InlineData("125 mW", Dimension.Power, 0.125)]
    // capacitance, inductance, frequency, time
    [InlineData("10nF", Dimension.Capacitance, 10e-9)]
    [InlineData("10 nF", Dimension.Capacitance, 10e-9)]
    [InlineData("100p", Dimension.Capacitance, 100e-12)]
    [InlineData("1 uF", Dimension.Capacitance, 1e-6)]
    [InlineData("1 µF", Dimension.Capacitance, 1e-6)]
    [InlineData("1 μF", Dimension.Capacitance, 1e-6)]
    [InlineData("10 mH", Dimension.Inductance, 10e-3)]
    [InlineData("1 kHz", Dimension.Frequency, 1000.0)]
    [InlineData("20Hz", Dimension.Frequency, 20.0)]
    [InlineData("3 MHz", Dimension.Frequency, 3e6)]
    [InlineData("1 us", Dimension.Time, 1e-6)]
    [InlineData("1.6 µs", Dimension.Time, 1.6e-6)]
    [InlineData("100 ms", Dimension.Time, 0.1)]
    [InlineData("2 sec", Dimension.Time, 2.0)]
    // slew rate: V/us means 1e6 V/s
    [InlineData("8 V/us", Dimension.SlewRate, 8e6)]
    [InlineData("8V/us", Dimension.SlewRate, 8e6)]
    [InlineData("8 V/µs", Dimension.SlewRate, 8e6)]
    [InlineData("8 V/μs", Dimension.SlewRate, 8e6)]
    [InlineData("500 V/ms", Dimension.SlewRate, 5e5)]
    [InlineData("13e6 V/s", Dimension.SlewRate, 13e6)]
    [InlineData("13 MV/s", Dimension.SlewRate, 13e6)]
    [InlineData("13", Dimension.SlewRate, 13.0)]
    // temperature and temperature coefficient (per kelvin)
    [InlineData("25 °C", Dimension.Temperature, 25.0)]
    [InlineData("-40C", Dimension.Temperature, -40.0)]
    [InlineData("50ppm/°C", Dimension.TemperatureCoefficient, 50e-6)]
    [InlineData("50 ppm/°C", Dimension.TemperatureCoefficient, 50e-6)]
    [InlineData("50 ppm/C", Dimension.TemperatureCoefficient, 50e-6)]
    [InlineData("25 ppm/K", Dimension.TemperatureCoefficient, 25e-6)]
    [InlineData("±25 ppm/K", Dimension.TemperatureCoefficient, 25e-6)]
    [InlineData("-150 ppm/°C", Dimension.TemperatureCoefficient, -150e-6)]
    [InlineData("0.0039 /K", Dimension.TemperatureCoefficient, 0.0039)]
    [InlineData("3.9m/°C", Dimension.TemperatureCoefficient, 0.0039)]
    // noise density
    [InlineData("18 nV/√Hz", Dimension.VoltageNoiseDensity, 18e-9)]
    [InlineData("18 nV/rtHz", Dimension.VoltageNoiseDensity, 18e-9)]
    [InlineData("18nV/sqrt(Hz)", Dimension.VoltageNoiseDensity, 18e-9)]
    [InlineData("1.2 µV/√Hz", Dimension.VoltageNoiseDensity, 1.2e-6)]
    [InlineData("0.5 pA/rtHz", Dimension.CurrentNoiseDensity, 0.5e-12)]
    [InlineData("4 fA/√Hz", Dimension.CurrentNoiseDensity, 4e-15)]
    // ratios: plain, percent, ppm
    [InlineData("2", Dimension.Ratio, 2.0)]
    [InlineData("-2", Dimension.Ratio, -2.0)]
    [InlineData("1%", Dimension.Ratio, 0.01)]
    [InlineData("1 %", Dimension.Ratio, 0.01)]
    [InlineData("±0.5%", Dimension.Ratio, 0.005)]
    [InlineData("± 0.5 %", Dimension.Ratio, 0.005)]
    [InlineData("99%", Dimension.Ratio, 0.99)]
    [InlineData("50 ppm", Dimension.Ratio, 50e-6)]
    public void Each_form_reads_as_its_si_value(string text, Dimension dimension, double expected) =>
        QuantityAssert.Close(expected, QuantityAssert.Parses(text, dimension).Value);

    // Decibel voltage-ratio definition, 20·log10: ratio = 10^(dB / 20).
    [Theory]
    [InlineData("106 dB", 199526.23149688796)]
    [InlineData("106dB", 199526.23149688796)]
    [InlineData("20 dB", 10.0)]
    [InlineData("0 dB", 1.0)]
    [InlineData("6 dB", 1.9952623149688795)]
    [InlineData("-20 dB", 0.1)]
    [InlineData("-3 dB", 0.70794578438413791)]
    public void Decibels_read_as_a_voltage_ratio(string text, double expected) =>
        QuantityAssert.Close(expected, QuantityAssert.Parses(text, Dimension.Ratio).Value, 1e-12);

    [Fact]
    public void A_negative_gain_is_written_as_a_plain_negative_number() =>
        Assert.Equal(-10.0, QuantityAssert.Parses("-10", Dimension.Ratio).Value);

    [Fact]
    public void Negative_zero_reads_as_zero() =>
        Assert.True(double.IsPositive(QuantityAssert.Parses("-0 V", Dimension.Voltage).Value));

    [Theory]
    [InlineData("4.7")]
    [InlineData("4.7k")]
    [InlineData("1 m")]
    public void A_bare_number_takes_the_expected_dimension(string text)
    {
        foreach (var dimension in Enum.GetValues<Dimension>())
        {
            Assert.Equal(dimension, QuantityAssert.Parses(text, dimension).Dimension);
        }
    }

    [Fact]
    public void Decimal_values_are_read_to_the_nearest_double()
    {
        // 4.7k must be exactly the double nearest 4700, not 4.7 × 1000 with a rounding error
        Assert.Equal(4700.0, QuantityAssert.Parses("4.7k", Dimension.Resistance).Value);
        Assert.Equal(4.7e-9, QuantityAssert.Parses("4.7 nF", Dimension.Capacitance).Value);
        Assert.Equal(0.3e-6, QuantityAssert.Parses("0.3 us", Dimension.Time).Value);
    }
}
