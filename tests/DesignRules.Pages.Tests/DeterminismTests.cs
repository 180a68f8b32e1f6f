namespace DesignRules.Pages.Tests;

/// <summary>Same report, same bytes: pages and plots can be committed and diffed.</summary>
public sealed class DeterminismTests
{
    [Fact]
    public void Two_runs_in_a_row_write_identical_bytes()
    {
        var (first, _) = ExamplePages.Render();
        var (second, _) = ExamplePages.Render();
        var a = Directory.GetFiles(first, "*", SearchOption.AllDirectories).Select(f => Path.GetRelativePath(first, f)).Order(StringComparer.Ordinal).ToList();
        var b = Directory.GetFiles(second, "*", SearchOption.AllDirectories).Select(f => Path.GetRelativePath(second, f)).Order(StringComparer.Ordinal).ToList();
        Assert.Equal(a, b);
        foreach (var file in a)
        {
            Assert.True(File.ReadAllBytes(Path.Combine(first, file)).AsSpan().SequenceEqual(File.ReadAllBytes(Path.Combine(second, file))), file);
        }
    }

    [Fact]
    public void Pages_rendered_one_design_at_a_time_and_side_by_side_are_the_same_bytes()
    {
        var one = Path.Combine(Path.GetTempPath(), "designrules-pages-" + Guid.NewGuid().ToString("N"));
        var many = Path.Combine(Path.GetTempPath(), "designrules-pages-" + Guid.NewGuid().ToString("N"));
        var report = ExamplePages.Check();
        Assert.True(report.Designs.Count > 1);
        DatasheetPages.Write(report, new PageOptions(one, null, ExamplePages.RepositoryRoot()) { MaxParallelDesigns = 1 });
        DatasheetPages.Write(report, new PageOptions(many, null, ExamplePages.RepositoryRoot()) { MaxParallelDesigns = report.Designs.Count });

        var a = Directory.GetFiles(one, "*", SearchOption.AllDirectories).Select(f => Path.GetRelativePath(one, f)).Order(StringComparer.Ordinal).ToList();
        var b = Directory.GetFiles(many, "*", SearchOption.AllDirectories).Select(f => Path.GetRelativePath(many, f)).Order(StringComparer.Ordinal).ToList();
        Assert.Equal(a, b);
        foreach (var file in a)
        {
            Assert.True(File.ReadAllBytes(Path.Combine(one, file)).AsSpan().SequenceEqual(File.ReadAllBytes(Path.Combine(many, file))), file);
        }
    }

    [Fact]
    public void A_design_page_matches_its_golden_file()
    {
        // The golden file is the reviewed page of the example's peak-hold design. After an intended change to the
        // templates or figures, review the new page and copy it over Golden/door-impact-peak-hold.md.
        var (folder, _) = ExamplePages.Render();
        var actual = File.ReadAllText(Path.Combine(folder, "door-impact-peak-hold.md"));
        var golden = File.ReadAllText(Path.Combine(AppContext.BaseDirectory, "Golden", "door-impact-peak-hold.md"));
        Assert.Equal(golden, actual);
    }
}
