using System.Text.RegularExpressions;

namespace DesignRules.Build.Tests;

/// <summary>
/// The package as a user meets it: packed into a local feed, consumed by a repository outside the source tree with an
/// isolated NuGet cache, built with `dotnet build -nodeReuse:false`.
/// </summary>
[Collection(PackedFeedGroup.Name)]
public sealed class EndToEndTests(PackedFeed feed)
{
    private const string Summary = "1 design(s) in 1 file(s) checked: 0 error(s), 0 warning(s)";
    private const string Checked = "DesignRules: " + Summary;
    private const string Skipped = "evaluation skipped";

    [Fact]
    public void Package_reference_gates_the_build_incrementally_and_honours_the_warning_switches()
    {
        Assert.True(feed.PackOutput.ExitCode == 0, feed.PackOutput.ToString());
        using var repo = new ConsumerRepository(feed, asProjectSdk: false);

        // A clean design passes.
        SampleRepository.Write(repo.Root, SampleRepository.Design());
        var first = repo.Build();
        AssertPassed(first);
        Assert.Contains(Checked, first.Output, StringComparison.Ordinal);

        // Nothing changed: the evaluation is skipped, and the build says so with the last result; no page is rendered again.
        var pages = PageTimes(repo.Root);
        Assert.NotEmpty(pages);
        var second = repo.Build();
        AssertPassed(second);
        Assert.Contains(Skipped, second.Output, StringComparison.Ordinal);
        Assert.Contains("Last check: " + Summary, second.Output, StringComparison.Ordinal);
        Assert.Equal(pages, PageTimes(repo.Root));

        // Switched off, the build says nothing of designs and keeps the last check's state: the next build still skips.
        var off = repo.Build("-p:DesignRulesEnabled=false");
        AssertPassed(off);
        Assert.DoesNotContain("DesignRules:", off.Output, StringComparison.Ordinal);
        Assert.Contains(Skipped, repo.Build().Output, StringComparison.Ordinal);

        // A changed value reruns it. Checked in the build's own process (the evaluation server's fallback, and
        // DesignRulesServer=false), so that the task's own dependencies load in MSBuild, as asserted below.
        SampleRepository.Write(repo.Root, SampleRepository.Design(feedback: "22k"));
        var changed = repo.Build("-v:d", "-p:DesignRulesServer=false");
        AssertPassed(changed);
        Assert.Contains(Checked, changed.Output, StringComparison.Ordinal);
        Assert.DoesNotContain(Skipped, changed.Output, StringComparison.Ordinal);
        // At normal verbosity and above, each design is logged as it finishes, in the same words as the command line's.
        Assert.Matches(@"DesignRules: checked [^\n]*line-driver\.yaml \(line-driver\): 0 error\(s\), 0 warning\(s\), \d+\.\d\d s", changed.Output);

        // The task's dependencies load from the package's task folder into the task's own load context.
        Assert.Matches(@"Assembly loaded during TaskRun[^\n]*: YamlDotNet,[^\n]*tasks[/\\]net10\.0[/\\]YamlDotNet\.dll[^\n]*AssemblyLoadContext: MSBuild plugin", changed.Output);

        // Deleting a design reruns it too (the file list is hashed into an input).
        var extra = Path.Combine(repo.Root, "designs", "second.yaml");
        File.WriteAllText(extra, SampleRepository.Design().Replace("id: line-driver", "id: second-driver", StringComparison.Ordinal));
        Assert.Contains("2 design(s) in 2 file(s) checked", repo.Build().Output, StringComparison.Ordinal);
        File.Delete(extra);
        var afterDelete = repo.Build();
        Assert.Contains(Checked, afterDelete.Output, StringComparison.Ordinal);

        // A violation fails the build at the line and column of the value to change, and the SARIF file says the same.
        var bad = SampleRepository.Design(SampleRepository.UnknownAmplifier);
        SampleRepository.Write(repo.Root, bad);
        var (line, column) = SampleRepository.AmplifierValuePosition(bad);
        var failed = repo.Build();
        Assert.True(failed.ExitCode != 0, failed.ToString());
        var match = Regex.Match(failed.Output, @"designs[/\\]line-driver\.yaml\((\d+),(\d+)(?:,\d+,\d+)?\): error DR906: ");
        Assert.True(match.Success, failed.ToString());
        Assert.Equal((line, column), (int.Parse(match.Groups[1].Value), int.Parse(match.Groups[2].Value)));
        var sarif = FindingKeys.FromSarif(repo.SarifFile);
        Assert.Contains($"DR906 {SampleRepository.DesignPath}({line},{column}) error", sarif);

        // The command line on the same repository finds the same (SARIF and JSON alike).
        var cliSarif = Path.Combine(repo.Root, "out", "cli.sarif");
        var cliJson = Path.Combine(repo.Root, "out", "cli.json");
        var cli = ProcessRun.Dotnet(repo.Root, new Dictionary<string, string?>(), TimeSpan.FromMinutes(2),
            TestPaths.CliAssembly, "check", ".", "--sarif", cliSarif, "--json", cliJson);
        Assert.True(cli.ExitCode == 1, cli.ToString());
        Assert.Equal(sarif, FindingKeys.FromSarif(cliSarif));
        Assert.Equal(sarif, FindingKeys.FromJson(cliJson));

        // A failed check is never skipped into a pass.
        var again = repo.Build();
        Assert.True(again.ExitCode != 0, again.ToString());
        Assert.Contains("error DR906", again.Output, StringComparison.Ordinal);

        // With DR906 lowered to a warning the build passes with the warning; the usual switches make it fail again.
        const string Lowered = "-p:DesignRulesLevels=DR906=warning";
        var warned = repo.Build(Lowered);
        AssertPassed(warned);
        Assert.Contains("warning DR906", warned.Output, StringComparison.Ordinal);
        AssertFailsWithErrorDr906(repo.Build(Lowered, "-warnaserror"));
        AssertFailsWithErrorDr906(repo.Build(Lowered, "-p:WarningsAsErrors=DR906"));
        AssertFailsWithErrorDr906(repo.Build(Lowered, "-p:TreatWarningsAsErrors=true"));
        var quiet = repo.Build(Lowered, "-p:NoWarn=DR906");
        AssertPassed(quiet);
        Assert.DoesNotContain("warning DR906", quiet.Output, StringComparison.Ordinal);

        // Fixed again: passes.
        SampleRepository.Write(repo.Root, SampleRepository.Design());
        AssertPassed(repo.Build());
    }

