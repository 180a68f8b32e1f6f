using DesignRules.Diagnostics;
using DesignRules.Model;
using DesignRules.Figures.Tolerance;
using DesignRules.Rules.Evaluation.Tolerance;
using MathNet.Numerics.Distributions;

namespace DesignRules.Rules.Tests.Tolerance;

/// <summary>
/// The Monte Carlo yield is judged on its two-sided Clopper–Pearson interval: met when the lower bound reaches the
/// requirement, failed (DR402) when the upper bound stays below it, not shown (DR406) otherwise.
/// </summary>
public sealed class YieldConfidenceTests
{
    private const string NearFixture = "tolerance/yield-near-99p5.yaml";

    // True yield of the fixture by formula: the difference of two independent uniforms on [−1, 1] has the triangular
    // density (2 − |d|)/4, so P(|d| > 1.86) = (2 − 1.86)²/4 = 0.0049 (see the fixture's header).
    private const double FixtureTrueYield = 1 - (0.14 * 0.14 / 4);

    [Fact]
    public void No_failure_in_1000_samples_bounds_the_yield_below_by_99_70_percent_at_one_sided_95_percent()
    {
        // A one-sided 95 % bound is the lower end of the two-sided 90 % interval.
        var (lower, upper) = ClopperPearson.Interval(1000, 1000, 0.90);

        // Exact Beta quantile: with no failure the bound is the 5 % quantile of Beta(1000, 1), whose CDF is x^1000,
        // so it is 0.05^(1/1000) = 0.997009 (closed form); the MathNet.Numerics quantile agrees, and the issue's
        // published figure is 99.70 %.
        Assert.Equal(Math.Pow(0.05, 1.0 / 1000), lower, 12);
        Assert.Equal(Beta.InvCDF(1000, 1, 0.05), lower, 9);
        Assert.Equal(0.9970, Math.Round(lower, 4));
        Assert.Equal(1.0, upper);

        // Rule of three (Hanley and Lippman-Hand, JAMA 1983, from memory): the one-sided 95 % upper bound of the failure
        // rate after n clean trials is about 3/n; −ln(0.05) = 2.996 is where the "3" comes from.
        Assert.Equal(1 - (3.0 / 1000), lower, 4);
    }

    [Fact]
    public void The_two_sided_95_percent_interval_of_1000_clean_samples_starts_at_99_63_percent()
    {
        var (lower, _) = ClopperPearson.Interval(1000, 1000, 0.95);

        // Closed form of the 2.5 % quantile of Beta(1000, 1): 0.025^(1/1000).
        Assert.Equal(Math.Pow(0.025, 1.0 / 1000), lower, 12);
    }

    [Fact]
    public void One_success_in_ten_gives_the_tabulated_exact_interval()
    {
        var (lower, upper) = ClopperPearson.Interval(1, 10, 0.95);

        // Exact (Clopper–Pearson) 95 % interval for 1/10: 0.0025 to 0.4450, as binomial tables give it (from memory);
        // the lower end is also closed-form, 1 − 0.975^(1/10).
        Assert.Equal(1 - Math.Pow(0.975, 0.1), lower, 9);
        Assert.Equal(0.0025, lower, 4);
        Assert.Equal(0.4450, upper, 4);
    }

    [Theory]
    [InlineData(3, 20)]
    [InlineData(47, 50)]
    [InlineData(990, 1000)]
    [InlineData(9951, 10000)]
    public void The_beta_quantiles_agree_with_the_F_distribution_form_of_the_same_interval(int k, int n)
    {
        // The same interval written with F quantiles (Leemis and Trivedi, "A comparison of approximate interval
        // estimators for the Bernoulli parameter", The American Statistician 1996; NIST/SEMATECH e-Handbook 7.2.4.1,
        // from memory): lower = k / (k + (n − k + 1)·F(1 − α/2; 2(n − k + 1), 2k)),
        // upper = (k + 1)·F(1 − α/2; 2(k + 1), 2(n − k)) / (n − k + (k + 1)·F(1 − α/2; 2(k + 1), 2(n − k))).
        var (lower, upper) = ClopperPearson.Interval(k, n, 0.95);

        double fLow = FisherSnedecor.InvCDF(2.0 * (n - k + 1), 2.0 * k, 0.975);
        double fHigh = FisherSnedecor.InvCDF(2.0 * (k + 1), 2.0 * (n - k), 0.975);
        Assert.Equal(k / (k + ((n - k + 1) * fLow)), lower, 7);
        Assert.Equal((k + 1) * fHigh / (n - k + ((k + 1) * fHigh)), upper, 7);
    }

