namespace DesignRules.Pages.Tests;

/// <summary>
/// Issue 14 point 4: a design with an operating range shows, in its key figures, the temperature at which each worst-case
/// figure is worst; a design at 25 °C only keeps the table without that column.
/// </summary>
public sealed class TemperatureColumnTests
{
    [Fact]
    public void The_key_figures_name_the_worst_end_of_the_operating_range()
    {
        var page = Render("drift-hot-end-fails");

        Assert.Contains(page, l => l == "| Figure | Value | Limit | Margin | Worst at | Key |");
        // The offset's extreme grows with |T − 25 °C| (Vos,max + TCVos·|ΔT|), so 85 °C, 60 °C from 25 °C, is worse than 0 °C.
        Assert.Contains(page, l => l.StartsWith("| worst-case transfer error |", StringComparison.Ordinal) && l.Contains("| 85 °C |", StringComparison.Ordinal));
        Assert.Contains(page, l => l.StartsWith("| worst-case temperature of the transfer | 85 °C |", StringComparison.Ordinal));
    }

    [Fact]
    public void A_design_at_25_C_only_has_no_temperature_column()
    {
        var page = Render("drift-at-25-only-passes");

        Assert.Contains(page, l => l == "| Figure | Value | Limit | Margin | Key |");
        Assert.DoesNotContain(page, l => l.Contains("Worst at", StringComparison.Ordinal));
    }

    private static string[] Render(string name)
    {
        var fixtures = Path.Combine(ExamplePages.RepositoryRoot(), "tests", "DesignRules.Rules.Tests", "Fixtures");
        var report = DesignRules.Rules.DesignCheck.Run(
            [Path.Combine(fixtures, "tolerance", name + ".yaml")],
            new DesignRules.Rules.CheckOptions(null, new DateOnly(2026, 12, 1)));
        var folder = Path.Combine(Path.GetTempPath(), "designrules-pages-" + Guid.NewGuid().ToString("N"));
        try
        {
            var result = DatasheetPages.Write(report, new PageOptions(folder, null, ExamplePages.RepositoryRoot()));
            Assert.Empty(result.Diagnostics);
            return File.ReadAllLines(Path.Combine(folder, name + ".md"));
        }
        finally
        {
            if (Directory.Exists(folder)) Directory.Delete(folder, recursive: true);
        }
    }
}
