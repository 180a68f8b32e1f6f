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

    [Fact]
    public void A_kept_file_that_vanished_or_became_a_link_after_it_was_vouched_for_is_not_listed_again()
    {
        var folder = Directory.CreateTempSubdirectory("designrules-kept-").FullName;
        try
        {
            var first = new OutputFolder(folder);
            foreach (var name in new[] { "plots/d/same.svg", "plots/d/gone.svg", "plots/d/linked.svg", "plots/e/other.svg" })
            {
                first.Write(name, "<svg>" + name + "</svg>");
            }

            first.Commit([]);
            var second = new OutputFolder(folder);
            foreach (var name in new[] { "plots/d/same.svg", "plots/d/gone.svg", "plots/d/linked.svg", "plots/e/other.svg" })
            {
                Assert.NotNull(second.StampOfListedFile(name));
                second.Keep(name);
            }

            // Another process changes the folder after the files were vouched for and before this run takes the lock.
            File.Delete(Path.Combine(folder, "plots", "d", "gone.svg"));
            var target = Path.Combine(folder, "elsewhere.svg");
            File.WriteAllText(target, "<svg>plots/d/linked.svg</svg>");
            File.Delete(Path.Combine(folder, "plots", "d", "linked.svg"));
            File.CreateSymbolicLink(Path.Combine(folder, "plots", "d", "linked.svg"), target);

            second.Commit([]);

            Assert.Equal(["plots/d/same.svg", "plots/e/other.svg"], second.Kept.Order(StringComparer.Ordinal));
            var manifest = File.ReadAllLines(Path.Combine(folder, OutputFolder.ManifestName)).Where(l => !l.StartsWith('#')).ToList();
            Assert.Equal(["plots/d/same.svg", "plots/e/other.svg"], manifest);
            Assert.Equal("<svg>plots/d/linked.svg</svg>", File.ReadAllText(target));
        }
        finally
        {
            Directory.Delete(folder, recursive: true);
        }
    }

    [Theory]
    [InlineData("vibration-envelope", "vibration-envelope")]
    [InlineData("Bad Name/../x", "bad-name----x")]
    [InlineData("..", "unnamed")]
    public void Ids_become_safe_file_names(string id, string expected) => Assert.Equal(expected, OutputFolder.SafeName(id));
}
