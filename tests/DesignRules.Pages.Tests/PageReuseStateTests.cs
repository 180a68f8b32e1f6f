namespace DesignRules.Pages.Tests;

/// <summary>
/// A warm process keeps the page state it last wrote or read with its exact bytes, and the templates it parsed with their
/// exact text: a state file changed, replaced or deleted between runs is read as it is, never answered from memory.
/// </summary>
public sealed class PageReuseStateTests : IDisposable
{
    private readonly string folder = Path.Combine(Path.GetTempPath(), "designrules-reuse-" + Guid.NewGuid().ToString("N"));

    public void Dispose()
    {
        if (Directory.Exists(folder))
        {
            Directory.Delete(folder, recursive: true);
        }
    }

    private string Pages => Path.Combine(folder, "pages");

    private string State => Path.Combine(folder, "obj", "pages.state");

    /// <summary>One key per design of the example, the same for every run unless <paramref name="changed"/> names a design.</summary>
    private static Dictionary<string, string> Keys(string? changed = null) =>
        ExamplePages.Check().Designs.ToDictionary(d => d.Design.Id.Value, d => d.Design.Id.Value == changed ? "key-2" : "key-1", StringComparer.Ordinal);

    private PageResult Write(Dictionary<string, string> keys) =>
        DatasheetPages.Write(ExamplePages.Check(), new PageOptions(Pages, null, ExamplePages.RepositoryRoot()) { Reuse = new PageReuse(State, keys) });

    [Fact]
    public void An_unchanged_state_file_keeps_every_page_and_its_bytes_are_the_ones_written()
    {
        Write(Keys());
        var bytes = File.ReadAllBytes(State);
        var second = Write(Keys());
        Assert.Equal(ExamplePages.Check().Designs.Count, second.Kept.Count(k => k.EndsWith(".md", StringComparison.Ordinal)));
        Assert.True(PageReuse.RecentCount > 0);
        Assert.Equal(bytes, File.ReadAllBytes(State));
    }

    [Fact]
    public void A_state_file_changed_between_runs_is_read_as_it_is_now()
    {
        var design = ExamplePages.Check().Designs.Select(d => d.Design.Id.Value).Order(StringComparer.Ordinal).First();
        Write(Keys());
        // Another process (or a hand) records another key for one design: the memory of what this process wrote must not
        // stand for the file, so that design's page is not kept, though the keys this run gives are the ones it wrote.
        var text = File.ReadAllText(State);
        var at = text.IndexOf("\"Key\":\"key-1\"", text.IndexOf("\"" + design + "\"", StringComparison.Ordinal), StringComparison.Ordinal);
        Assert.True(at > 0);
        File.WriteAllText(State, text[..at] + "\"Key\":\"key-9\"" + text[(at + "\"Key\":\"key-1\"".Length)..]);

        var second = Write(Keys());
        Assert.DoesNotContain(design + ".md", second.Kept);
        Assert.Equal(ExamplePages.Check().Designs.Count - 1, second.Kept.Count(k => k.EndsWith(".md", StringComparison.Ordinal)));
    }

    [Fact]
    public void A_deleted_state_file_keeps_no_page()
    {
        Write(Keys());
        File.Delete(State);
        var second = Write(Keys());
        Assert.Empty(second.Kept);
        Assert.True(File.Exists(State));
    }

    [Fact]
    public void A_design_whose_key_changed_is_rendered_again_while_the_others_are_kept()
    {
        var design = ExamplePages.Check().Designs.Select(d => d.Design.Id.Value).Order(StringComparer.Ordinal).Last();
        Write(Keys());
        var second = Write(Keys(changed: design));
        Assert.DoesNotContain(design + ".md", second.Kept);
        Assert.Equal(ExamplePages.Check().Designs.Count - 1, second.Kept.Count(k => k.EndsWith(".md", StringComparison.Ordinal)));
        // The state now records the new key: the next run with it keeps every page again.
        var third = Write(Keys(changed: design));
        Assert.Equal(ExamplePages.Check().Designs.Count, third.Kept.Count(k => k.EndsWith(".md", StringComparison.Ordinal)));
    }

    [Fact]
    public void A_template_override_changed_between_runs_is_parsed_again()
    {
        var templates = Path.Combine(folder, "templates");
        Directory.CreateDirectory(templates);
        var index = Path.Combine(templates, "index.md.sbn");
        File.WriteAllText(index, "first {{ index.designs | array.size }}\n");
        var first = DatasheetPages.Write(ExamplePages.Check(), new PageOptions(Pages, templates, ExamplePages.RepositoryRoot()));
        Assert.Empty(first.Diagnostics);
        Assert.StartsWith("first ", File.ReadAllText(Path.Combine(Pages, "index.md")), StringComparison.Ordinal);

        File.WriteAllText(index, "second {{ index.designs | array.size }}\n");
        var second = DatasheetPages.Write(ExamplePages.Check(), new PageOptions(Pages, templates, ExamplePages.RepositoryRoot()));
        Assert.Empty(second.Diagnostics);
        Assert.StartsWith("second ", File.ReadAllText(Path.Combine(Pages, "index.md")), StringComparison.Ordinal);
    }
}
