using System.Diagnostics;
using System.Security.Cryptography;
using System.Text;

namespace DesignRules.Build.Tests;

/// <summary>
/// Hostile input, each case run through the command line as a process with a time cap and a managed-heap cap: the run
/// ends with the expected diagnostic id (never DR990), within its time, within its memory, and no file outside the
/// output folder changes. The cases are the attacks of issue 17, one test each.
/// </summary>
public sealed class HostileInputTests : IDisposable
{
    // Generous for a loaded 2-core machine; a hang or an exponential load is many times longer.
    private static readonly TimeSpan Limit = TimeSpan.FromSeconds(60);

    // The managed heap may not grow past 768 MiB: an expansion that runs out of memory fails the run instead of the machine.
    private static readonly Dictionary<string, string?> Capped = new() { ["DOTNET_GCHeapHardLimit"] = "0x30000000" };

    private readonly string sandbox = TestPaths.NewTempFolder("hostile");

    public HostileInputTests()
    {
        Directory.CreateDirectory(Repo);
        Directory.CreateDirectory(Outside);
        File.WriteAllText(Path.Combine(Outside, "keep.md"), "a person's file outside the output folder\n");
        Directory.CreateDirectory(Path.Combine(Outside, "plots"));
    }

    private string Repo => Path.Combine(sandbox, "repo");

    private string Outside => Path.Combine(sandbox, "outside");

    private string Out => Path.Combine(sandbox, "out");

    public void Dispose() => Directory.Delete(sandbox, recursive: true);

    private static string Design(string id = "line-driver", string source = "{ waveform: sine, amplitude: 100 mV, frequency: 1 kHz }",
        string load = "{ resistance: 10k }", string extra = "", string title = "Test") => $$"""
        design:
          id: {{id}}
          title: {{title}}
        {{extra}}supplies: { positive: 15 V, negative: -15 V }
        source: {{source}}
        load: {{load}}
        stages:
          - id: gain
            block: inverting
            amplifier: jfet-input-15v
            resistors: thin-film-1pct
            values: { rin: 10k, rf: 20k }
        """.Replace("\r\n", "\n", StringComparison.Ordinal) + "\n";

    private string WriteDesign(string text, string name = "line-driver.yaml")
    {
        var path = Path.Combine(Repo, "designs", name);
        Directory.CreateDirectory(Path.GetDirectoryName(path)!);
        File.WriteAllText(path, text);
        return path;
    }

    /// <summary>Runs the CLI in the repository with the caps and checks that nothing outside <see cref="Out"/> changed.</summary>
    private ProcessRun Check(params string[] args)
    {
        var before = Snapshot();
        var clock = Stopwatch.StartNew();
        var run = ProcessRun.Dotnet(Repo, Capped, Limit, [TestPaths.CliAssembly, "check", .. args, "--today", "2026-12-01"]);
        clock.Stop();
        Assert.True(clock.Elapsed < Limit, $"took {clock.Elapsed}");
        Assert.True(run.ExitCode is 0 or 1 or 2, $"the run crashed or ran out of memory: {run}");
        Assert.DoesNotContain("DR990", run.Output, StringComparison.Ordinal);
        Assert.DoesNotContain("   at ", run.Output, StringComparison.Ordinal);
        Assert.Equal(before, Snapshot());
        return run;
    }

    // Every regular file under the sandbox except the output folder, with a hash of its bytes; links are listed, not followed.
    private SortedDictionary<string, string> Snapshot()
    {
        var files = new SortedDictionary<string, string>(StringComparer.Ordinal);
        var options = new EnumerationOptions { RecurseSubdirectories = true, AttributesToSkip = FileAttributes.ReparsePoint };
        foreach (var file in Directory.EnumerateFiles(sandbox, "*", options))
        {
            if (file.StartsWith(Out + Path.DirectorySeparatorChar, StringComparison.Ordinal) || !IsRegular(file))
            {
                continue;
            }

            files[file] = Convert.ToHexString(SHA256.HashData(File.ReadAllBytes(file)));
        }

        foreach (var folder in Directory.EnumerateDirectories(sandbox, "*", options).Where(d => !d.StartsWith(Out, StringComparison.Ordinal)))
        {
            files[folder + "/"] = "folder";
        }

        return files;
    }

