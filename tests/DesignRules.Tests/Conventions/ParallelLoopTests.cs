using System.Text.RegularExpressions;
using DesignRules.Tests.Loading;

namespace DesignRules.Tests.Conventions;

/// <summary>
/// Every parallel loop of the check (the engine, the figures, the rules and the run layer) names the scheduler it was
/// called on: a loop whose options name none runs on the default scheduler whatever its caller runs on, and would escape
/// the gate a build's head start runs its check behind (one thread while the build restores). The pages, which a head
/// start never writes, are not held to it.
/// </summary>
public sealed partial class ParallelLoopTests
{
    [Fact]
    public void Every_parallel_loop_of_the_check_runs_on_the_scheduler_it_was_called_on()
    {
        var root = FixtureFiles.RepositoryRoot();
        var offenders = new List<string>();
        foreach (var project in new[] { "DesignRules.Simulation", "DesignRules.Elaboration", "DesignRules.Figures", "DesignRules.Rules", "DesignRules.Run" })
        {
            foreach (var source in Directory.EnumerateFiles(Path.Combine(root, "src", project), "*.cs", SearchOption.AllDirectories).Order(StringComparer.Ordinal))
            {
                var lines = File.ReadAllLines(source);
                for (int i = 0; i < lines.Length; i++)
                {
                    // A loop's options are on its own line (new ParallelOptions { … } or a property that makes them).
                    if (ParallelCall().IsMatch(lines[i]) && !lines[i].Contains("TaskScheduler = TaskScheduler.Current", StringComparison.Ordinal)
                        && !lines[i].Contains("Parallelism", StringComparison.Ordinal) && !lines[i].Contains("parallelism", StringComparison.Ordinal))
                    {
                        offenders.Add($"{Path.GetRelativePath(root, source)}({i + 1}): {lines[i].Trim()}");
                    }

                    if (lines[i].Contains("new ParallelOptions", StringComparison.Ordinal) && !lines[i].Contains("TaskScheduler = TaskScheduler.Current", StringComparison.Ordinal))
                    {
                        offenders.Add($"{Path.GetRelativePath(root, source)}({i + 1}): {lines[i].Trim()}");
                    }
                }
            }
        }

        Assert.True(offenders.Count == 0, "parallel loops that name no scheduler:\n" + string.Join("\n", offenders.Distinct()));
    }

    [GeneratedRegex(@"\bParallel\.(For|ForEach|Invoke)\(")]
    private static partial Regex ParallelCall();
}