    [Fact]
    public void The_interval_covers_the_true_yield_at_about_its_stated_rate()
    {
        // Binomial coverage (seeded): draw the passing count of n samples at a known true yield many times and count
        // how often the 95 % interval contains it. Clopper–Pearson is conservative: coverage at least 95 % up to the
        // simulation's own noise (3σ of 2,000 trials ≈ 1.5 %), and not the trivial 100 %.
        var random = new Random(20261202);
        foreach (var (p, n) in new[] { (0.9, 100), (0.99, 1000), (0.995, 2000), (0.95, 400) })
        {
            const int trials = 2000;
            int covered = 0;
            for (int t = 0; t < trials; t++)
            {
                int k = Binomial.Sample(random, p, n);
                var (lower, upper) = ClopperPearson.Interval(k, n, 0.95);
                if (lower <= p && p <= upper)
                {
                    covered++;
                }
            }

            double coverage = (double)covered / trials;
            Assert.InRange(coverage, 0.935, 0.995);
        }
    }

    [Fact]
    public void The_samples_needed_for_a_clean_run_follow_from_the_closed_form_bound()
    {
        // With no failure, n samples show 99 % when 0.025^(1/n) ≥ 0.99, i.e. n ≥ ln(0.025)/ln(0.99) = 367.04.
        Assert.Equal(368, ClopperPearson.SamplesToShow(1.0, 0.99, 0.95));
        Assert.Null(ClopperPearson.SamplesToShow(0.985, 0.99, 0.95));
    }

    [Fact]
    public void A_99_5_percent_design_is_not_shown_against_99_percent_with_1000_samples_and_the_finding_says_how_many_would()
    {
        var report = RuleFixture.Verify(NearFixture, "rule-sets/yield-1000-uniform.yaml");

        var y = Assert.Single(Assert.Single(report.Designs).Yields);
        Assert.Equal(YieldVerdict.NotShown, y.Verdict);
        Assert.Equal(1000, y.Samples);
        Assert.InRange(y.Lower, 0, 0.99);
        Assert.InRange(y.Upper, 0.99, 1);
        Assert.DoesNotContain(report.Findings, f => f.RuleId == "DR402");
        var finding = Assert.Single(report.Findings, f => f.RuleId == "DR406");
        Assert.Equal(Severity.Warning, finding.Severity);
        Assert.Equal(32, finding.Span.Line);
        Assert.NotNull(y.SamplesNeeded);
        Assert.Contains($"set `samples: {y.SamplesNeeded}` under `rule-set: monte-carlo:` in `yield-1000-uniform.yaml`", finding.Message, StringComparison.Ordinal);

        // Asking for that many samples with the same seed: the rate need not hold exactly, but the estimate must be near.
        Assert.InRange(y.SamplesNeeded!.Value, 1000, 200_000);
    }

    [Fact]
    public void The_same_design_meets_99_percent_with_20000_samples_near_its_true_yield()
    {
        var report = DesignCheck.Run([RuleFixture.Path(NearFixture)],
            new CheckOptions(RuleFixture.Path("rule-sets/yield-20000-uniform.yaml"), new DateOnly(2026, 12, 1)));

        var y = Assert.Single(Assert.Single(report.Designs).Yields);
        Assert.Equal(YieldVerdict.Met, y.Verdict);
        Assert.Equal(20000, y.Samples);
        Assert.InRange(y.Lower, 0.99, 1);
        // The observed yield lies within 3σ of the binomial spread around the true yield (σ = √(p(1 − p)/n), textbook);
        // a 95 % interval misses the truth one run in twenty, so the 3σ band is the check that does not depend on luck.
        double sigma = Math.Sqrt(FixtureTrueYield * (1 - FixtureTrueYield) / y.Samples);
        Assert.InRange(y.Yield, FixtureTrueYield - (3 * sigma), FixtureTrueYield + (3 * sigma));
        Assert.DoesNotContain(report.Findings, f => f.RuleId is "DR402" or "DR406");
        var figures = Assert.Single(report.Designs).StageFigures.Single(s => s.Key == "amp").Value;
        Assert.Equal(y.Lower, figures.Single(f => f.Name == "Monte Carlo yield lower bound").Value);
        Assert.Equal(20000, figures.Single(f => f.Name == "Monte Carlo samples").Value);
        var plots = Assert.Single(Assert.Single(report.Designs).Plots);
        Assert.Contains("20,000 samples", plots.Distribution!.Caption, StringComparison.Ordinal);
        Assert.Contains("95 % confidence interval", plots.Distribution.Caption, StringComparison.Ordinal);
    }

