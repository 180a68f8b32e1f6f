namespace DesignRules.Pages.Tests;

/// <summary>A stage that states a noise requirement gets a noise-density plot with each contributor and a contributor table.</summary>
public sealed class NoisePageTests
{
    private static (string Folder, PageResult Result) Render()
    {
        var fixtures = Path.Combine(ExamplePages.RepositoryRoot(), "tests", "DesignRules.Rules.Tests", "Fixtures");
        var report = DesignRules.Rules.DesignCheck.Run([Path.Combine(fixtures, "noise", "inverting-snr-met.yaml")], new DesignRules.Rules.CheckOptions(null, new DateOnly(2026, 12, 1)));
        var folder = Path.Combine(Path.GetTempPath(), "designrules-pages-" + Guid.NewGuid().ToString("N"));
        return (folder, DatasheetPages.Write(report, new PageOptions(folder, null, ExamplePages.RepositoryRoot())));
    }

    [Fact]
    public void The_noise_section_shows_the_plot_and_the_largest_contributors_with_their_shares()
    {
        var (folder, result) = Render();
        Assert.Empty(result.Diagnostics);
        var page = File.ReadAllLines(Path.Combine(folder, "inverting-snr-met.md"));

        int heading = Array.IndexOf(page, "### Noise");
        Assert.True(heading >= 0, "no noise section");
        Assert.Equal("![Output noise density of stage amp, total and each contributor](plots/inverting-snr-met/amp-noise.svg)", page[heading + 2]);
        Assert.Equal("| Contributor | Source | RMS at the output | Share of the noise power |", page[heading + 4]);

        // The amplifier's 11·e_n dominates (about 73 % of the power by the textbook sum in the rules' fixture test), then
        // 10·√(4kT·rin), then √(4kT·rf).
        Assert.StartsWith("| `amp.u1` | voltage noise e\\_n |", page[heading + 6], StringComparison.Ordinal);
        Assert.StartsWith("| `amp.rin` | thermal 4kTR |", page[heading + 7], StringComparison.Ordinal);
        Assert.StartsWith("| `amp.rf` | thermal 4kTR |", page[heading + 8], StringComparison.Ordinal);
        Assert.Contains(page.Skip(heading), l => l == "| total | | 36.9 µV | 100 % |");
        Assert.Contains(page, l => l.StartsWith("| amp | snr | at least 60 dB |", StringComparison.Ordinal));
    }

    [Fact]
    public void The_noise_plot_draws_the_total_and_each_large_contributor_and_is_the_same_bytes_every_time()
    {
        var (first, _) = Render();
        var (second, _) = Render();
        var svg = File.ReadAllText(Path.Combine(first, "plots", "inverting-snr-met", "amp-noise.svg"));
        Assert.Contains(">total<", svg, StringComparison.Ordinal);
        Assert.Contains("amp.u1 voltage noise e_n", svg, StringComparison.Ordinal);
        Assert.Contains("amp.rin thermal 4kTR", svg, StringComparison.Ordinal);
        Assert.Equal(svg, File.ReadAllText(Path.Combine(second, "plots", "inverting-snr-met", "amp-noise.svg")));
    }
}
