using System.Text.RegularExpressions;

namespace DesignRules.Rules.Tests;

/// <summary>
/// Figures have stable, typed keys: one kind per measured quantity with a unique, well-formed name, a key made of the
/// kind and the subject, and a label for people derived from both.
/// </summary>
public sealed partial class FigureKeyTests
{
    [Fact]
    public void Every_kind_has_a_unique_well_formed_name_a_unit_and_a_label()
    {
        var names = FigureKinds.All.Select(k => k.Name).ToList();
        Assert.True(names.Count > 50, "the kinds were not all found");
        Assert.Equal(names.Count, names.Distinct(StringComparer.Ordinal).Count());
        Assert.All(FigureKinds.All, k =>
        {
            Assert.Matches(KindName(), k.Name);
            Assert.False(string.IsNullOrWhiteSpace(k.Unit), k.Name);
            Assert.False(string.IsNullOrWhiteSpace(k.Label), k.Name);
        });
    }

    [Fact]
    public void A_key_is_the_kind_and_the_subject_and_its_label_reads_as_words()
    {
        Assert.Equal("slew.demand@rect.u1.out", FigureKinds.SlewDemand.At("rect.u1.out").ToString());
        Assert.Equal("slew demanded at rect.u1.out", FigureKinds.SlewDemand.At("rect.u1.out").Label);
        Assert.Equal("swing.margin@u1", FigureKinds.SwingMargin.At("u1").ToString());
        Assert.Equal("output swing margin u1", FigureKinds.SwingMargin.At("u1").Label);
        Assert.Equal("tolerance.worst-case", FigureKinds.WorstCaseTransferError.Key.ToString());
        Assert.Equal("worst-case transfer error", FigureKinds.WorstCaseTransferError.Key.Label);
    }

    [Fact]
    public void A_judged_figure_has_its_margin_on_the_side_the_limit_asks_for()
    {
        var atMost = FigureKinds.OutputCurrent.Of("u1", 0.012).AtMost(0.016);
        Assert.Equal(0.004, atMost.Margin!.Value, 12);
        var atLeast = FigureKinds.FullPowerBandwidth.Of("u1", 1_000).AtLeast(1_200);
        Assert.Equal(-200, atLeast.Margin!.Value, 9);
        Assert.Equal("A", atMost.Unit);
    }

    [Fact]
    public void The_example_repository_records_no_key_twice_in_a_stage_and_only_known_kinds()
    {
        var report = ExampleRepositoryTests.Check();
        foreach (var design in report.Designs)
        {
            foreach (var (stage, figures) in design.StageFigures)
            {
                Assert.Equal(figures.Count, figures.Select(f => f.Key).Distinct().Count());
                Assert.All(figures, f => Assert.Contains(f.Key.Kind, FigureKinds.All));
            }
        }
    }

    [GeneratedRegex("^[a-z]+(-[a-z]+)*(\\.[a-z]+(-[a-z]+)*)*$", RegexOptions.CultureInvariant)]
    private static partial Regex KindName();
}
