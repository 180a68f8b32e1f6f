using BenchmarkDotNet.Attributes;
using DesignRules.Elaboration;
using DesignRules.Loading;
using DesignRules.Model;
using DesignRules.Figures;
using DesignRules.Rules.Evaluation;
using DesignRules.Figures.Tolerance;
using DesignRules.Rules.Evaluation.Tolerance;

namespace DesignRules.Benchmarks;

/// <summary>
/// A 1,000-sample Monte Carlo (DC transfer of the elaborated chain per sample, samples in parallel on every core) of every
/// stage of the example designs. BenchmarkDotNet needs benchmark classes to be public and unsealed.
/// </summary>
[MemoryDiagnoser]
public class MonteCarloBenchmark
{
    private readonly MonteCarloSettings settings = new(1000, 1, ToleranceDistribution.Normal);
    private List<(Design Design, ElaborationOptions Options, WorstCaseAnalysis WorstCase)> stages = null!;

    [GlobalSetup]
    public void Setup()
    {
        var root = FindExampleDesigns();
        var files = RepositoryFiles.Find([root], out _).Order(StringComparer.Ordinal).ToList();
        var loaded = DesignLoader.LoadFiles(files);
        stages = [];
        foreach (var design in loaded.Designs)
        {
            var evaluation = new DesignEvaluation(design, RuleSet.Default);
            foreach (var stage in ToleranceAnalyses.Stages(evaluation))
            {
                var worstCase = ToleranceAnalyses.WorstCase(evaluation, stage);
                if (worstCase.Failure is null)
                {
                    stages.Add((design, evaluation.Analyses.Chain(BandEnd.Top).Options, worstCase));
                }
            }
        }
    }

    [Benchmark(Description = "Monte Carlo, 1,000 samples of every example stage, all cores")]
    public int EveryExampleStage()
    {
        int solved = 0;
        foreach (var (design, options, worstCase) in stages)
        {
            var result = MonteCarloYield.Run(worstCase, settings);
            solved += result.Samples - result.Unsolved;
        }

        return solved;
    }

    private static string FindExampleDesigns()
    {
        var root = typeof(MonteCarloBenchmark).Assembly.GetCustomAttributes(typeof(System.Reflection.AssemblyMetadataAttribute), false)
            .Cast<System.Reflection.AssemblyMetadataAttribute>().FirstOrDefault(a => a.Key == "RepositoryRoot")?.Value;
        if (root is not null && Directory.Exists(Path.Combine(root, "example-design")))
        {
            return Path.Combine(root, "example-design");
        }

        var directory = new DirectoryInfo(AppContext.BaseDirectory);
        while (directory is not null && !Directory.Exists(Path.Combine(directory.FullName, "example-design")))
        {
            directory = directory.Parent;
        }

        return Path.Combine(directory?.FullName ?? Directory.GetCurrentDirectory(), "example-design");
    }
}
