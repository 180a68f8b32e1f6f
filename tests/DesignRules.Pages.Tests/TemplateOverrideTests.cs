namespace DesignRules.Pages.Tests;

/// <summary>A repository's own templates replace the built-in ones by name; a broken one is a located diagnostic.</summary>
public sealed class TemplateOverrideTests
{
    [Fact]
    public void An_override_replaces_one_template_and_the_others_fall_back()
    {
        var templates = Directory.CreateTempSubdirectory("designrules-templates-").FullName;
        File.WriteAllText(Path.Combine(templates, "index.md.sbn"), "# Our boards\n{{ for d in index.designs }}- {{ d.id }}\n{{ end }}");

        var (folder, result) = ExamplePages.Render(templates);

        Assert.Empty(result.Diagnostics);
        Assert.StartsWith("# Our boards\n- compressor-vibration-envelope\n", File.ReadAllText(Path.Combine(folder, "index.md")), StringComparison.Ordinal);
        Assert.StartsWith("# Door impact peak hold", File.ReadAllText(Path.Combine(folder, "door-impact-peak-hold.md")), StringComparison.Ordinal);
    }

    [Fact]
    public void A_template_that_assigns_to_a_function_name_leaves_every_later_render_as_it_was()
    {
        // The template functions are imported once per process (a warm server renders run after run) and copied into each
        // render's globals: whatever one template does to them, the next render of the built-in templates is the same bytes.
        var (before, _) = ExamplePages.Render();
        var templates = Directory.CreateTempSubdirectory("designrules-templates-").FullName;
        File.WriteAllText(Path.Combine(templates, "index.md.sbn"), "{{ eng = \"replaced\"; percent = 1; cell = 2 }}# {{ eng }}\n");
        ExamplePages.Render(templates);

        var (after, _) = ExamplePages.Render();
        var files = Directory.GetFiles(before, "*", SearchOption.AllDirectories).Select(f => Path.GetRelativePath(before, f)).Order(StringComparer.Ordinal).ToList();
        Assert.Equal(files, Directory.GetFiles(after, "*", SearchOption.AllDirectories).Select(f => Path.GetRelativePath(after, f)).Order(StringComparer.Ordinal));
        Assert.NotEmpty(files);
        foreach (var file in files)
        {
            Assert.Equal(File.ReadAllBytes(Path.Combine(before, file)), File.ReadAllBytes(Path.Combine(after, file)));
        }
    }

    [Fact]
    public void A_template_with_a_syntax_error_is_reported_at_its_file_line_and_column_and_writes_nothing()
    {
        var templates = Directory.CreateTempSubdirectory("designrules-templates-").FullName;
        File.WriteAllText(Path.Combine(templates, "stage.md.sbn"), "## {{ stage.id }}\n\n{{ for f in stage.findings }}\n- {{ f.id\n");

        var (folder, result) = ExamplePages.Render(templates);

        var diagnostic = Assert.Single(result.Diagnostics.Where(d => d.Id == "DR930").Take(1));
        Assert.EndsWith("stage.md.sbn", diagnostic.Span.File, StringComparison.Ordinal);
        Assert.True(diagnostic.Span.Line >= 3, diagnostic.ToString());
        Assert.False(Directory.Exists(folder) && Directory.EnumerateFiles(folder).Any());
    }

    [Fact]
    public void A_template_that_uses_an_unknown_name_is_reported_where_it_uses_it()
    {
        var templates = Directory.CreateTempSubdirectory("designrules-templates-").FullName;
        File.WriteAllText(Path.Combine(templates, "index.md.sbn"), "# Boards\n\n{{ index.no_such_name }}\n");

        var (_, result) = ExamplePages.Render(templates);

        var diagnostic = Assert.Single(result.Diagnostics);
        Assert.Equal("DR930", diagnostic.Id);
        Assert.Equal((3, 10), (diagnostic.Span.Line, diagnostic.Span.Column)); // the unknown member itself
    }
}
