using System.Reflection;
using DesignRules.Rules;

namespace DesignRules.Run.Tests;

/// <summary>
/// A throwaway copy of example-design with a small Monte Carlo count (the cache is about which designs are evaluated,
/// not about their figures), run through the run layer with a results cache, recording which designs were evaluated.
/// </summary>
internal sealed class ExampleCopy : IDisposable
{
    public ExampleCopy()
    {
        Root = Path.Combine(Path.GetTempPath(), $"designrules-run-{Guid.NewGuid():N}");
        foreach (var file in Directory.EnumerateFiles(Path.Combine(RepositoryRoot, "example-design"), "*.yaml", SearchOption.AllDirectories)
                     .Where(f => !f.Contains("design-pages", StringComparison.Ordinal)))
        {
            var target = Path.Combine(Root, Path.GetRelativePath(Path.Combine(RepositoryRoot, "example-design"), file));
            Directory.CreateDirectory(Path.GetDirectoryName(target)!);
            File.Copy(file, target);
        }

        File.WriteAllText(RuleSet, RuleSetText("note"));
    }

    public string Root { get; }

    public string RuleSet => Path.Combine(Root, RepositoryConventions.RuleSetFileName);

    public string Cache => Path.Combine(Root, "obj", "cache");

    public string Pages => Path.Combine(Root, "design-pages");

    public string Json => Path.Combine(Root, "out", "report.json");

    public static string RepositoryRoot =>
        typeof(ExampleCopy).Assembly.GetCustomAttributes<AssemblyMetadataAttribute>().Single(a => a.Key == "RepositoryRoot").Value!;

    /// <summary>A rule set with one section for the motor monitor whose DR303 level is <paramref name="motorLevel"/>.</summary>
    public static string RuleSetText(string motorLevel) =>
        "rule-set:\n  monte-carlo: { samples: 20, seed: 7, distribution: normal }\nrules:\n  DR301: { derating: 70% }\n" +
        $"designs:\n  motor-current-monitor:\n    rules: {{ DR303: {{ severity: {motorLevel} }} }}\n";

    public string Design(string id) => Directory.GetFiles(Path.Combine(Root, "designs"), id + ".yaml").Single();

    /// <summary>Runs the check with the cache, pages and JSON; returns the outcome and the ids of the designs evaluated (not from the cache).</summary>
    public (RunOutcome Outcome, IReadOnlyList<string> Evaluated) Run(string? toolIdentity = null) => Run(toolIdentity, cacheOnly: false, out _);

    /// <summary>
    /// As <see cref="Run(string?)"/>; <paramref name="cacheOnly"/> writes only the cache (no pages, no JSON, as a build's
    /// head start runs), and <paramref name="justEvaluated"/> lists the designs read from the cache because another run
    /// had just evaluated them.
    /// </summary>
    public (RunOutcome Outcome, IReadOnlyList<string> Evaluated) Run(string? toolIdentity, bool cacheOnly, out IReadOnlyList<string> justEvaluated)
    {
        var files = DesignRules.Loading.RepositoryFiles.Find([Root], out _);
        var request = new RunRequest(files, Root, new DateOnly(2026, 12, 1))
        {
            RuleSetFile = RuleSet,
            ReportRoot = Root,
            JsonFile = cacheOnly ? null : Json,
            PagesFolder = cacheOnly ? null : Pages,
            CacheFolder = Cache,
            ToolIdentityOverride = toolIdentity,
            HeadStart = cacheOnly,
        };
        var progress = new Recorder();
        var outcome = DesignRun.Execute(request, progress);
        Assert.True(outcome.Fault is null, outcome.FaultDetail);
        justEvaluated = progress.JustEvaluated;
        return (outcome, progress.Evaluated.Order(StringComparer.Ordinal).ToList());
    }

    public void Dispose() => Directory.Delete(Root, recursive: true);

    private sealed class Recorder : IRunProgress
    {
        public List<string> Evaluated { get; } = [];

        public List<string> JustEvaluated { get; } = [];

        public void DesignChecked(DesignProgress progress)
        {
            if (!progress.FromStore)
            {
                Evaluated.Add(progress.DesignId);
            }
            else if (progress.JustEvaluated)
            {
                JustEvaluated.Add(progress.DesignId);
            }
        }

        public void StillRunning(int completed, int total, TimeSpan elapsed)
        {
        }
    }
}