    [Fact]
    public void Project_sdk_form_checks_a_repository_with_no_csharp()
    {
        Assert.True(feed.PackOutput.ExitCode == 0, feed.PackOutput.ToString());
        using var repo = new ConsumerRepository(feed, asProjectSdk: true);
        SampleRepository.Write(repo.Root, SampleRepository.Design(SampleRepository.UnknownAmplifier));
        var failed = repo.Build();
        AssertFailsWithErrorDr906(failed);

        SampleRepository.Write(repo.Root, SampleRepository.Design());
        var passed = repo.Build();
        AssertPassed(passed);
        Assert.Contains(Checked, passed.Output, StringComparison.Ordinal);

        // Every build writes the datasheet pages into design-pages/; a repository template replaces the built-in one,
        // and a broken template fails the build at its file, line and column.
        Assert.True(File.Exists(Path.Combine(repo.Root, "design-pages", "index.md")), passed.ToString());
        Directory.CreateDirectory(Path.Combine(repo.Root, "design-templates"));
        File.WriteAllText(Path.Combine(repo.Root, "design-templates", "index.md.sbn"), "# Our boards\n\n{{ index.no_such_name }}\n");
        var broken = repo.Build();
        Assert.True(broken.ExitCode != 0, broken.ToString());
        Assert.Matches(@"index\.md\.sbn\(3,\d+(,\d+,\d+)?\): error DR930: ", broken.Output);
        File.WriteAllText(Path.Combine(repo.Root, "design-templates", "index.md.sbn"), "# Our boards\n");
        AssertPassed(repo.Build());
        Assert.Equal("# Our boards\n", File.ReadAllText(Path.Combine(repo.Root, "design-pages", "index.md")));
    }