    // The pipes the tests make are named fifo*; reading one would block the snapshot itself.
    private static bool IsRegular(string file) => !Path.GetFileName(file).StartsWith("fifo", StringComparison.Ordinal);

    private static void MakeFifo(string path)
    {
        using var mkfifo = Process.Start(new ProcessStartInfo("mkfifo", [path]) { UseShellExecute = false })!;
        mkfifo.WaitForExit();
        Assert.Equal(0, mkfifo.ExitCode);
    }

    [Fact]
    public void A_library_path_naming_dev_zero_is_refused_at_the_reference()
    {
        WriteDesign(Design(extra: "libraries: [/dev/zero]\n"));
        var run = Check(".");
        Assert.Equal(1, run.ExitCode);
        Assert.Matches(@"line-driver\.yaml\(4,\d+\): error DR915: '/dev/zero' is a device", run.Output);
    }

    [Fact]
    public void A_design_path_that_links_to_dev_urandom_is_refused()
    {
        Directory.CreateDirectory(Path.Combine(Repo, "designs"));
        File.CreateSymbolicLink(Path.Combine(Repo, "designs", "random.yaml"), "/dev/urandom");
        var run = Check(".");
        Assert.Equal(1, run.ExitCode);
        Assert.Contains("error DR915: ", run.Output, StringComparison.Ordinal);
        Assert.Contains("a link to '/dev/urandom'", run.Output, StringComparison.Ordinal);
    }

    [Fact]
    public void A_pipe_as_design_file_and_as_rule_set_never_blocks_the_run()
    {
        Directory.CreateDirectory(Path.Combine(Repo, "designs"));
        MakeFifo(Path.Combine(Repo, "designs", "fifo.yaml"));
        MakeFifo(Path.Combine(Repo, "fifo-rules.yaml"));
        var run = Check(".", "--rules", "fifo-rules.yaml");
        Assert.Equal(1, run.ExitCode);
        // Refused as what they are, not read as empty files.
        Assert.Matches(@"fifo\.yaml\(1,1\): error DR915: '[^']*designs/fifo\.yaml' is a named pipe \(FIFO\), not a regular file", run.Output);
        Assert.Matches(@"fifo-rules\.yaml\(1,1\): error DR915: '[^']*fifo-rules\.yaml' is a named pipe \(FIFO\), not a regular file", run.Output);
    }

    [Fact]
    public void A_pipe_named_as_a_parts_library_is_refused_at_the_reference_as_not_a_regular_file()
    {
        MakeFifo(Path.Combine(Repo, "fifo-parts.yaml"));
        WriteDesign(Design(extra: "libraries: [../fifo-parts.yaml]\n"));
        var run = Check(".");
        Assert.Equal(1, run.ExitCode);
        Assert.Matches(@"line-driver\.yaml\(4,\d+\): error DR915: '[^']*fifo-parts\.yaml' is a named pipe \(FIFO\), not a regular file", run.Output);
    }

    [Fact]
    public void A_long_value_named_by_thousands_of_aliases_is_refused_by_its_expanded_characters()
    {
        // 200,000 characters referenced 4,000 times: 800 million characters if expanded, few nodes.
        var text = new StringBuilder("design:\n  id: bomb\n  title: &long ").Append('x', 200_000).Append("\nwaivers:\n");
        for (var i = 0; i < 4_000; i++)
        {
            text.Append("  - *long\n");
        }

        WriteDesign(text.ToString());
        var run = Check(".");
        Assert.Equal(1, run.ExitCode);
        Assert.Contains("error DR912: The expanded text of keys and values", run.Output, StringComparison.Ordinal);
    }

