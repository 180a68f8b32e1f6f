using System.Diagnostics;
using System.Globalization;
using DesignRules.Elaboration;
using DesignRules.Loading;
using DesignRules.Rules;
using DesignRules.Simulation;

namespace DesignRules.Benchmarks;

/// <summary>
/// The check of one design repeated in this process: <c>dotnet run -c Release --project tests/DesignRules.Benchmarks --
/// design-loop REPOSITORY DESIGN-FILE [RUNS]</c> checks the design with every parts file and the rule set of the repository
/// RUNS times (default 10) and prints, for each run, the processor time of the whole process over the check (every
/// thread: the corner runs and band ends run side by side), its wall time and the bytes it allocated. Processor time
/// depends far less on what else the machine runs than wall time does, so it is the figure to compare a kernel change
/// by (alternately before and after). Not a BenchmarkDotNet case: the first run is cold (JIT), the later ones warm.
/// With <c>transient</c> after RUNS, each run is instead ten transients of the design's chain (top band end, the default
/// window; ten, as the process's processor time advances in clock ticks of 10 ms) on this thread alone: the engine's
/// kernel without the check's other work and without its parallel runs.
/// </summary>
internal static class OneDesignLoop
{
    public static void Run(string[] args)
    {
        CultureInfo.DefaultThreadCurrentCulture = CultureInfo.InvariantCulture;
        CultureInfo.CurrentCulture = CultureInfo.InvariantCulture;
        var root = Path.GetFullPath(args[0]);
        var design = Path.GetFullPath(args[1]);
        var runs = args.Length > 2 ? int.Parse(args[2], CultureInfo.InvariantCulture) : 10;
        var designs = Path.Combine(root, "designs") + Path.DirectorySeparatorChar;
        var files = RepositoryFiles.Find([root], out _)
            .Where(f => !Path.GetFullPath(f).StartsWith(designs, StringComparison.Ordinal) || Path.GetFullPath(f) == design)
            .ToList();
        var ruleSet = Path.Combine(root, RuleSetLoader.DefaultFileName);
        // DESIGNRULES_THREADS=1 checks on one thread, as the build's head start does while the build restores.
        var threads = int.TryParse(Environment.GetEnvironmentVariable("DESIGNRULES_THREADS"), NumberStyles.None, CultureInfo.InvariantCulture, out var t) ? t : -1;
        var options = new CheckOptions(File.Exists(ruleSet) ? ruleSet : null, new DateOnly(2026, 12, 1)) { MaxDegreeOfParallelism = threads };
        var transient = args.Length > 3 && args[3] == "transient";
        ElaboratedChain? chain = null;
        if (transient)
        {
            var loaded = DesignLoader.LoadFiles(files);
            chain = ChainElaborator.Elaborate(loaded.Designs.Single());
            if (!chain.Succeeded)
            {
                throw new InvalidOperationException(string.Join("\n", chain.Problems));
            }
        }

        using var process = Process.GetCurrentProcess();
        var warm = new List<double>();
        for (var run = 0; run < runs; run++)
        {
            process.Refresh();
            var cpu = process.TotalProcessorTime;
            var allocated = GC.GetTotalAllocatedBytes(precise: true);
            var wall = Stopwatch.StartNew();
            string what;
            if (chain is not null)
            {
                TransientResult result = null!;
                for (var repeat = 0; repeat < 10; repeat++)
                {
                    result = Simulate.Transient(chain.Circuit, chain.Window.ToOptions());
                    if (!result.Succeeded)
                    {
                        throw new InvalidOperationException(result.Failure!.ToString());
                    }
                }

                what = FormattableString.Invariant($"points {result.Time.Count}, iterations {result.Statistics.NewtonIterations}");
            }
            else
            {
                var report = DesignCheck.Run(files, options);
                if (report.Designs.Count != 1)
                {
                    throw new InvalidOperationException("not one design checked");
                }

                what = FormattableString.Invariant($"findings {report.Findings.Count}");
            }

            wall.Stop();
            process.Refresh();
            var used = (process.TotalProcessorTime - cpu).TotalMilliseconds;

            if (run > 0)
            {
                warm.Add(used);
            }

            Console.WriteLine(FormattableString.Invariant(
                $"run {run}: processor {used:F0} ms, wall {wall.Elapsed.TotalMilliseconds:F0} ms, allocated {(GC.GetTotalAllocatedBytes(precise: true) - allocated) / 1e6:F1} MB, {what}"));
        }

        if (warm.Count > 0)
        {
            warm.Sort();
            Console.WriteLine(FormattableString.Invariant($"warm runs {warm.Count}: processor median {warm[warm.Count / 2]:F0} ms, min {warm[0]:F0} ms"));
        }
    }
}
