using DesignRules.Quantities;

namespace DesignRules.Tests.Quantities;

public sealed class ESeriesFollowsIec60063
{
    // IEC 60063:2015 table (E6/E12/E24), from memory of the published table
    private static readonly double[] E6Table = [1.0, 1.5, 2.2, 3.3, 4.7, 6.8];

    // IEC 60063:2015 table (E6/E12/E24), from memory of the published table
    private static readonly double[] E12Table = [1.0, 1.2, 1.5, 1.8, 2.2, 2.7, 3.3, 3.9, 4.7, 5.6, 6.8, 8.2];

    // IEC 60063:2015 table (E6/E12/E24), from memory of the published table
    private static readonly double[] E24Table =
    [
        1.0, 1.1, 1.2, 1.3, 1.5, 1.6, 1.8, 2.0, 2.2, 2.4, 2.7, 3.0,
        3.3, 3.6, 3.9, 4.3, 4.7, 5.1, 5.6, 6.2, 6.8, 7.5, 8.2, 9.1,
    ];

    public static TheoryData<string, double[]> HistoricalTables => new()
    {
        { "E6", E6Table },
        { "E12", E12Table },
        { "E24", E24Table },
    };

    // IEC 60063 E96 values, from memory of the published table (a sample across the decade).
    public static TheoryData<double> E96FromMemory => new()
    {
        1.00, 1.02, 1.05, 1.07, 1.10, 1.13, 1.15, 1.18, 1.21, 1.24, 1.27, 1.30,
        1.50, 2.00, 3.01, 3.32, 4.99, 6.04, 7.50, 8.06, 9.09, 9.76,
    };

    [Theory]
    [MemberData(nameof(HistoricalTables))]
    public void The_historical_series_hold_exactly_the_published_table(string name, double[] table)
    {
        Assert.True(ESeries.TryGet(name, out var series));
        Assert.Equal(name, series.Name);
        Assert.Equal(table, series.Mantissas);
    }

    [Theory]
    [MemberData(nameof(HistoricalTables))]
    public void Every_table_value_is_read_in_decimal_and_rkm_form_and_is_contained_from_1_ohm_to_10_megohm(string name, double[] table)
    {
        Assert.True(ESeries.TryGet(name, out var series));
        foreach (double mantissa in table)
        {
            int hundredths = (int)Math.Round(mantissa * 10); // two figures, e.g. 47 for 4.7
            for (int decade = 0; decade <= 6; decade++)
            {
                double expected = hundredths * Math.Pow(10, decade - 1);
                foreach (string text in new[] { Decimal(hundredths, decade), Rkm(hundredths, decade) })
                {
                    var q = QuantityAssert.Parses(text, Dimension.Resistance);
                    QuantityAssert.Close(expected, q.Value);
                    Assert.True(series.Contains(q.Value), $"{name} should contain {text}");
                }
            }
        }
    }

    [Theory]
    [MemberData(nameof(E96FromMemory))]
    public void E96_contains_the_values_remembered_from_the_published_table(double mantissa)
    {
        Assert.Contains(mantissa, ESeries.E96.Mantissas);
        Assert.True(ESeries.E96.Contains(mantissa * 1000));
        Assert.True(ESeries.E192.Contains(mantissa * 1000));
    }

    [Fact]
    public void The_three_figure_series_have_the_expected_length_and_ascend_within_one_decade()
    {
        foreach (var (series, count) in new[] { (ESeries.E48, 48), (ESeries.E96, 96), (ESeries.E192, 192) })
        {
            Assert.Equal(count, series.Mantissas.Count);
            Assert.Equal(1.0, series.Mantissas[0]);
            Assert.All(series.Mantissas, m => Assert.InRange(m, 1.0, 9.99));
            Assert.Equal(series.Mantissas.Order(), series.Mantissas);
            Assert.Equal(count, series.Mantissas.Distinct().Count());
        }
    }

    [Fact]
    public void E192_keeps_the_standard_exception_9_20_where_the_formula_gives_9_19()
    {
        Assert.Contains(9.20, ESeries.E192.Mantissas);
        Assert.DoesNotContain(9.19, ESeries.E192.Mantissas);
    }

    [Fact]
    public void Each_three_figure_series_is_every_second_value_of_the_next_finer_one()
    {
        Assert.Equal(ESeries.E96.Mantissas.Where((_, i) => i % 2 == 0), ESeries.E48.Mantissas);
        Assert.Equal(ESeries.E192.Mantissas.Where((_, i) => i % 2 == 0), ESeries.E96.Mantissas);
    }

    [Fact]
    public void E24_follows_the_historical_table_not_the_pure_formula()
    {
        // round(10^(10/24), 1) = 2.6, but the table has 2.7 (IEC 60063 historical E24 value)
        Assert.Equal(2.6, Math.Round(Math.Pow(10, 10.0 / 24), 1));
        Assert.True(ESeries.E24.Contains(2700));
        Assert.False(ESeries.E24.Contains(2600));
    }

    [Theory]
    [InlineData(4800.0)]
    [InlineData(0.0)]
    [InlineData(-4700.0)]
    [InlineData(double.NaN)]
    [InlineData(double.PositiveInfinity)]
    public void Values_off_the_series_or_not_positive_are_not_contained(double value) =>
        Assert.False(ESeries.E24.Contains(value));

    [Theory]
    [InlineData("E12", 4600.0, 4700.0)]
    [InlineData("E24", 9600.0, 10000.0)]
    [InlineData("E24", 9.3e-9, 9.1e-9)]
    [InlineData("E6", 0.95, 1.0)]
    [InlineData("E6", 1.05, 1.0)]
    [InlineData("E96", 4990.4, 4990.0)]
    [InlineData("E12", -4600.0, -4700.0)]
    public void Nearest_picks_the_closest_series_value_by_ratio(string name, double value, double expected)
    {
        Assert.True(ESeries.TryGet(name, out var series));
        Assert.Equal(expected, series.Nearest(value));
    }

    [Theory]
    [InlineData("e96", true)]
    [InlineData("E192", true)]
    [InlineData("E7", false)]
    [InlineData("", false)]
    public void Series_are_found_by_name_ignoring_case(string name, bool found) =>
        Assert.Equal(found, ESeries.TryGet(name, out _));

    [Fact]
    public void A_series_prints_as_its_name() =>
        Assert.Equal("E96", ESeries.E96.ToString());

    /// <summary>"4.7", "47", "470", "4.7k", "47k", "470k", "4.7M" for 47 hundredths-of-a-decade units in decades 0..6.</summary>
    private static string Decimal(int twoFigures, int decade)
    {
        string[] prefixes = ["", "k", "M"];
        int shift = (decade % 3) - 1; // 4.7 / 47 / 470 within each thousand
        string digits = shift switch
        {
            -1 => $"{twoFigures / 10}.{twoFigures % 10}",
            0 => $"{twoFigures}",
            _ => $"{twoFigures}0",
        };
        return digits + prefixes[decade / 3];
    }

    /// <summary>IEC 60062 RKM form: "4R7", "47R", "470R", "4k7", "47k", "470k", "4M7".</summary>
    private static string Rkm(int twoFigures, int decade)
    {
        string[] marks = ["R", "k", "M"];
        string mark = marks[decade / 3];
        return ((decade % 3) - 1) switch
        {
            -1 => $"{twoFigures / 10}{mark}{twoFigures % 10}",
            0 => $"{twoFigures}{mark}",
            _ => $"{twoFigures}0{mark}",
        };
    }
}