    [Fact]
    public void A_uses_lattice_three_wide_and_fifteen_deep_loads_each_file_once()
    {
        // Level k has three files, each using all three files of level k+1: 3^15 paths, 45 files.
        var parts = Path.Combine(Repo, "parts");
        Directory.CreateDirectory(parts);
        for (var level = 0; level < 15; level++)
        {
            for (var i = 0; i < 3; i++)
            {
                var uses = level == 14 ? string.Empty : $"uses: [l{level + 1}-0.yaml, l{level + 1}-1.yaml, l{level + 1}-2.yaml]\n";
                File.WriteAllText(Path.Combine(parts, $"l{level}-{i}.yaml"), $"library:\n  id: l{level}-{i}\n  title: Level {level}\n{uses}");
            }
        }

        WriteDesign(Design(extra: "libraries: [../parts/l0-0.yaml, ../parts/l0-1.yaml]\n"));
        var run = Check(".");
        Assert.Equal(0, run.ExitCode);
    }

    [Theory]
    [InlineData("{ waveform: sine, amplitude: 1e-12 V, frequency: 1 kHz }")]
    [InlineData("{ waveform: sum, components: [{ waveform: sine, amplitude: 1 V, frequency: 1 kHz }, { waveform: triangle, amplitude: 0.5 V, frequency: 3 kHz }] }")]
    public void Valid_sources_that_once_crashed_the_tolerance_analysis_are_checked(string source)
    {
        WriteDesign(Design(source: source));
        var run = Check(".");
        Assert.True(run.ExitCode is 0 or 1, run.ToString());
        Assert.Contains("1 design(s) in 1 file(s) checked", run.Output, StringComparison.Ordinal);
    }

    [Fact]
    public void Report_and_pages_paths_that_cannot_be_written_exit_2_naming_the_path()
    {
        WriteDesign(Design());
        File.WriteAllText(Path.Combine(Repo, "a-file"), "not a folder");
        Directory.CreateDirectory(Path.Combine(Repo, "a-folder"));

        var cases = new (string[] Args, string Path)[]
        {
            (["--sarif", "a-folder"], "a-folder"),
            (["--sarif", "a-file/r.sarif"], "a-file"),
            (["--json", "a-folder/"], "a-folder"),
            (["--pages", "a-file"], "a-file"),
        };
        foreach (var (args, path) in cases)
        {
            var run = Check([".", .. args]);
            Assert.True(run.ExitCode == 2, run.ToString());
            Assert.Contains($"'{path}", run.Output, StringComparison.Ordinal);
        }
    }

    [Fact]
    public void Two_designs_with_one_id_are_refused_where_the_second_names_it()
    {
        WriteDesign(Design(), "a.yaml");
        WriteDesign(Design(), "b.yaml");
        var run = Check(".");
        Assert.Equal(1, run.ExitCode);
        Assert.Matches(@"b\.yaml\(2,\d+\): error DR909: The design id 'line-driver' is already used at .*a\.yaml line 2", run.Output);
    }

    [Theory]
    [InlineData("\"line-driver\\n\"", "DR917")]
    [InlineData("index", "DR909")]
    public void An_id_with_a_trailing_newline_or_the_index_page_name_is_refused(string id, string expected)
    {
        WriteDesign(Design(id: id));
        var run = Check(".", "--pages", Out);
        Assert.Equal(1, run.ExitCode);
        Assert.Contains($"error {expected}: ", run.Output, StringComparison.Ordinal);
    }

    [Fact]
    public void Control_characters_in_a_key_cannot_forge_a_log_line()
    {
        // A key holding an escape sequence and a newline followed by a line shaped like a finding.
        WriteDesign(Design(extra: "\"x\\e[31m\\nfake.yaml(1,1): error DR000: forged\": 1\n"));
        var run = Check(".");
        Assert.Equal(1, run.ExitCode);
        Assert.DoesNotContain('\u001b', run.Output);
        Assert.DoesNotContain(run.Output.Split('\n'), line => line.StartsWith("fake.yaml", StringComparison.Ordinal));
        Assert.Contains("\\u001B[31m\\nfake.yaml(1,1): error DR000", run.Output, StringComparison.Ordinal);
    }

