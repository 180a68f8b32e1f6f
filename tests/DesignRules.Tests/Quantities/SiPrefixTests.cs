using DesignRules.Quantities;

namespace DesignRules.Tests.Quantities;

public sealed class SiPrefixesFollowTheSiBrochure
{
    // SI Brochure (BIPM, 9th edition 2019), table 7: decimal multiples and submultiples of SI units.
    public static TheoryData<string, int> Prefixes => new()
    {
        { "f", -15 },
        { "p", -12 },
        { "n", -9 },
        { "u", -6 },      // ASCII stand-in for micro
        { "\u00B5", -6 }, // micro sign
        { "\u03BC", -6 }, // Greek small letter mu
        { "m", -3 },
        { "", 0 },
        { "k", 3 },
        { "K", 3 },       // common practice for kilo on drawings
        { "M", 6 },
        { "G", 9 },
        { "T", 12 },
    };

    private static readonly (string Unit, Dimension Dimension)[] Units =
    [
        ("V", Dimension.Voltage),
        ("A", Dimension.Current),
        ("Ω", Dimension.Resistance),
        ("ohm", Dimension.Resistance),
        ("F", Dimension.Capacitance),
        ("H", Dimension.Inductance),
        ("Hz", Dimension.Frequency),
        ("s", Dimension.Time),
        ("W", Dimension.Power),
        ("V/s", Dimension.SlewRate),
        ("V/rtHz", Dimension.VoltageNoiseDensity),
        ("", Dimension.Ratio),
    ];

    [Theory]
    [MemberData(nameof(Prefixes))]
    public void Every_prefix_scales_every_unit_that_takes_one(string prefix, int exponent)
    {
        foreach (var (unit, dimension) in Units)
        {
            foreach (string text in new[] { $"2.5{prefix}{unit}", $"2.5 {prefix}{unit}", $"-25{prefix}{unit}" })
            {
                double expected = (text.StartsWith('-') ? -25 : 2.5) * Math.Pow(10, exponent);
                QuantityAssert.Close(expected, QuantityAssert.Parses(text, dimension).Value);
            }
        }
    }

    [Theory]
    [MemberData(nameof(Prefixes))]
    public void A_prefix_without_unit_takes_the_expected_dimension(string prefix, int exponent)
    {
        var q = QuantityAssert.Parses($"3.3{prefix}", Dimension.Capacitance);
        QuantityAssert.Close(3.3 * Math.Pow(10, exponent), q.Value);
    }

    [Fact]
    public void Lower_case_m_is_milli_and_upper_case_M_is_mega()
    {
        QuantityAssert.Close(1e-3, QuantityAssert.Parses("1m", Dimension.Resistance).Value);
        QuantityAssert.Close(1e6, QuantityAssert.Parses("1M", Dimension.Resistance).Value);
        QuantityAssert.Close(1e-3, QuantityAssert.Parses("1 mΩ", Dimension.Resistance).Value);
        QuantityAssert.Close(1e6, QuantityAssert.Parses("1 MΩ", Dimension.Resistance).Value);
    }
}
