using DesignRules.Diagnostics;
using DesignRules.Loading;
using DesignRules.Quantities;
using DesignRules.Yaml;

namespace DesignRules.Tests.Loading;

/// <summary>
/// The warm evaluation server keeps the YAML tree of each file it read (<see cref="ParsedTrees"/>): an unchanged file is
/// not parsed again, an edited one always is, and a file whose reading raised a diagnostic is never kept, so the loader
/// reports the same with the memo as without it. (The switch is process-wide; the memo is meant to be invisible, so
/// turning it on here changes no other test's outcome.)
/// </summary>
public sealed class ParsedTreeTests : IDisposable
{
    private readonly string folder = Path.Combine(Path.GetTempPath(), "designrules-trees-" + Guid.NewGuid().ToString("N"));

    public ParsedTreeTests()
    {
        AppContext.SetSwitch(ParsedTrees.SwitchName, true);
        Directory.CreateDirectory(folder);
    }

    public void Dispose() => Directory.Delete(folder, recursive: true);

    [Fact]
    public void An_unchanged_file_reuses_its_tree_and_an_edited_one_is_read_afresh()
    {
        var path = Path.Combine(folder, "inverting.yaml");
        var original = File.ReadAllText(Path.Combine(FixtureFiles.Directory("loader/good"), "inverting.yaml"));
        File.WriteAllText(path, original);

        var first = DesignLoader.LoadFiles([path]);
        var kept = ParsedTrees.Find(path, original, LoaderLimits.Default);
        var second = DesignLoader.LoadFiles([path]);

        Assert.NotNull(kept);
        Assert.Same(kept, ParsedTrees.Find(path, original, LoaderLimits.Default));
        Assert.Empty(first.Diagnostics);
        Assert.Empty(second.Diagnostics);
        Assert.Equal(new Quantity(20_000, Dimension.Resistance), Assert.Single(second.Designs).Stages.OfType<Model.BlockStage>().Single().Values["rf"].Value.Value);

        // One character changed (20k -> 30k): the text is not the kept text, so the file is parsed again and the new value loads.
        var edited = original.Replace("rf: 20k", "rf: 30k", StringComparison.Ordinal);
        Assert.NotEqual(original, edited);
        File.WriteAllText(path, edited);
        Assert.Null(ParsedTrees.Find(path, edited, LoaderLimits.Default));

        var third = DesignLoader.LoadFiles([path]);

        Assert.Empty(third.Diagnostics);
        Assert.Equal(new Quantity(30_000, Dimension.Resistance), Assert.Single(third.Designs).Stages.OfType<Model.BlockStage>().Single().Values["rf"].Value.Value);
        Assert.NotSame(kept, ParsedTrees.Find(path, edited, LoaderLimits.Default));
    }

    [Fact]
    public void A_file_whose_reading_raised_a_diagnostic_is_never_kept_and_reports_it_on_every_read()
    {
        var path = Path.Combine(folder, "broken.yaml");
        var text = "design:\n  id: broken\n  stages: [unclosed\n";
        File.WriteAllText(path, text);

        var first = DesignLoader.LoadFiles([path]);
        var second = DesignLoader.LoadFiles([path]);

        Assert.Null(ParsedTrees.Find(path, text, LoaderLimits.Default));
        Assert.Contains(first.Diagnostics, d => d.Severity == Severity.Error);
        Assert.Equal(first.Diagnostics.Select(d => d.ToString()), second.Diagnostics.Select(d => d.ToString()));
    }
}
