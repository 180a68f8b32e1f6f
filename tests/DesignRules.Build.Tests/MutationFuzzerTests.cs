using System.Diagnostics;
using System.Globalization;
using System.Text;
using DesignRules.Loading;
using DesignRules.Pages;
using DesignRules.Rules;

namespace DesignRules.Build.Tests;

/// <summary>
/// A seeded mutation fuzzer over the example designs, the example parts file and the loader and rule fixtures: every
/// mutant goes through the whole run (load, every rule, pages), and must end as the command line would with exit code
/// 0 or 1 (2 is for options, which the fuzzer does not mutate), never with an exception (the command line's DR990),
/// and within 10 seconds. Each CI run tries the same few hundred mutants; set <c>DESIGNRULES_FUZZ_MUTANTS</c> to try
/// more and <c>DESIGNRULES_FUZZ_SEED</c> to try others (the README says so).
/// </summary>
[Collection(Alone.Name)]
public sealed class MutationFuzzerTests : IDisposable
{
    private const int DefaultMutants = 300;
    private const int DefaultSeed = 20261202;
    private static readonly TimeSpan PerRun = TimeSpan.FromSeconds(10);

    // Text that matters to YAML, to our value syntax and to the hostile cases: aliases, control characters, huge and tiny values.
    private static readonly string[] Tokens =
    [
        ":", "-", "[", "]", "{", "}", "&a ", "*a", "<<: *a", "!!binary ", "'", "\"", "#", "|", ">", "\n", "\t", "  ",
        "1e308", "1e-12", "-0", "NaN", "0", "4k7", "R47", "1e-9 Hz..2e-9 Hz", "..", "10 V/us", "100%", "true", "null", "~",
        "\u001b[31m", "\r", "\u0000", "\u202e", "é", "index", "sum", "dc", "square", "netlist:", "between: [a, b]",
        "block: absolute-value", "waveform: sum", "components: [{ waveform: triangle, amplitude: 1 V, frequency: 3 kHz }]",
        "libraries: [../parts/cold-store-parts.yaml]", "uses: [cold-store-parts.yaml]", "samples: 10", "---\n",
    ];

    private readonly string repo = TestPaths.NewTempFolder("fuzz");

    public void Dispose() => Directory.Delete(repo, recursive: true);

    private static int Setting(string name, int fallback) =>
        int.TryParse(Environment.GetEnvironmentVariable(name), NumberStyles.Integer, CultureInfo.InvariantCulture, out var value) ? value : fallback;

    private static List<(string Name, string Text)> Seeds()
    {
        var root = TestPaths.RepositoryRoot;
        var files = Directory.GetFiles(Path.Combine(root, "example-design", "designs"), "*.yaml")
            .Concat(Directory.GetFiles(Path.Combine(root, "example-design", "parts"), "*.yaml"))
            .Concat(Directory.GetFiles(Path.Combine(root, "tests", "DesignRules.Tests", "Fixtures", "loader"), "*.yaml", SearchOption.AllDirectories))
            .Concat(Directory.GetFiles(Path.Combine(root, "tests", "DesignRules.Rules.Tests", "Fixtures"), "*.yaml", SearchOption.AllDirectories)
                .Where(f => !f.Contains("rule-sets", StringComparison.Ordinal)));
        return files.Order(StringComparer.Ordinal).Select(f => (Path.GetFileName(f), File.ReadAllText(f))).ToList();
    }

    private static string Mutate(string text, Random random)
    {
        var edits = random.Next(1, 6);
        for (var e = 0; e < edits; e++)
        {
            var at = text.Length == 0 ? 0 : random.Next(text.Length);
            var length = Math.Min(random.Next(0, 40), text.Length - at);
            var token = Tokens[random.Next(Tokens.Length)];
            text = random.Next(5) switch
            {
                0 => text.Insert(at, token),
                1 => text.Remove(at, length),
                2 => text.Remove(at, length).Insert(at, token),
                3 => SwapLines(text, random),
                _ => DuplicateLine(text, random),
            };
        }

        return text;
    }

