namespace DesignRules.Run.Tests;

/// <summary>
/// The per-design results cache re-evaluates exactly the designs whose inputs changed, and never trusts an entry it
/// cannot vouch for. (Which example design uses which file: only door-impact-peak-hold names the parts file.)
/// </summary>
public sealed class ResultCacheTests : IDisposable
{
    private static readonly string[] All =
        ["compressor-vibration-envelope", "door-impact-peak-hold", "motor-current-monitor", "suction-pressure-bridge"];

    private readonly ExampleCopy repo = new();

    public void Dispose() => repo.Dispose();

    [Fact]
    public void A_second_run_with_nothing_changed_evaluates_nothing_and_writes_the_same_report_and_pages()
    {
        var (first, evaluated) = repo.Run();
        Assert.Equal(All, evaluated);
        Assert.Equal(0, first.FromCache);
        var json = File.ReadAllBytes(repo.Json);
        var pages = Snapshot(repo.Pages);

        var (second, again) = repo.Run();
        Assert.Empty(again);
        Assert.Equal(4, second.FromCache);
        Assert.Equal(json, File.ReadAllBytes(repo.Json));
        Assert.Equal(pages, Snapshot(repo.Pages));
        Assert.Equal(first.Summary, second.Summary);
        Assert.NotEmpty(second.Pages!.Kept);
    }

    [Fact]
    public void A_run_that_meets_a_design_another_run_is_evaluating_waits_for_its_result_instead_of_evaluating_it_again()
    {
        repo.Run();
        var edited = repo.Design("compressor-vibration-envelope");
        File.AppendAllText(edited, "\n# edited\n");

        // A run that writes only the cache (as a build's head start does) claims the edited design and evaluates it; a
        // full run started meanwhile waits for that result and reads it from the cache: the design is evaluated once.
        IReadOnlyList<string> headStartEvaluated = [];
        var headStart = new Thread(() => headStartEvaluated = repo.Run(null, cacheOnly: true, out _).Evaluated);
        headStart.Start();
        var clock = System.Diagnostics.Stopwatch.StartNew();
        while (!EvaluationClaims.Holds(edited) && headStart.IsAlive && clock.Elapsed < TimeSpan.FromSeconds(60))
        {
            Thread.Sleep(1);
        }

        var (outcome, evaluated) = repo.Run(null, cacheOnly: false, out var justEvaluated);
        headStart.Join();
        // It came while the head start held the one design it had to evaluate: it waited for the head start to finish and
        // took its check of the same files rather than load and look up every design again.
        Assert.True(outcome.TookHeadStartCheck);
        Assert.Equal(["compressor-vibration-envelope"], headStartEvaluated);
        Assert.Empty(evaluated);
        Assert.Equal(["compressor-vibration-envelope"], justEvaluated);
        Assert.Equal(4, outcome.FromCache);
        Assert.False(EvaluationClaims.Holds(edited));

        // Another run later reads the same entry as unchanged (the head start's evaluation is announced once).
        File.AppendAllText(repo.Design("motor-current-monitor"), "\n# edited\n");
        repo.Run(null, cacheOnly: false, out var later);
        Assert.Empty(later);

        // The same bytes as a run that evaluated the edited design itself.
        var json = File.ReadAllBytes(repo.Json);
        var pages = Snapshot(repo.Pages);
        Directory.Delete(repo.Cache, recursive: true);
        Directory.Delete(repo.Pages, recursive: true);
        Assert.Equal(All, repo.Run().Evaluated);
        Assert.Equal(json, File.ReadAllBytes(repo.Json));
        Assert.Equal(pages, Snapshot(repo.Pages));
    }

