using DesignRules.Model;

namespace DesignRules.Rules.Tests.Tolerance;

/// <summary>DR402: the seeded Monte Carlo yield, its statistics and its reproducibility.</summary>
public sealed class MonteCarloYieldTests
{
    [Fact]
    public void A_stage_within_budget_yields_every_sample() => RuleFixture.Verify("tolerance/inverting-within-budget.yaml");

    [Fact]
    public void A_stage_over_budget_yields_too_few_samples() => RuleFixture.Verify("tolerance/inverting-over-budget.yaml");

    [Fact]
    public void The_spread_of_a_resistor_ratio_matches_the_root_sum_square_estimate()
    {
        var result = ToleranceFixture.MonteCarlo("gain-corners-inverting.yaml", new MonteCarloSettings(10_000, 7, ToleranceDistribution.Normal));
        var gains = result.Gains;
        Assert.DoesNotContain(gains, double.IsNaN);
        double mean = gains.Average();
        double sd = Math.Sqrt(gains.Sum(g => (g - mean) * (g - mean)) / (gains.Length - 1));

        // Root-sum-square (first-order propagation of independent errors, textbook): σ(Rf/Rin)/(Rf/Rin) = √(σ1² + σ2²),
        // with σ = t/3 for a tolerance taken as ±3σ; 1 % resistors give 0.471 %.
        double expected = Math.Sqrt(2) * 0.01 / 3;
        Assert.InRange(Math.Abs(sd / mean), expected * 0.95, expected * 1.05);
    }

    [Fact]
    public void The_same_seed_gives_identical_results()
    {
        var settings = new MonteCarloSettings(200, 42, ToleranceDistribution.Normal);
        var a = ToleranceFixture.MonteCarlo("inverting-over-budget.yaml", settings);
        var b = ToleranceFixture.MonteCarlo("inverting-over-budget.yaml", settings);
        Assert.Equal(a.Errors, b.Errors);
        Assert.Equal(a.Gains, b.Gains);
        var c = ToleranceFixture.MonteCarlo("inverting-over-budget.yaml", settings with { Seed = 43 });
        Assert.NotEqual(a.Gains, c.Gains);
    }

    [Fact]
    public void Different_thread_counts_give_identical_results()
    {
        var settings = new MonteCarloSettings(200, 5, ToleranceDistribution.Uniform);
        var serial = ToleranceFixture.MonteCarlo("inverting-over-budget.yaml", settings, threads: 1);
        var two = ToleranceFixture.MonteCarlo("inverting-over-budget.yaml", settings, threads: 2);
        var all = ToleranceFixture.MonteCarlo("inverting-over-budget.yaml", settings, threads: -1);
        Assert.Equal(serial.Errors, two.Errors);
        Assert.Equal(serial.Errors, all.Errors);
        Assert.Equal(serial.Gains, all.Gains);
    }

    [Fact]
    public void Uniform_draws_stay_within_the_tolerance_and_normal_draws_within_three_sigma()
    {
        var random = DesignRules.Figures.Tolerance.SampleDraws.For(1, "amp", 0);
        for (int i = 0; i < 10_000; i++)
        {
            Assert.InRange(DesignRules.Figures.Tolerance.SampleDraws.Unit(random, ToleranceDistribution.Normal), -1, 1);
            Assert.InRange(DesignRules.Figures.Tolerance.SampleDraws.Unit(random, ToleranceDistribution.Uniform), -1, 1);
        }
    }
}
