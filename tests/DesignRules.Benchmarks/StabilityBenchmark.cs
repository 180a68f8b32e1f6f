using BenchmarkDotNet.Attributes;
using DesignRules.Elaboration;
using DesignRules.Figures;
using DesignRules.Figures.Stability;
using DesignRules.Loading;
using DesignRules.Rules;
using DesignRules.Rules.Evaluation;
using DesignRules.Figures.Filters;

namespace DesignRules.Benchmarks;

/// <summary>
/// Cost of the analyses issue 13 added, on the example repository, against the full check: the engine's loop gain of
/// every amplifier at the quiescent point (one run per design, the rules' 81 frequencies, crossings placed by bisection);
/// the figures layer's shared stability analyses as the rules use them (<see cref="DesignAnalyses.LoopGains"/> at every
/// operating point tried, then <see cref="DesignAnalyses.Steps"/>, the step transient), from a loaded design; and the
/// nominal response measurement of every filter stage (f0, Q, pass-band gain, −3 dB points). BenchmarkDotNet needs
/// benchmark classes to be public and unsealed.
/// </summary>
[MemoryDiagnoser]
public class StabilityBenchmark
{
    private IReadOnlyList<Circuit> circuits = null!;
    private IReadOnlyList<(ElaboratedChain Chain, StageProbe Stage, Blocks.FilterResponse Ideal)> filters = null!;
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
        var chains = designs.Select(d => ChainElaborator.Elaborate(d)).Where(c => c.Succeeded).ToArray();
        circuits = [.. chains.Select(c => c.Circuit)];
        filters = [.. chains.SelectMany(c => c.Stages.Select(s => (Chain: c, Stage: s, Ideal: RequirementTable.FilterOf(s.Stage))))
            .Where(f => f.Ideal is not null).Select(f => (f.Chain, f.Stage, f.Ideal!))];
        options = new CheckOptions(Path.Combine(root, RuleSetLoader.DefaultFileName), new DateOnly(2026, 12, 1));
    }

    [Benchmark(Description = "loop gain of every amplifier of example-design (quiescent point)")]
    public int LoopGains() => circuits.Sum(c => Simulate.LoopGain(c, LoopGainAnalyses.Sweep).Loops.Count);

    [Benchmark(Description = "shared stability analyses of example-design (loop gains at every operating point, step transient)")]
    public int StabilityAnalyses() => designs.Sum(d =>
    {
        var analyses = new DesignAnalyses(d, Model.MonteCarloSettings.Default, NoFailures.Instance);
        return analyses.LoopGains.Loops.Count + analyses.Steps.Stages.Count;
    });

    [Benchmark(Description = "nominal response of every filter stage of example-design (f0, Q, gain, -3 dB points)")]
    public int FilterResponses() => filters.Count(f => FilterFigures.Measure(f.Chain, f.Stage, f.Ideal) is not null);

    [Benchmark(Baseline = true, Description = "full check of example-design")]
    public int FullCheck() => DesignCheck.Run(files, options).Findings.Count;
}

/// <summary>Failures are counted by the full check; the analysis benchmarks only time the work.</summary>
internal sealed class NoFailures : IAnalysisFailures
{
    public static NoFailures Instance { get; } = new();

    public void Failed(string analysis, SimulationFailure failure, ElaboratedChain chain)
    {
    }

    public void Unsettled(BandEnd end, SettledTransient steady)
    {
    }
}
