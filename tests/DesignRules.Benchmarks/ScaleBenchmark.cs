using BenchmarkDotNet.Attributes;
using DesignRules.Loading;
using DesignRules.Run;

namespace DesignRules.Benchmarks;

/// <summary>
/// The run both hosts make (check, JSON report, pages) over a synthetic repository of N designs: a full check with no
/// cache, and a check after one design changed with a warm results cache. The ratio answers "does a one-line change
/// cost a full check"; running the full check again with <c>--affinity 1</c> (one core) against <c>--affinity 3</c>
/// (two cores) answers "do designs and samples run side by side".
/// </summary>
[MemoryDiagnoser]
public class ScaleBenchmark
{
    private string root = null!;
    private IReadOnlyList<string> files = null!;
    private int edit;

    /// <summary>10, 100 and 500 designs; <c>DESIGNRULES_SCALE_SIZES=500</c> runs one size alone (a 500-design full check takes minutes).</summary>
    [ParamsSource(nameof(Sizes))]
    public int Designs { get; set; }

    public static IEnumerable<int> Sizes() =>
        (Environment.GetEnvironmentVariable("DESIGNRULES_SCALE_SIZES") ?? "10,100,500")
            .Split(',', StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries)
            .Select(s => int.Parse(s, System.Globalization.CultureInfo.InvariantCulture));

    [GlobalSetup]
    public void Setup()
    {
        root = SyntheticRepository.Write(Designs);
        files = RepositoryFiles.Find([root], out _);
        // A warm cache and pages to start the one-change runs from.
        DesignRun.Execute(Request("cache", "pages-warm"));
    }

    [GlobalCleanup]
    public void Cleanup() => Directory.Delete(root, recursive: true);

    [IterationSetup(Target = nameof(OneDesignChanged))]
    public void ChangeOneDesign() => SyntheticRepository.TouchOne(root, ++edit);

    [Benchmark(Baseline = true, Description = "full check, no cache")]
    public int FullCheck() => DesignRun.Execute(Request(null, "pages-full")).Report.DesignCount;

    [Benchmark(Description = "one design changed, warm cache")]
    public int OneDesignChanged() => DesignRun.Execute(Request("cache", "pages-warm")).FromCache;

    private RunRequest Request(string? cache, string pages) => new(files, root, new DateOnly(2026, 12, 1))
    {
        RuleSetFile = Path.Combine(root, "design-rules.yaml"),
        ReportRoot = root,
        JsonFile = Path.Combine(root, "out", pages + ".json"),
        PagesFolder = Path.Combine(root, pages),
        CacheFolder = cache is null ? null : Path.Combine(root, "obj", cache),
    };
}
