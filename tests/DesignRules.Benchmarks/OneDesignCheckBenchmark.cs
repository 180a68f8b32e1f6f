using BenchmarkDotNet.Attributes;
using BenchmarkDotNet.Engines;
using DesignRules.Loading;
using DesignRules.Rules;

namespace DesignRules.Benchmarks;

/// <summary>
/// The check of one design of the example repository alone (its design file, every parts file and the rule set), as a
/// build evaluates the one design that changed: "cold" is the first check in a fresh process (each launch its own
/// process; run it out of process, not with <c>--inProcess</c>, or every launch but the first is warm), "warm" a check in
/// a process that has checked it before. Wall time on all the machine's cores: the corner runs and the two band ends'
/// transients run side by side. The example's heaviest design by default. BenchmarkDotNet needs benchmark classes to be
/// public and unsealed.
/// </summary>
[MemoryDiagnoser]
[SimpleJob(RunStrategy.ColdStart, launchCount: 5, warmupCount: 0, iterationCount: 1, id: "cold")]
[SimpleJob(RunStrategy.Monitoring, launchCount: 1, warmupCount: 3, iterationCount: 7, id: "warm")]
public class OneDesignCheckBenchmark
{
    private IReadOnlyList<string> files = null!;
    private CheckOptions options = null!;

    /// <summary>The design's file name without extension, in <c>example-design/designs</c>.</summary>
    [Params("compressor-vibration-envelope")]
    public string Design { get; set; } = "compressor-vibration-envelope";

    [GlobalSetup]
    public void Setup()
    {
        var root = Path.Combine(typeof(OneDesignCheckBenchmark).Assembly
            .GetCustomAttributes(typeof(System.Reflection.AssemblyMetadataAttribute), false)
            .Cast<System.Reflection.AssemblyMetadataAttribute>().Single(a => a.Key == "RepositoryRoot").Value!, "example-design");
        var design = Path.Combine(root, "designs", Design + ".yaml");
        if (!File.Exists(design))
        {
            throw new InvalidOperationException($"no design file {design}");
        }

        // Only finding the files here: nothing of the check runs before the first (cold) operation.
        var designs = Path.Combine(root, "designs") + Path.DirectorySeparatorChar;
        files = RepositoryFiles.Find([root], out _)
            .Where(f => !Path.GetFullPath(f).StartsWith(designs, StringComparison.Ordinal) || Path.GetFullPath(f) == Path.GetFullPath(design))
            .ToList();
        options = new CheckOptions(Path.Combine(root, RuleSetLoader.DefaultFileName), new DateOnly(2026, 12, 1));
    }

    [Benchmark(Description = "check of one example design")]
    public int Check()
    {
        var report = DesignCheck.Run(files, options);
        return report.Designs.Count == 1 ? report.Findings.Count : throw new InvalidOperationException("not one design checked");
    }
}