    [Fact]
    public void A_parts_file_named_under_libraries_outside_the_parts_glob_is_an_input_of_the_next_build()
    {
        Assert.True(feed.PackOutput.ExitCode == 0, feed.PackOutput.ToString());
        using var repo = new ConsumerRepository(feed, asProjectSdk: true);

        // The design takes its amplifier from vendor/shared-parts.yaml, outside the default parts/**/*.yaml glob.
        var vendor = Path.Combine(repo.Root, "vendor", "shared-parts.yaml");
        Directory.CreateDirectory(Path.GetDirectoryName(vendor)!);
        File.WriteAllText(vendor, SharedParts("shared-amplifier"));
        SampleRepository.Write(repo.Root, SampleRepository.Design("shared-amplifier").Replace(
            "stages:", "libraries: [../vendor/shared-parts.yaml]\nstages:", StringComparison.Ordinal));
        AssertPassed(repo.Build());
        Assert.Contains(Skipped, repo.Build().Output, StringComparison.Ordinal);

        // The loaded-files list names the loaded files that are not design or parts items (the items are inputs of the
        // check anyway, and listing them again would make every build read and item the whole file list twice): the
        // library outside the glob is in it, the design is not.
        var loaded = File.ReadAllLines(Directory.GetFiles(Path.Combine(repo.Root, "obj"), "loaded.files", SearchOption.AllDirectories).Single());
        Assert.Contains(Path.GetFullPath(vendor), loaded);
        Assert.DoesNotContain(loaded, line => line.EndsWith("line-driver.yaml", StringComparison.Ordinal));

        // The library changes so that the part the design names is gone: the check must run again and fail, never
        // replay the last green.
        File.WriteAllText(vendor, SharedParts("renamed-amplifier"));
        var changed = repo.Build();
        Assert.DoesNotContain(Skipped, changed.Output, StringComparison.Ordinal);
        AssertFailsWithErrorDr906(changed);

        // Put back, it passes; and with nothing changed since, the replay is allowed again.
        File.WriteAllText(vendor, SharedParts("shared-amplifier"));
        AssertPassed(repo.Build());
        Assert.Contains(Skipped, repo.Build().Output, StringComparison.Ordinal);
    }

    [Fact]
    public void A_build_that_finds_no_design_fails_naming_the_patterns_and_yml_designs_are_checked()
    {
        Assert.True(feed.PackOutput.ExitCode == 0, feed.PackOutput.ToString());
        using var repo = new ConsumerRepository(feed, asProjectSdk: true);

        // Designs in a folder the default pattern does not search: a located error at the project, never a green build.
        var elsewhere = Path.Combine(repo.Root, "boards", "line-driver.yaml");
        Directory.CreateDirectory(Path.GetDirectoryName(elsewhere)!);
        File.WriteAllText(elsewhere, SampleRepository.Design());
        var empty = repo.Build();
        Assert.True(empty.ExitCode != 0, empty.ToString());
        Assert.True(Regex.IsMatch(empty.Output, @"hardware\.csproj(\(\d+,\d+(,\d+,\d+)?\))?: error DR940: No design was found to check: designs/\*\*/\*\.yaml and designs/\*\*/\*\.yml below "), empty.ToString());

        // The design spelt .yml under designs/ is found by the default items.
        Directory.CreateDirectory(Path.Combine(repo.Root, "designs"));
        File.Move(elsewhere, Path.Combine(repo.Root, "designs", "line-driver.yml"));
        var found = repo.Build();
        AssertPassed(found);
        Assert.Contains(Checked, found.Output, StringComparison.Ordinal);
    }

    /// <summary>A parts file with one amplifier of the JFET-input class (figures of our own, marked typical).</summary>
    private static string SharedParts(string amplifierId) => $$"""
        library:
          id: shared-parts
        amplifiers:
          - id: {{amplifierId}}
            description: General-purpose JFET-input amplifier class (typical values of our own)
            typical: true
            gbw: 3 MHz
            slew-rate: 13 V/us
            open-loop-gain: 106 dB
            output-headroom: { positive: 1.5 V, negative: 1.5 V, at-load: 2k }
            output-current: 20 mA
            input-range: { positive: 3 V, negative: 3 V }
            offset-voltage: { typical: 3 mV, maximum: 10 mV }
            bias-current: { typical: 30 pA, maximum: 200 pA }
            supply-span: { minimum: 7 V, maximum: 36 V }
        """.Replace("\r\n", "\n", StringComparison.Ordinal) + "\n";

    private static void AssertPassed(ProcessRun run) => Assert.True(run.ExitCode == 0, run.ToString());

    private static void AssertFailsWithErrorDr906(ProcessRun run)
    {
        Assert.True(run.ExitCode != 0, run.ToString());
        Assert.Contains("error DR906", run.Output, StringComparison.Ordinal);
    }

    /// <summary>Every file of the pages folder with the time it was last written.</summary>
    private static Dictionary<string, DateTime> PageTimes(string root) =>
        Directory.EnumerateFiles(Path.Combine(root, "design-pages"), "*", SearchOption.AllDirectories).ToDictionary(f => f, File.GetLastWriteTimeUtc);
}
