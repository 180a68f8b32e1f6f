using BenchmarkDotNet.Attributes;
using DesignRules.Loading;
using DesignRules.Reports;
using DesignRules.Reports.Comparison;
using DesignRules.Rules;

namespace DesignRules.Benchmarks;

/// <summary>
/// The time of comparing two JSON reports of the example repository, as <c>designrules compare</c> does in CI: read both
/// reports back, classify every finding and match every figure, and write the Markdown review summary. The head report is
/// the example's check; the base is the same check without its first finding, so that the comparison has a change to find.
/// </summary>
[MemoryDiagnoser]
public class CompareReportsBenchmark
{
    private byte[] baseJson = null!;
    private byte[] headJson = null!;

    [GlobalSetup]
    public void Setup()
    {
        var root = Path.Combine(typeof(CompareReportsBenchmark).Assembly
            .GetCustomAttributes(typeof(System.Reflection.AssemblyMetadataAttribute), false)
            .Cast<System.Reflection.AssemblyMetadataAttribute>().Single(a => a.Key == "RepositoryRoot").Value!, "example-design");
        var files = RepositoryFiles.Find([root], out _);
        var report = DesignCheck.Run(files, new CheckOptions(Path.Combine(root, RuleSetLoader.DefaultFileName), new DateOnly(2026, 12, 1)));
        var settings = new ReportSettings(root, null, "benchmark");
        headJson = JsonReport.ToBytes(report, settings);
        baseJson = JsonReport.ToBytes(report with { Findings = [.. report.Findings.Skip(1)] }, settings);
    }

    [Benchmark(Description = "compare two reports of example-design (read, classify, summarise)")]
    public int CompareAndSummarise()
    {
        var before = ReportSnapshot.FromBytes(baseJson, "base").Snapshot!;
        var after = ReportSnapshot.FromBytes(headJson, "head").Snapshot!;
        return ReviewSummary.Write(RunComparison.Compare(before, after)).Length;
    }
}
