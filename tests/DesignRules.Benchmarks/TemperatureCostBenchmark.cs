using BenchmarkDotNet.Attributes;
using DesignRules.Loading;
using DesignRules.Rules;

namespace DesignRules.Benchmarks;

/// <summary>
/// What an operating range adds to a full check of the example repository: the example as it is (every design at 25 °C)
/// against a copy in which every design states <c>temperature: -40 °C..85 °C</c>, so that the worst case of every stage and
/// filter runs at the range's ends and middle and every Monte Carlo sample draws its temperature. BenchmarkDotNet needs
/// benchmark classes to be public and unsealed.
/// </summary>
[MemoryDiagnoser]
public class TemperatureCostBenchmark
{
    private IReadOnlyList<string> plain = null!;
    private IReadOnlyList<string> ranged = null!;
    private CheckOptions plainOptions = null!;
    private CheckOptions rangedOptions = null!;
    private string copy = null!;

    [GlobalSetup]
    public void Setup()
    {
        var root = Path.Combine(typeof(TemperatureCostBenchmark).Assembly
            .GetCustomAttributes(typeof(System.Reflection.AssemblyMetadataAttribute), false)
            .Cast<System.Reflection.AssemblyMetadataAttribute>().Single(a => a.Key == "RepositoryRoot").Value!, "example-design");
        plain = RepositoryFiles.Find([root], out _);
        plainOptions = new CheckOptions(Path.Combine(root, RuleSetLoader.DefaultFileName), new DateOnly(2026, 12, 1));

        copy = Directory.CreateTempSubdirectory("designrules-bench-temperature-").FullName;
        foreach (var file in Directory.EnumerateFiles(root, "*.yaml", SearchOption.AllDirectories))
        {
            var target = Path.Combine(copy, Path.GetRelativePath(root, file));
            Directory.CreateDirectory(Path.GetDirectoryName(target)!);
            var text = File.ReadAllText(file);
            bool isDesign = Path.GetRelativePath(root, file).StartsWith("designs", StringComparison.Ordinal);
            File.WriteAllText(target, isDesign ? text.Replace("\nsupplies:", "\ntemperature: -40 °C..85 °C\nsupplies:", StringComparison.Ordinal) : text);
        }

        ranged = RepositoryFiles.Find([copy], out _);
        rangedOptions = new CheckOptions(Path.Combine(copy, RuleSetLoader.DefaultFileName), new DateOnly(2026, 12, 1));
        var report = DesignCheck.Run(ranged, rangedOptions);
        if (report.Designs.Count != DesignCheck.Run(plain, plainOptions).Designs.Count)
        {
            throw new InvalidOperationException("the copy with an operating range does not check the same designs");
        }
    }

    [GlobalCleanup]
    public void Cleanup() => Directory.Delete(copy, recursive: true);

    [Benchmark(Baseline = true, Description = "full check of example-design at 25 °C")]
    public int AtRoomTemperature() => DesignCheck.Run(plain, plainOptions).Findings.Count;

    [Benchmark(Description = "full check with every design over -40 °C..85 °C")]
    public int OverOperatingRange() => DesignCheck.Run(ranged, rangedOptions).Findings.Count;
}
