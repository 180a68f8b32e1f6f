namespace DesignRules.Rules.Tests.Hygiene;

/// <summary>DR940: a check that finds no design is an error naming what was searched, not an empty pass.</summary>
public sealed class NoDesignFoundTests
{
    [Fact]
    public void No_design_among_the_files_is_an_error_at_the_searched_location_naming_the_patterns()
    {
        var search = new DesignSearch("/repo/hardware.proj", "designs/**/*.yaml and designs/**/*.yml below /repo");
        var report = DesignCheck.Run([], new CheckOptions(null, new DateOnly(2026, 12, 1)) { Search = search });
        var finding = Assert.Single(report.Findings);
        Assert.Equal(("DR940", DesignRules.Diagnostics.Severity.Error, "/repo/hardware.proj"), (finding.RuleId, finding.Severity, finding.Span.File));
        Assert.Contains("designs/**/*.yml below /repo", finding.Message, StringComparison.Ordinal);
        Assert.Equal(1, report.ErrorCount);
    }

    [Fact]
    public void A_design_file_that_fails_to_load_was_found_and_is_not_reported_as_missing()
    {
        var file = Path.Combine(Path.GetTempPath(), $"drb-{Guid.NewGuid():N}.yaml");
        File.WriteAllText(file, File.ReadAllText(RuleFixture.Path("reference/b/netlist-non-inverting-gain-11.yaml"))
            .Replace("decompensated-wideband-15v", "no-such-amplifier", StringComparison.Ordinal));
        try
        {
            var report = DesignCheck.Run([file], new CheckOptions(null, new DateOnly(2026, 12, 1)) { Search = new DesignSearch("/repo", "anything") });
            Assert.Contains(report.Findings, f => f.RuleId == "DR906");
            Assert.DoesNotContain(report.Findings, f => f.RuleId == "DR940");
        }
        finally
        {
            File.Delete(file);
        }
    }

    [Fact]
    public void A_design_that_loads_is_not_reported_as_missing()
    {
        var search = new DesignSearch("/repo", "anything");
        var report = DesignCheck.Run([RuleFixture.Path("reference/b/netlist-non-inverting-gain-11.yaml")],
            new CheckOptions(null, new DateOnly(2026, 12, 1)) { Search = search });
        Assert.DoesNotContain(report.Findings, f => f.RuleId == "DR940");
    }
}

/// <summary>DR925: a transient that cannot reach its periodic steady state within the bounds is said to be unsettled.</summary>
public sealed class UnsettledTransientTests
{
    [Fact]
    public void An_average_ten_thousand_periods_slow_is_reported_unsettled_and_not_judged()
    {
        var report = DesignCheck.Run([RuleFixture.Path("reference/b/unsettled-very-slow-average.yaml")], new CheckOptions(null, new DateOnly(2026, 12, 1)));
        var finding = Assert.Single(report.Findings, f => f.RuleId == "DR925");
        Assert.Equal(DesignRules.Diagnostics.Severity.Error, finding.Severity);
        Assert.Contains("`average.out`", finding.Message, StringComparison.Ordinal);

        // No rule judged the unsettled signal: no averaged level was recorded, and no transient plot was drawn.
        var figures = report.Designs.Single().StageFigures.Single(s => s.Key == "average").Value;
        Assert.DoesNotContain(figures, f => f.Name == "averaged level");
        Assert.All(report.Designs.Single().Plots, p => Assert.Null(p.Transient));
    }
}
