namespace DesignRules.Pages.Tests;

/// <summary>A stage judged against a yield shows the yield with its Clopper–Pearson interval and the sample count.</summary>
public sealed class YieldCaptionTests
{
    [Fact]
    public void The_monte_carlo_histogram_caption_states_the_interval_and_the_samples()
    {
        var (folder, _) = ExamplePages.Render();
        var page = File.ReadAllLines(Path.Combine(folder, "door-impact-peak-hold.md"));

        var image = Array.FindIndex(page, l => l.StartsWith("![Monte Carlo distribution of stage peak-hold]", StringComparison.Ordinal));
        Assert.True(image >= 0, "no Monte Carlo histogram on the page");
        var caption = page[image + 2];

        // 1,000 clean samples: the two-sided 95 % Clopper–Pearson lower bound is 0.025^(1/1000) = 99.63 % (closed form
        // of the Beta(1000, 1) quantile).
        Assert.Equal("*Yield 100 % (1,000 of 1,000 samples, seed 20261202); 95 % confidence interval 99.63 % to 100 % (Clopper–Pearson); required 99 %: met.*", caption);
        Assert.Contains(page, l => l == "| Monte Carlo yield lower bound | 99.63 % | — | — | `yield.lower` |");
        Assert.Contains(page, l => l == "| Monte Carlo samples | 1000 | — | — | `yield.samples` |");
    }
}

/// <summary>A yield requirement the samples neither show nor refute reads "not shown" on the page, not "met" or "not met".</summary>
public sealed class YieldNotShownPageTests
{
    [Fact]
    public void A_requirement_the_samples_cannot_decide_is_marked_not_shown()
    {
        // The rules' fixture whose true yield is 99.51 % (by formula, see its header) against 99 %, with 1,000 samples.
        var fixtures = Path.Combine(ExamplePages.RepositoryRoot(), "tests", "DesignRules.Rules.Tests", "Fixtures");
        var report = DesignRules.Rules.DesignCheck.Run(
            [Path.Combine(fixtures, "tolerance", "yield-near-99p5.yaml")],
            new DesignRules.Rules.CheckOptions(Path.Combine(fixtures, "rule-sets", "yield-1000-uniform.yaml"), new DateOnly(2026, 12, 1)));
        var folder = Path.Combine(Path.GetTempPath(), "designrules-pages-" + Guid.NewGuid().ToString("N"));

        var result = DatasheetPages.Write(report, new PageOptions(folder, null, ExamplePages.RepositoryRoot()));

        Assert.Empty(result.Diagnostics);
        var page = File.ReadAllLines(Path.Combine(folder, "yield-near-99p5.md"));
        Assert.Contains(page, l => l == "| amp | yield | 99 % | not shown (DR406) |");
        Assert.Contains(page, l => l.StartsWith("*Yield ", StringComparison.Ordinal) && l.EndsWith("required 99 %: not shown.*", StringComparison.Ordinal));
    }
}