    [Fact]
    public void A_check_after_its_head_start_takes_the_head_starts_check_and_writes_what_a_full_run_writes()
    {
        repo.Run();
        var before = Snapshot(repo.Pages);
        File.AppendAllText(repo.Design("door-impact-peak-hold"), "\n# edited\n");

        // The head start evaluates the edited design and writes only its cache entry.
        Assert.Equal(["door-impact-peak-hold"], repo.Run(null, cacheOnly: true, out _).Evaluated);
        Assert.Equal(before, Snapshot(repo.Pages));

        // The check of the same files then takes the head start's check: nothing evaluated, loaded or looked up again, and
        // each design told as a run that looked it up would tell it.
        var (outcome, evaluated) = repo.Run(null, cacheOnly: false, out var justEvaluated);
        Assert.Empty(evaluated);
        Assert.True(outcome.TookHeadStartCheck);
        Assert.Equal(["door-impact-peak-hold"], justEvaluated);
        Assert.Equal(4, outcome.FromCache);

        // The same bytes as a run that evaluated everything itself.
        var json = File.ReadAllBytes(repo.Json);
        var pages = Snapshot(repo.Pages);
        Directory.Delete(repo.Cache, recursive: true);
        Directory.Delete(repo.Pages, recursive: true);
        var (full, _) = repo.Run();
        Assert.False(full.TookHeadStartCheck);
        Assert.Equal(json, File.ReadAllBytes(repo.Json));
        Assert.Equal(pages, Snapshot(repo.Pages));
    }

    [Fact]
    public void A_design_saved_after_the_head_start_checked_it_is_checked_again_by_the_build_not_taken_from_the_head_start()
    {
        repo.Run();
        var edited = repo.Design("motor-current-monitor");
        File.AppendAllText(edited, "\n# edited\n");
        repo.Run(null, cacheOnly: true, out _);

        // Saved again between the head start and the build's check: the head start's check is of the other content.
        File.WriteAllText(edited, File.ReadAllText(edited).Replace("\n# edited\n", "\n# edited twice\n", StringComparison.Ordinal));
        var (outcome, evaluated) = repo.Run();
        Assert.False(outcome.TookHeadStartCheck);
        Assert.Equal(["motor-current-monitor"], evaluated);
    }

    [Fact]
    public void A_rule_set_changed_after_the_head_start_checked_is_read_again_by_the_build()
    {
        repo.Run();
        File.AppendAllText(repo.Design("motor-current-monitor"), "\n# edited\n");
        repo.Run(null, cacheOnly: true, out _);

        // The motor monitor's DR303 level is the rule set's own section: changed after the head start, it is judged afresh.
        File.WriteAllText(repo.RuleSet, ExampleCopy.RuleSetText("warning"));
        var (outcome, evaluated) = repo.Run();
        Assert.False(outcome.TookHeadStartCheck);
        Assert.Equal(["motor-current-monitor"], evaluated);
    }

    [Fact]
    public void A_head_start_check_with_an_error_is_not_kept_for_the_build()
    {
        repo.Run();
        // A parts library the design names that is not there: an error the head start finds, and no hash stands for.
        var edited = repo.Design("motor-current-monitor");
        File.WriteAllText(edited, "libraries: [../parts/not-there-yet.yaml]\n" + File.ReadAllText(edited));
        repo.Run(null, cacheOnly: true, out _);
        var (outcome, _) = repo.Run();
        Assert.False(outcome.TookHeadStartCheck);
        Assert.True(outcome.Report!.ErrorCount > 0);
    }

    [Fact]
    public void A_changed_parts_file_re_evaluates_exactly_the_design_that_uses_it()
    {
        repo.Run();
        var parts = Directory.GetFiles(Path.Combine(repo.Root, "parts"), "*.yaml").Single();
        File.AppendAllText(parts, "# a comment is a change of content too\n");
        var (_, evaluated) = repo.Run();
        // Exactly the designs whose libraries name this parts file (the peak hold's amplifier, the bridge's film capacitors).
        var users = Directory.GetFiles(Path.Combine(repo.Root, "designs"), "*.yaml")
            .Where(d => File.ReadLines(d).Any(l => l.StartsWith("libraries:", StringComparison.Ordinal) && l.Contains(Path.GetFileName(parts), StringComparison.Ordinal)))
            .Select(d => Path.GetFileNameWithoutExtension(d))
            .Order(StringComparer.Ordinal)
            .ToArray();
        Assert.Equal(["door-impact-peak-hold", "suction-pressure-bridge"], users);
        Assert.Equal(users, evaluated.Order(StringComparer.Ordinal));
    }

