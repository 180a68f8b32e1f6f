using DesignRules.Elaboration;
using DesignRules.Loading;
using DesignRules.Model;
using DesignRules.Figures;
using DesignRules.Rules.Evaluation;
using DesignRules.Figures.Tolerance;
using DesignRules.Rules.Evaluation.Tolerance;

namespace DesignRules.Rules.Tests.Tolerance;

/// <summary>Loads a tolerance fixture and gives its one stage's analyses.</summary>
internal static class ToleranceFixture
{
    public static (DesignEvaluation Evaluation, StageProbe Stage) Load(string name)
    {
        var loaded = DesignLoader.LoadFiles([RuleFixture.Path(Path.Combine("tolerance", name))]);
        var design = Assert.Single(loaded.Designs);
        var evaluation = new DesignEvaluation(design, RuleSet.Default);
        return (evaluation, Assert.Single(ToleranceAnalyses.Stages(evaluation)));
    }

    public static WorstCaseAnalysis WorstCase(string name)
    {
        var (evaluation, stage) = Load(name);
        var analysis = ToleranceAnalyses.WorstCase(evaluation, stage);
        Assert.Null(analysis.Failure);
        return analysis;
    }

    public static MonteCarloYield MonteCarlo(string name, MonteCarloSettings settings, int threads = -1)
    {
        var (evaluation, stage) = Load(name);
        var worstCase = ToleranceAnalyses.WorstCase(evaluation, stage);
        return MonteCarloYield.Run(worstCase, settings, threads);
    }
}
