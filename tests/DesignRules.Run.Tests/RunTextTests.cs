using DesignRules.Rules;

namespace DesignRules.Run.Tests;

public sealed class RunTextTests
{
    [Fact]
    public void The_fault_sentence_comes_from_the_catalogue_entry_of_DR990()
    {
        var text = RunText.Fault(new InvalidOperationException("a table lost its row."));
        var format = DesignRules.Diagnostics.RuleCatalogue.Default[RunText.FaultId].MessageFormat;
        Assert.StartsWith(format[..format.IndexOf('{', StringComparison.Ordinal)], text, StringComparison.Ordinal);
        Assert.Contains("InvalidOperationException: a table lost its row", text, StringComparison.Ordinal);
        Assert.Contains("fault of the tool", text, StringComparison.Ordinal);
    }

    [Fact]
    public void Progress_names_the_design_by_its_repository_path_and_says_when_it_came_from_the_cache()
    {
        var fresh = new DesignProgress("/repo/designs/a.yaml", "a", 1, 2, TimeSpan.FromSeconds(0.426));
        Assert.Equal("checked designs/a.yaml (a): 1 error(s), 2 warning(s), 0.43 s", RunText.Progress(fresh, "/repo"));
        Assert.Equal("checked designs/a.yaml (a): 1 error(s), 2 warning(s), unchanged, from the results cache",
            RunText.Progress(fresh with { FromStore = true }, "/repo"));
        Assert.Equal("checked designs/a.yaml (a): 1 error(s), 2 warning(s), evaluated by the head start, from the results cache",
            RunText.Progress(fresh with { FromStore = true, JustEvaluated = true }, "/repo"));
    }

    [Fact]
    public void A_long_run_says_it_is_still_going_and_a_short_one_says_nothing()
    {
        var heard = new Heard();
        using (var watch = new LongRunWatch(heard, TimeSpan.Zero, Timeout.InfiniteTimeSpan))
        {
            watch.DesignsLoaded(3);
            Assert.True(heard.Signal.Wait(TimeSpan.FromSeconds(30)), "a run past its first notice says so");
        }

        Assert.StartsWith("still checking: 0 of 3 design(s) done after ", heard.Lines.Single(), StringComparison.Ordinal);

        var quiet = new Heard();
        using (var watch = new LongRunWatch(quiet))
        {
            watch.DesignsLoaded(1);
            watch.DesignChecked(new DesignProgress("/repo/designs/a.yaml", "a", 0, 0, TimeSpan.FromSeconds(0.2)) { Completed = 1, Total = 1 });
        }

        Assert.Empty(quiet.Lines);
        Assert.Equal(1, quiet.Designs);
    }

    private sealed class Heard : IRunProgress
    {
        public List<string> Lines { get; } = [];

        public int Designs { get; private set; }

        public ManualResetEventSlim Signal { get; } = new();

        public void DesignChecked(DesignProgress progress) => Designs++;

        public void StillRunning(int completed, int total, TimeSpan elapsed)
        {
            Lines.Add(RunText.StillRunning(completed, total, elapsed));
            Signal.Set();
        }
    }
}
