using BenchmarkDotNet.Attributes;
using DesignRules.Loading;
using DesignRules.Pages;
using DesignRules.Rules;

namespace DesignRules.Benchmarks;

/// <summary>
/// A full check of the example repository (every rule, every analysis, the Monte Carlo of its rule-set file), and the
/// same check followed by rendering every datasheet page and plot, so that the cost of the pages can be read off as
/// the difference. BenchmarkDotNet needs benchmark classes to be public and unsealed.
/// </summary>
[MemoryDiagnoser]
public class CheckAndPagesBenchmark
{
    private IReadOnlyList<string> files = null!;
    private CheckOptions options = null!;
    private CheckReport report = null!;
    private string output = null!;

    [GlobalSetup]
    public void Setup()
    {
        var root = Path.Combine(typeof(CheckAndPagesBenchmark).Assembly
            .GetCustomAttributes(typeof(System.Reflection.AssemblyMetadataAttribute), false)
            .Cast<System.Reflection.AssemblyMetadataAttribute>().Single(a => a.Key == "RepositoryRoot").Value!, "example-design");
        files = RepositoryFiles.Find([root], out _);
        options = new CheckOptions(Path.Combine(root, RuleSetLoader.DefaultFileName), new DateOnly(2026, 12, 1));
        report = DesignCheck.Run(files, options);
        output = Directory.CreateTempSubdirectory("designrules-bench-pages-").FullName;
    }

    [Benchmark(Baseline = true, Description = "full check of example-design")]
    public int FullCheck() => DesignCheck.Run(files, options).Findings.Count;

    [Benchmark(Description = "rendering every page and plot of example-design")]
    public int RenderPages() => DatasheetPages.Write(report, new PageOptions(output)).Written.Count;
}