    [Fact]
    public void A_parts_file_saved_after_the_run_hashed_its_inputs_gives_no_result_to_any_design_that_uses_it()
    {
        repo.Run();
        var files = DesignRules.Loading.RepositoryFiles.Find([repo.Root], out _);
        var today = new DateOnly(2026, 12, 1);
        // The cache hashes the given files first; the parts file is then saved before the loader reads it, so every design
        // loaded with it is of a version the key does not name. A design that does not use it is still found.
        var cache = new ResultCache(repo.Cache, files);
        var parts = Directory.GetFiles(Path.Combine(repo.Root, "parts"), "*.yaml").Single();
        File.AppendAllText(parts, "# saved while the build ran\n");
        var ruleSet = DesignRules.Loading.RuleSetLoader.Load(repo.RuleSet).RuleSet;
        var found = DesignRules.Loading.DesignLoader.LoadFiles(files).Designs
            .Where(d => cache.Find(d, ruleSet, today) is not null).Select(d => d.Id.Value).Order(StringComparer.Ordinal);
        Assert.Equal(["compressor-vibration-envelope", "motor-current-monitor"], found);
    }

    [Fact]
    public void A_changed_rule_set_section_re_evaluates_exactly_the_design_it_names_and_a_global_change_every_design()
    {
        repo.Run();
        File.WriteAllText(repo.RuleSet, ExampleCopy.RuleSetText("warning"));
        Assert.Equal(["motor-current-monitor"], repo.Run().Evaluated);

        File.WriteAllText(repo.RuleSet, ExampleCopy.RuleSetText("warning").Replace("derating: 70%", "derating: 60%", StringComparison.Ordinal));
        Assert.Equal(All, repo.Run().Evaluated);
    }

    [Fact]
    public void Another_tool_re_evaluates_every_design()
    {
        repo.Run();
        Assert.Equal(All, repo.Run(toolIdentity: "a later build of the tool").Evaluated);
        Assert.Empty(repo.Run(toolIdentity: "a later build of the tool").Evaluated);
    }

    [Fact]
    public void A_changed_design_file_re_evaluates_that_design_only_and_its_page_only_is_rendered_again()
    {
        repo.Run();
        var motor = repo.Design("motor-current-monitor");
        File.AppendAllText(motor, "\n# reviewed\n");
        var (outcome, evaluated) = repo.Run();
        Assert.Equal(["motor-current-monitor"], evaluated);
        var written = outcome.Pages!.Written.Except(outcome.Pages.Kept).ToList();
        Assert.Contains("motor-current-monitor.md", written);
        Assert.Contains("index.md", written);
        Assert.DoesNotContain(written, w => w.Contains("door-impact", StringComparison.Ordinal) || w.Contains("suction", StringComparison.Ordinal));
    }

    [Fact]
    public void A_deleted_design_disappears_from_the_report_the_pages_and_the_cache()
    {
        repo.Run();
        var entries = Directory.GetFiles(repo.Cache, "*.result").Length;
        File.Delete(repo.Design("suction-pressure-bridge"));
        var (outcome, evaluated) = repo.Run();
        Assert.Empty(evaluated);
        Assert.DoesNotContain("suction-pressure-bridge", File.ReadAllText(repo.Json), StringComparison.Ordinal);
        Assert.False(File.Exists(Path.Combine(repo.Pages, "suction-pressure-bridge.md")));
        Assert.Empty(Directory.GetFiles(repo.Pages, "*suction*", SearchOption.AllDirectories));
        Assert.DoesNotContain("suction-pressure-bridge", File.ReadAllText(Path.Combine(repo.Pages, "index.md")), StringComparison.Ordinal);
        Assert.Equal(entries - 1, Directory.GetFiles(repo.Cache, "*.result").Length);
        Assert.Equal(3, outcome.Report.DesignCount);
    }

