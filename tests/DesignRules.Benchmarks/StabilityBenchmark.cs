using BenchmarkDotNet.Attributes;
using DesignRules.Elaboration;
using DesignRules.Loading;
using DesignRules.Rules;
using DesignRules.Simulation;

namespace DesignRules.Benchmarks;

/// <summary>
/// Cost of the stability analyses on the example repository, against the full check: the engine's loop gain of every
/// amplifier at the quiescent point (one run per design, the rules' 91 frequencies, crossings placed by bisection), and the shared
/// analyses as the rules run them (loop gains at every operating point tried, then the step transient), from an
/// elaborated design. BenchmarkDotNet needs benchmark classes to be public and unsealed.
/// </summary>
[MemoryDiagnoser]
public class StabilityBenchmark
{
    private IReadOnlyList<Circuit> circuits = null!;
    private IReadOnlyList<string> files = null!;
    private IReadOnlyList<Model.Design> designs = null!;
    private CheckOptions options = null!;

    [GlobalSetup]
    public void Setup()
    {
        var root = Path.Combine(typeof(StabilityBenchmark).Assembly
            .GetCustomAttributes(typeof(System.Reflection.AssemblyMetadataAttribute), false)
            .Cast<System.Reflection.AssemblyMetadataAttribute>().Single(a => a.Key == "RepositoryRoot").Value!, "example-design");
        files = RepositoryFiles.Find([root], out _);
        designs = DesignLoader.LoadFiles(files).Designs;
        circuits = [.. designs.Select(d => ChainElaborator.Elaborate(d)).Where(c => c.Succeeded).Select(c => c.Circuit)];
        options = new CheckOptions(Path.Combine(root, RuleSetLoader.DefaultFileName), new DateOnly(2026, 12, 1));
    }

    [Benchmark(Description = "loop gain of every amplifier of example-design (quiescent point)")]
    public int LoopGains() => circuits.Sum(c => Simulate.LoopGain(c, DesignRules.Rules.Evaluation.StabilityAnalyses.Sweep).Loops.Count);

    [Benchmark(Description = "shared stability analyses of example-design (loop gains at every operating point, step transient)")]
    public int StabilityAnalyses() => designs.Sum(d =>
    {
        var analyses = new DesignRules.Rules.Evaluation.DesignAnalyses(d, Model.MonteCarloSettings.Default);
        return DesignRules.Rules.Evaluation.StabilityAnalyses.LoopGains(analyses).Loops.Count + DesignRules.Rules.Evaluation.StepAnalyses.Steps(analyses).Stages.Count;
    });

    [Benchmark(Baseline = true, Description = "full check of example-design")]
    public int FullCheck() => DesignCheck.Run(files, options).Findings.Count;
}
