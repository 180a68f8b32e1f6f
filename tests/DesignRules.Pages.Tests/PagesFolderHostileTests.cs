using System.Globalization;
using DesignRules.Loading;
using DesignRules.Rules;

namespace DesignRules.Pages.Tests;

/// <summary>
/// The pages folder under hostile conditions: links of every kind below it, a person's files bearing the tool's names,
/// two checks writing at once, and a build machine with a comma-decimal locale.
/// </summary>
public sealed class PagesFolderHostileTests : IDisposable
{
    private readonly string sandbox = Path.Combine(Path.GetTempPath(), "designrules-pages-hostile-" + Guid.NewGuid().ToString("N"));

    public PagesFolderHostileTests()
    {
        Directory.CreateDirectory(Outside);
        File.WriteAllText(OutsideFile, "a person's file outside the pages folder\n");
    }

    private string Folder => Path.Combine(sandbox, "pages");

    private string Outside => Path.Combine(sandbox, "outside");

    private string OutsideFile => Path.Combine(Outside, "keep.md");

    public void Dispose() => Directory.Delete(sandbox, recursive: true);

    private PageResult Write(string? folder = null) =>
        DatasheetPages.Write(ExamplePages.Check(), new PageOptions(folder ?? Folder, null, ExamplePages.RepositoryRoot()));

    private void AssertOutsideUnchanged()
    {
        Assert.Equal([OutsideFile], Directory.GetFiles(Outside, "*", SearchOption.AllDirectories));
        Assert.Equal("a person's file outside the pages folder\n", File.ReadAllText(OutsideFile));
    }

    [Fact]
    public void A_plots_link_to_an_outside_folder_receives_nothing_and_is_named()
    {
        Directory.CreateDirectory(Folder);
        File.CreateSymbolicLink(Path.Combine(Folder, "plots"), Outside);
        var result = Write();
        var problem = Assert.Single(result.Diagnostics);
        Assert.Equal("DR931", problem.Id);
        Assert.Contains("plots' is a symbolic link inside the pages folder", problem.Message, StringComparison.Ordinal);
        Assert.Empty(result.Written);
        AssertOutsideUnchanged();
    }

    [Fact]
    public void A_link_bearing_a_page_name_is_refused_and_its_target_untouched()
    {
        Directory.CreateDirectory(Folder);
        File.CreateSymbolicLink(Path.Combine(Folder, "index.md"), OutsideFile);
        var problem = Assert.Single(Write().Diagnostics);
        Assert.Equal("DR931", problem.Id);
        AssertOutsideUnchanged();
    }

    [Fact]
    public void A_link_bearing_the_old_temporary_name_is_never_written_through()
    {
        // Temporary names are hidden and unique per run, so a planted "index.md.partial" is nobody's business.
        Directory.CreateDirectory(Folder);
        File.CreateSymbolicLink(Path.Combine(Folder, "index.md.partial"), OutsideFile);
        var result = Write();
        Assert.Empty(result.Diagnostics);
        Assert.True(File.Exists(Path.Combine(Folder, "index.md")));
        AssertOutsideUnchanged();
        Assert.Empty(Directory.GetFiles(Folder, ".*.partial", SearchOption.AllDirectories));
    }

    [Fact]
    public void A_manifest_entry_under_a_linked_folder_deletes_nothing_outside()
    {
        Write();
        Directory.CreateDirectory(Path.Combine(Folder, "old"));
        Directory.Delete(Path.Combine(Folder, "old"));
        File.CreateSymbolicLink(Path.Combine(Folder, "old"), Outside);
        File.AppendAllText(Path.Combine(Folder, OutputFolder.ManifestName), "old/keep.md\n");
        var result = Write();
        Assert.Empty(result.Diagnostics);
        Assert.DoesNotContain("old/keep.md", result.Removed);
        AssertOutsideUnchanged();
    }

    [Fact]
    public void The_folders_own_path_may_be_a_link()
    {
        var real = Path.Combine(sandbox, "real-pages");
        Directory.CreateDirectory(real);
        File.CreateSymbolicLink(Folder, real);
        var result = Write();
        Assert.Empty(result.Diagnostics);
        Assert.True(File.Exists(Path.Combine(real, "index.md")));
    }