    [Theory]
    [InlineData("flip a byte of the payload")]
    [InlineData("cut the entry short")]
    [InlineData("another format version")]
    [InlineData("not an entry at all")]
    public void A_damaged_or_foreign_entry_is_re_evaluated_and_written_again(string damage)
    {
        var (first, _) = repo.Run();
        var json = File.ReadAllBytes(repo.Json);
        foreach (var entry in Directory.GetFiles(repo.Cache, "*.result"))
        {
            var bytes = File.ReadAllBytes(entry);
            File.WriteAllBytes(entry, damage switch
            {
                "flip a byte of the payload" => Flip(bytes, bytes.Length - 10),
                "cut the entry short" => bytes[..(bytes.Length / 2)],
                "another format version" => System.Text.Encoding.UTF8.GetBytes(System.Text.Encoding.UTF8.GetString(bytes).Replace($"designrules-results {ResultCodec.FormatVersion}\n", "designrules-results 0\n", StringComparison.Ordinal)),
                _ => "{}"u8.ToArray(),
            });
        }

        var (second, evaluated) = repo.Run();
        Assert.Equal(All, evaluated);
        Assert.Equal(first.Summary, second.Summary);
        Assert.Equal(json, File.ReadAllBytes(repo.Json));
        Assert.Empty(repo.Run().Evaluated);
    }

    [Fact]
    public void A_damaged_page_is_rendered_again_although_its_design_did_not_change()
    {
        repo.Run();
        var page = Path.Combine(repo.Pages, "door-impact-peak-hold.md");
        var text = File.ReadAllText(page);
        File.WriteAllText(page, text + "an edit by hand\n");
        var (outcome, _) = repo.Run();
        Assert.DoesNotContain("door-impact-peak-hold.md", outcome.Pages!.Kept);
        Assert.Equal(text, File.ReadAllText(page));
    }

    [Fact]
    public void A_kept_plot_rewritten_with_other_bytes_of_the_same_size_is_rendered_again()
    {
        repo.Run();
        // Its size is the one recorded, so only the time in its folder listing's stamp tells it apart, and then its content.
        var plot = Directory.GetFiles(Path.Combine(repo.Pages, "plots", "door-impact-peak-hold"), "*.svg").Order(StringComparer.Ordinal).First();
        var bytes = File.ReadAllBytes(plot);
        var written = File.GetLastWriteTimeUtc(plot);
        File.WriteAllBytes(plot, Flip(File.ReadAllBytes(plot), bytes.Length / 2));
        File.SetLastWriteTimeUtc(plot, written.AddSeconds(5));

        var (outcome, evaluated) = repo.Run();
        Assert.Empty(evaluated);
        var relative = Path.GetRelativePath(repo.Pages, plot).Replace('\\', '/');
        Assert.DoesNotContain(relative, outcome.Pages!.Kept);
        Assert.DoesNotContain("door-impact-peak-hold.md", outcome.Pages.Kept);
        Assert.Equal(bytes, File.ReadAllBytes(plot));
    }