    private static string SwapLines(string text, Random random)
    {
        var lines = text.Split('\n');
        var (a, b) = (random.Next(lines.Length), random.Next(lines.Length));
        (lines[a], lines[b]) = (lines[b], lines[a]);
        return string.Join('\n', lines);
    }

    private static string DuplicateLine(string text, Random random)
    {
        var lines = text.Split('\n').ToList();
        var a = random.Next(lines.Count);
        lines.Insert(a, lines[a]);
        return string.Join('\n', lines);
    }

    [Fact]
    public void Mutated_designs_end_in_exit_0_or_1_without_a_fault_of_the_tool_within_ten_seconds()
    {
        var mutants = Setting("DESIGNRULES_FUZZ_MUTANTS", DefaultMutants);
        var seed = Setting("DESIGNRULES_FUZZ_SEED", DefaultSeed);
        var random = new Random(seed);
        var seeds = Seeds();

        // The mutants live in a copy of the example repository, so library references resolve as they do there; a small
        // Monte Carlo keeps each run short (the fuzzer looks for crashes and hangs, not yields).
        Directory.CreateDirectory(Path.Combine(repo, "designs"));
        var parts = Path.Combine(repo, "parts");
        Directory.CreateDirectory(parts);
        foreach (var file in Directory.GetFiles(Path.Combine(TestPaths.RepositoryRoot, "example-design", "parts")))
        {
            File.Copy(file, Path.Combine(parts, Path.GetFileName(file)));
        }

        var ruleSet = Path.Combine(repo, "design-rules.yaml");
        File.WriteAllText(ruleSet, "rule-set:\n  monte-carlo: { samples: 20, seed: 1 }\n");
        var slowest = TimeSpan.Zero;
        for (var i = 0; i < mutants; i++)
        {
            var (name, text) = seeds[random.Next(seeds.Count)];
            var mutant = Mutate(text, random);
            var path = Path.Combine(repo, name.Contains("parts", StringComparison.Ordinal) ? "parts" : "designs", $"mutant-{i}.yaml");
            File.WriteAllText(path, mutant, new UTF8Encoding(false));
            var clock = Stopwatch.StartNew();
            var exit = Run(path, ruleSet, out var fault);
            clock.Stop();
            slowest = clock.Elapsed > slowest ? clock.Elapsed : slowest;
            var context = $"mutant {i} of {name} (seed {seed.ToString(CultureInfo.InvariantCulture)}):\n{mutant}";
            Assert.True(fault is null, $"fault of the tool ({fault}) on {context}");
            Assert.True(exit is 0 or 1 or 2, $"exit {exit} on {context}");
            Assert.True(clock.Elapsed < PerRun, $"took {clock.Elapsed} on {context}");
            File.Delete(path);
        }

        Assert.True(slowest < PerRun, slowest.ToString());
    }

    // What the command line does with one file: check, then pages; an exception here is its DR990.
    private int Run(string path, string ruleSet, out Exception? fault)
    {
        fault = null;
        try
        {
            var report = DesignCheck.Run([path], new CheckOptions(ruleSet, new DateOnly(2026, 12, 1)));
            Assert.DoesNotContain(report.Findings, f => f.RuleId == "DR990");
            var pages = DatasheetPages.Write(report, new PageOptions(Path.Combine(repo, "pages"), null, repo));
            return report.ErrorCount > 0 || pages.Diagnostics.Count > 0 ? 1 : 0;
        }
        catch (Exception ex) when (ex is not Xunit.Sdk.XunitException)
        {
            fault = ex;
            return 2;
        }
    }
}

/// <summary>
/// Tests that time single runs: they run after the parallel tests, alone, so that the builds and processes of other
/// tests in this assembly do not share the cores with the run being timed.
/// </summary>
[CollectionDefinition(Name, DisableParallelization = true)]
public sealed class Alone
{
    public const string Name = "timed runs, alone";
}