    [Fact]
    public void A_byte_that_is_not_utf8_is_refused_with_its_offset()
    {
        var text = Encoding.UTF8.GetBytes(Design(title: "Caf?"));
        var at = Array.IndexOf(text, (byte)'?');
        text[at] = 0xE9; // Latin-1 "é": not UTF-8 on its own
        var path = Path.Combine(Repo, "designs", "latin1.yaml");
        Directory.CreateDirectory(Path.GetDirectoryName(path)!);
        File.WriteAllBytes(path, text);
        var run = Check(".");
        Assert.Equal(1, run.ExitCode);
        Assert.Contains($"latin1.yaml(3,13): error DR900: ", run.Output, StringComparison.Ordinal);
        Assert.Contains($"0xE9 at byte offset {at}", run.Output, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("{ waveform: sine, amplitude: 1 V, band: 1e-9 Hz..2e-9 Hz }", "{ resistance: 10k }")]
    [InlineData("{ waveform: sine, amplitude: 1e308 V, frequency: 1 kHz }", "{ resistance: 10k }")]
    [InlineData("{ waveform: sine, amplitude: 1 V, frequency: 1 kHz }", "{ resistance: 1e308 }")]
    public void Absurd_values_are_refused_by_one_range_wherever_they_appear(string source, string load)
    {
        WriteDesign(Design(source: source, load: load));
        var run = Check(".");
        Assert.Equal(1, run.ExitCode);
        Assert.Contains("error DR905: ", run.Output, StringComparison.Ordinal);
        Assert.DoesNotContain("Infinity", run.Output, StringComparison.Ordinal);
    }

    [Fact]
    public void Three_hundred_stages_are_refused_at_load()
    {
        var stages = string.Concat(Enumerable.Range(0, 300).Select(i =>
            $"  - {{ id: s{i}, block: follower, amplifier: jfet-input-15v }}\n"));
        WriteDesign(Design().Split("stages:")[0] + "stages:\n" + stages);
        var run = Check(".");
        Assert.Equal(1, run.ExitCode);
        Assert.Contains("error DR912: The chain of 300 stages", run.Output, StringComparison.Ordinal);
    }

    [Fact]
    public void A_chain_at_the_stage_limit_is_checked_and_one_stage_more_is_refused()
    {
        // DesignLimits.MaxStages = 32: the longest chain accepted runs to its end (within the suite's time and heap caps).
        static string Chain(int count) => Design().Split("stages:")[0] + "stages:\n" + string.Concat(Enumerable.Range(0, count).Select(i =>
            $"  - {{ id: s{i}, block: follower, amplifier: jfet-input-15v }}\n"));
        WriteDesign(Chain(32), "at-limit.yaml");
        var run = Check(".");
        Assert.Equal(0, run.ExitCode);
        Assert.Contains("0 error(s)", run.Output, StringComparison.Ordinal);

        WriteDesign(Chain(33), "over-limit.yaml");
        run = Check(".");
        Assert.Equal(1, run.ExitCode);
        Assert.Contains("error DR912: The chain of 33 stages", run.Output, StringComparison.Ordinal);
    }

    [Fact]
    public void A_netlist_ladder_at_the_element_limit_is_checked()
    {
        // DesignLimits.MaxNetlistElements = 400: a 400-resistor ladder (solved as a band) runs to its end.
        var ladder = new StringBuilder();
        for (var i = 0; i < 200; i++)
        {
            ladder.Append($"        - {{ id: rs{i}, type: resistor, value: 100, between: [n{i}, n{i + 1}] }}\n");
            ladder.Append($"        - {{ id: rp{i}, type: resistor, value: 100k, between: [n{i + 1}, ground] }}\n");
        }

        WriteDesign("""
            design: { id: ladder, title: Ladder }
            supplies: { positive: 15 V, negative: -15 V }
            source: { waveform: sine, amplitude: 1 V, frequency: 1 kHz }
            load: { resistance: 10k }
            stages:
              - id: net
                netlist:
                  input: n0
                  output: n200
                  elements:

            """ + ladder, "ladder.yaml");
        var run = Check(".");
        Assert.True(run.ExitCode is 0 or 1, run.ToString());
        Assert.DoesNotContain("DR990", run.Output, StringComparison.Ordinal);
        Assert.DoesNotContain("DR912", run.Output, StringComparison.Ordinal);
        Assert.DoesNotContain("DR920", run.Output, StringComparison.Ordinal);
    }

    [Fact]
    public void A_transient_that_runs_out_of_steps_is_located_at_the_frequency_that_set_its_step()
    {
        // A 1 GHz component beside a 1 Hz one asks for more steps than the bound allows: the finding points at the
        // 1 GHz frequency (line 7 of the file), not at the design id.
        WriteDesign("""
            design: { id: far-apart, title: Far apart }
            supplies: { positive: 15 V, negative: -15 V }
            source:
              waveform: sum
              components:
                - { waveform: sine, amplitude: 1 V, frequency: 1 Hz }
                - { waveform: sine, amplitude: 1 mV, frequency: 1 GHz }
            load: { resistance: 10k }
            stages:
              - { id: g, block: inverting, amplifier: jfet-input-15v, values: { rin: 10k, rf: 10k } }

            """, "far-apart.yaml");
        var run = Check(".");
        Assert.Equal(1, run.ExitCode);
        Assert.Matches(@"far-apart\.yaml\(7,\d+(,\d+,\d+)?\): error DR920: ", run.Output);
    }

    [Fact]
    public void A_sum_of_ten_thousand_components_and_a_thousand_node_ladder_are_refused_at_load()
    {
        var components = string.Join(", ", Enumerable.Repeat("{ waveform: sine, amplitude: 1 mV, frequency: 1 kHz }", 10_000));
        WriteDesign(Design(source: $"{{ waveform: sum, components: [{components}] }}"), "sum.yaml");
        var ladder = new StringBuilder();
        for (var i = 0; i < 1_000; i++)
        {
            ladder.Append($"        - {{ id: r{i}, type: resistor, value: 1k, between: [n{i}, n{i + 1}] }}\n");
        }

        WriteDesign("""
            design: { id: ladder, title: Ladder }
            supplies: { positive: 15 V, negative: -15 V }
            source: { waveform: sine, amplitude: 1 V, frequency: 1 kHz }
            load: { resistance: 10k }
            stages:
              - id: net
                netlist:
                  input: n0
                  output: n1000
                  elements:

            """ + ladder, "ladder.yaml");
        var run = Check(".");
        Assert.Equal(1, run.ExitCode);
        Assert.Contains("sum.yaml", run.Output, StringComparison.Ordinal);
        Assert.Contains("error DR912: A sum of 10000 components", run.Output, StringComparison.Ordinal);
        Assert.Contains("error DR912: A netlist of 1000 elements", run.Output, StringComparison.Ordinal);
    }

    [Fact]
    public void A_million_monte_carlo_samples_are_refused_by_the_documented_cap()
    {
        WriteDesign(Design());
        File.WriteAllText(Path.Combine(Repo, "design-rules.yaml"), "rule-set:\n  monte-carlo: { samples: 1000000 }\n");
        var run = Check(".");
        Assert.Equal(1, run.ExitCode);
        Assert.Contains("design-rules.yaml(2,27): error DR905: ", run.Output, StringComparison.Ordinal);
        Assert.Contains("50,000", run.Output, StringComparison.Ordinal);
    }

    [Fact]
    public void Links_inside_the_pages_folder_are_never_followed()
    {
        WriteDesign(Design());
        Directory.CreateDirectory(Out);
        File.CreateSymbolicLink(Path.Combine(Out, "plots"), Path.Combine(Outside, "plots"));
        var run = Check(".", "--pages", Out);
        Assert.Equal(2, run.ExitCode);
        Assert.Contains("error DR931: ", run.Output, StringComparison.Ordinal);
        Assert.Contains("is a symbolic link inside the pages folder", run.Output, StringComparison.Ordinal);
        Assert.Empty(Directory.GetFiles(Path.Combine(Outside, "plots")));
    }

    [Fact]
    public void A_persons_file_bearing_a_page_name_is_left_alone_and_named()
    {
        WriteDesign(Design());
        Directory.CreateDirectory(Out);
        File.WriteAllText(Path.Combine(Out, "index.md"), "my own index\n");
        var run = Check(".", "--pages", Out);
        Assert.Equal(2, run.ExitCode);
        Assert.Contains("index.md' is in the way", run.Output, StringComparison.Ordinal);
        Assert.Equal("my own index\n", File.ReadAllText(Path.Combine(Out, "index.md")));
    }
}