    [Fact]
    public void A_kept_plot_replaced_by_a_link_to_the_same_bytes_is_not_kept_and_never_written_through()
    {
        repo.Run();
        // The same bytes behind a symbolic link: its size matches the stamp, but a kept file must be a plain file of the folder.
        var plot = Directory.GetFiles(Path.Combine(repo.Pages, "plots", "door-impact-peak-hold"), "*.svg").Order(StringComparer.Ordinal).First();
        var outside = Path.Combine(repo.Root, "outside.svg");
        File.Copy(plot, outside);
        File.Delete(plot);
        File.CreateSymbolicLink(plot, outside);
        var before = File.ReadAllBytes(outside);

        var (outcome, evaluated) = repo.Run();
        Assert.Empty(evaluated);
        Assert.DoesNotContain(outcome.Pages!.Kept, k => k.StartsWith("plots/door-impact-peak-hold/", StringComparison.Ordinal));
        Assert.Contains(outcome.Pages.Diagnostics, d => d.Id == Pages.DatasheetPages.FolderProblemId);
        Assert.Equal(before, File.ReadAllBytes(outside));
    }

    [Fact]
    public void A_kept_page_that_vanished_is_rendered_again()
    {
        repo.Run();
        var page = Path.Combine(repo.Pages, "door-impact-peak-hold.md");
        var text = File.ReadAllText(page);
        File.Delete(page);
        var (outcome, evaluated) = repo.Run();
        Assert.Empty(evaluated);
        Assert.DoesNotContain("door-impact-peak-hold.md", outcome.Pages!.Kept);
        Assert.Equal(text, File.ReadAllText(page));
    }

    private static byte[] Flip(byte[] bytes, int at)
    {
        bytes[at] ^= 0x20;
        return bytes;
    }

    private static SortedDictionary<string, string> Snapshot(string folder) =>
        new(Directory.GetFiles(folder, "*", SearchOption.AllDirectories)
            .Where(f => !Path.GetFileName(f).StartsWith(".designrules-pages.lock", StringComparison.Ordinal))
            .ToDictionary(f => Path.GetRelativePath(folder, f), File.ReadAllText), StringComparer.Ordinal);
}

/// <summary>
/// A warm process (the evaluation server) keeps cache entries it parsed, by the hash of their bytes: an unchanged entry is
/// not parsed again, and an entry whose bytes changed is never answered from the memo, whatever its key and path.
/// </summary>
public sealed class DecodedEntriesTests : IDisposable
{
    private readonly ExampleCopy repo = new();

    public void Dispose() => repo.Dispose();

    [Fact]
    public void A_warm_process_gives_the_same_report_from_parsed_entries_and_parses_an_entry_again_when_its_bytes_change()
    {
        repo.Run();
        repo.Run();
        var json = File.ReadAllBytes(repo.Json);
        Assert.True(DecodedEntries.Count > 0, "the second run parsed its entries into the memo");

        var (third, evaluated) = repo.Run();
        Assert.Empty(evaluated);
        Assert.Equal(4, third.FromCache);
        Assert.Equal(json, File.ReadAllBytes(repo.Json));

        // The same key and path, other (valid) bytes: the run must show what the entry now says, not what the memo holds.
        var edited = 0;
        foreach (var entry in Directory.GetFiles(repo.Cache, "*.result"))
        {
            var text = System.Text.Encoding.UTF8.GetString(File.ReadAllBytes(entry));
            var lines = text.Split('\n', 5);
            var payload = lines[4];
            var changed = payload.Replace("\"Message\":\"", "\"Message\":\"EDITED ", StringComparison.Ordinal);
            if (changed == payload)
            {
                continue;
            }

            edited++;
            var checksum = Convert.ToHexString(System.Security.Cryptography.SHA256.HashData(System.Text.Encoding.UTF8.GetBytes(changed)));
            File.WriteAllText(entry, $"{lines[0]}\n{lines[1]}\n{checksum}\n{lines[3]}\n{changed}");
        }

        Assert.True(edited > 0, "no entry holds a finding to edit");
        var (fourth, again) = repo.Run();
        Assert.Empty(again);
        Assert.Equal(4, fourth.FromCache);
        Assert.Contains("EDITED ", File.ReadAllText(repo.Json), StringComparison.Ordinal);
    }
}
