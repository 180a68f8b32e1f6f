using DesignRules.Loading;
using DesignRules.Model;
using DesignRules.Quantities;

namespace DesignRules.Tests.Loading;

/// <summary>Well-formed design files load into the model with every value located.</summary>
public sealed class GoodInputFixtureTests
{
    [Fact]
    public void An_inverting_stage_loads_with_its_values_parts_and_positions()
    {
        var path = Path.Combine(FixtureFiles.Directory("loader/good"), "inverting.yaml");

        var result = DesignLoader.LoadFiles([path]);

        Assert.Empty(result.Diagnostics);
        var design = Assert.Single(result.Designs);
        Assert.Equal("fixture", design.Id.Value);
        Assert.Equal(15, design.Supplies.Positive.Value.Value);
        Assert.Equal(-15, design.Supplies.Negative.Value.Value);
        Assert.Equal(WaveformKind.Sine, design.Source.Waveform.Kind);
        Assert.Equal(1000, design.Source.Waveform.Frequency!.Value.Value, 9);
        var stage = Assert.IsType<BlockStage>(Assert.Single(design.Stages));
        Assert.Equal("inverting", stage.Block.Name);
        Assert.Equal("jfet-input-15v", stage.Amplifiers["u1"].Id.Value);
        var rf = stage.Values["rf"];
        Assert.Equal(new Quantity(20_000, Dimension.Resistance), rf.Value.Value);
        Assert.Equal((21, 11), (rf.Value.Span.Line, rf.Value.Span.Column));
        Assert.Equal("thin-film-1pct", rf.ResistorFamily!.Id.Value);
    }

    [Fact]
    public void Every_good_fixture_loads_without_diagnostics()
    {
        foreach (var path in FixtureFiles.Yaml("loader/good"))
        {
            var result = DesignLoader.LoadFiles([path]);
            Assert.True(result.Diagnostics.Count == 0, path + ": " + string.Join("; ", result.Diagnostics));
        }
    }
}