    [Fact]
    public void A_persons_file_bearing_a_page_name_is_left_alone_and_named()
    {
        Directory.CreateDirectory(Folder);
        var mine = Path.Combine(Folder, "door-impact-peak-hold.md");
        File.WriteAllText(mine, "my notes\n");
        var problem = Assert.Single(Write().Diagnostics);
        Assert.Equal("DR931", problem.Id);
        Assert.Contains("door-impact-peak-hold.md' is in the way", problem.Message, StringComparison.Ordinal);
        Assert.Equal("my notes\n", File.ReadAllText(mine));
        Assert.False(File.Exists(Path.Combine(Folder, "index.md")), "nothing is written when something is in the way");
    }

    [Fact]
    public void Pages_the_manifest_lists_are_written_over_on_the_next_run()
    {
        Assert.Empty(Write().Diagnostics);
        var again = Write();
        Assert.Empty(again.Diagnostics);
        Assert.Contains("index.md", again.Written);
    }

    [Fact]
    public void A_file_where_the_folder_should_be_is_refused_by_name()
    {
        Directory.CreateDirectory(sandbox);
        File.WriteAllText(Folder, "a file");
        var problem = Assert.Single(Write().Diagnostics);
        Assert.Equal("DR931", problem.Id);
        Assert.Contains("is a file, not a folder", problem.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Two_checks_writing_into_one_folder_at_once_leave_a_manifest_of_existing_files()
    {
        for (var round = 0; round < 5; round++)
        {
            var results = new PageResult[2];
            Parallel.For(0, 2, i => results[i] = Write());
            Assert.All(results, r => Assert.Empty(r.Diagnostics));
            var listed = File.ReadAllLines(Path.Combine(Folder, OutputFolder.ManifestName)).Where(l => l.Length > 0 && !l.StartsWith('#')).ToList();
            Assert.NotEmpty(listed);
            Assert.All(listed, l => Assert.True(File.Exists(Path.Combine(Folder, l)), l));
            Assert.Empty(Directory.GetFiles(Folder, "*.partial", SearchOption.AllDirectories));
        }
    }

    [Fact]
    public void Pages_are_the_same_bytes_under_a_comma_decimal_culture()
    {
        // A culture like de-DE (comma decimals, dot grouping), made from the invariant one because the tests run with
        // invariant globalization; the check and the pages run under it, as the MSBuild task does in a German build.
        var comma = (CultureInfo)CultureInfo.InvariantCulture.Clone();
        comma.NumberFormat.NumberDecimalSeparator = ",";
        comma.NumberFormat.NumberGroupSeparator = ".";
        comma.NumberFormat.PercentDecimalSeparator = ",";

        var invariant = Path.Combine(sandbox, "invariant");
        Assert.Empty(Write(invariant).Diagnostics);

        var localised = Path.Combine(sandbox, "comma");
        var saved = CultureInfo.CurrentCulture;
        try
        {
            CultureInfo.CurrentCulture = comma;
            var root = Path.Combine(ExamplePages.RepositoryRoot(), "example-design");
            var report = DesignCheck.Run(RepositoryFiles.Find([root], out _),
                new CheckOptions(Path.Combine(root, RuleSetLoader.DefaultFileName), new DateOnly(2026, 12, 1)));
            Assert.Empty(DatasheetPages.Write(report, new PageOptions(localised, null, ExamplePages.RepositoryRoot())).Diagnostics);
        }
        finally
        {
            CultureInfo.CurrentCulture = saved;
        }

        var files = Directory.GetFiles(invariant, "*", SearchOption.AllDirectories).Select(f => Path.GetRelativePath(invariant, f)).Order(StringComparer.Ordinal).ToList();
        Assert.Equal(files, Directory.GetFiles(localised, "*", SearchOption.AllDirectories).Select(f => Path.GetRelativePath(localised, f)).Order(StringComparer.Ordinal));
        foreach (var file in files)
        {
            Assert.True(File.ReadAllBytes(Path.Combine(invariant, file)).AsSpan().SequenceEqual(File.ReadAllBytes(Path.Combine(localised, file))), file);
        }
    }
}