    [Fact]
    public void Sequential_sampling_stops_once_decided_and_gives_the_same_verdict_twice()
    {
        var options = new CheckOptions(RuleFixture.Path("rule-sets/yield-sequential-uniform.yaml"), new DateOnly(2026, 12, 1));

        var first = Assert.Single(Assert.Single(DesignCheck.Run([RuleFixture.Path(NearFixture)], options).Designs).Yields);
        var second = Assert.Single(Assert.Single(DesignCheck.Run([RuleFixture.Path(NearFixture)], options).Designs).Yields);

        Assert.Equal(first, second);
        Assert.True(first.Sequential);
        Assert.Equal(YieldVerdict.Met, first.Verdict);
        Assert.Equal(0, first.Samples % 1000);
        Assert.InRange(first.Samples, 2000, 19000);

        // 20 looks at most (20,000 / 1,000): each at the Bonferroni level 1 − 0.05/20.
        Assert.Equal(1 - (0.05 / 20), first.Confidence, 12);
    }

    [Fact]
    public void Every_yield_requirement_of_the_example_repository_is_shown_by_its_samples()
    {
        var root = Path.Combine(RuleFixture.RepositoryRoot(), "example-design");
        var files = DesignRules.Loading.RepositoryFiles.Find([root], out _);
        var report = DesignCheck.Run(files, new CheckOptions(Path.Combine(root, DesignRules.Loading.RuleSetLoader.DefaultFileName), new DateOnly(2026, 12, 1)));

        var yields = report.Designs.SelectMany(d => d.Yields).ToList();
        Assert.NotEmpty(yields);
        Assert.All(yields, y => Assert.True(y.Verdict == YieldVerdict.Met, $"{y.StageId}: {y.Caption}"));
        Assert.DoesNotContain(report.Findings, f => f.RuleId is "DR402" or "DR406");
    }

    [Fact]
    public void The_rule_set_file_reads_the_sequential_switch_and_its_cap_and_refuses_a_cap_below_the_batch()
    {
        var (ruleSet, problems) = DesignRules.Loading.RuleSetLoader.Read("rs.yaml",
            "rule-set:\n  monte-carlo: { samples: 500, sequential: true, max-samples: 8000 }\n");
        Assert.Empty(problems);
        Assert.True(ruleSet.MonteCarlo.Sequential);
        Assert.Equal(8000, ruleSet.MonteCarlo.MaxSamples);

        var (capped, refused) = DesignRules.Loading.RuleSetLoader.Read("rs.yaml",
            "rule-set:\n  monte-carlo: { samples: 500, sequential: true, max-samples: 100 }\n");
        var problem = Assert.Single(refused);
        Assert.Equal("DR905", problem.Id);
        Assert.Equal(500, capped.MonteCarlo.MaxSamples);
    }

    [Fact]
    public void Samples_drawn_in_batches_are_the_samples_of_one_run()
    {
        var settings = new MonteCarloSettings(600, 3, ToleranceDistribution.Uniform);
        var (evaluation, stage) = ToleranceFixture.Load("yield-near-99p5.yaml");
        var worstCase = ToleranceAnalyses.WorstCase(evaluation, stage);

        var whole = MonteCarloYield.Run(worstCase, settings, 0, 600, maxDegreeOfParallelism: 1);
        var batched = MonteCarloYield.Run(worstCase, settings, 0, 250, maxDegreeOfParallelism: 2)
            .Append(MonteCarloYield.Run(worstCase, settings, 250, 350, maxDegreeOfParallelism: -1));

        Assert.Equal(whole.Errors, batched.Errors);
    }
}
