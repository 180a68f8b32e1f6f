namespace DesignRules.Pages.Tests;

/// <summary>The output folder's discipline: only the tool's own stale files are ever removed.</summary>
public sealed class OutputFolderTests
{
    [Fact]
    public void Files_the_tool_did_not_write_survive_and_its_own_stale_files_are_removed()
    {
        var (folder, _) = ExamplePages.Render();
        var foreign = Path.Combine(folder, "notes-by-a-person.md");
        File.WriteAllText(foreign, "kept");
        var stale = Path.Combine(folder, "plots", "old-design", "old-transient.svg");
        Directory.CreateDirectory(Path.GetDirectoryName(stale)!);
        File.WriteAllText(stale, "<svg/>");
        File.AppendAllText(Path.Combine(folder, ".designrules-pages"), "plots/old-design/old-transient.svg\n");

        var result = DatasheetPages.Write(ExamplePages.Check(), new PageOptions(folder, null, ExamplePages.RepositoryRoot()));

        Assert.True(File.Exists(foreign));
        Assert.False(File.Exists(stale));
        Assert.Contains("plots/old-design/old-transient.svg", result.Removed);
        Assert.DoesNotContain(Directory.GetFiles(folder, "*.partial", SearchOption.AllDirectories), _ => true);
    }

    [Fact]
    public void A_manifest_entry_pointing_outside_the_folder_is_never_followed()
    {
        var (folder, _) = ExamplePages.Render();
        var outside = Path.Combine(Path.GetTempPath(), "designrules-outside-" + Guid.NewGuid().ToString("N") + ".md");
        File.WriteAllText(outside, "not ours");
        File.AppendAllText(Path.Combine(folder, ".designrules-pages"), "../" + Path.GetFileName(outside) + "\n");

        DatasheetPages.Write(ExamplePages.Check(), new PageOptions(folder, null, ExamplePages.RepositoryRoot()));

        Assert.True(File.Exists(outside));
        File.Delete(outside);
    }

    [Theory]
    [InlineData("vibration-envelope", "vibration-envelope")]
    [InlineData("Bad Name/../x", "bad-name----x")]
    [InlineData("..", "unnamed")]
    public void Ids_become_safe_file_names(string id, string expected) => Assert.Equal(expected, OutputFolder.SafeName(id));
}
