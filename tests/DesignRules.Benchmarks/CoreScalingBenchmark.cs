using System.Diagnostics;
using System.Globalization;
using BenchmarkDotNet.Attributes;
using BenchmarkDotNet.Configs;
using BenchmarkDotNet.Engines;
using BenchmarkDotNet.Jobs;
using BenchmarkDotNet.Toolchains.InProcess.Emit;

namespace DesignRules.Benchmarks;

/// <summary>
/// Does a full check run designs and samples side by side: whole-process <c>designrules check</c> runs of a synthetic
/// repository (no cache) started on one core and on two (<c>taskset</c>), as a CI runner with one or two cores would run
/// them. A process started on one core sees one processor from its first instruction, so the runtime's thread pool and
/// every <c>Parallel</c> loop size themselves as they would there — which changing the affinity of a running benchmark
/// process (<c>--affinity</c> with <c>--inProcess</c>) does not give. The ratio column is the answer (issue 16 asks two
/// cores to be at least 1.7× faster, a ratio of at most 0.59).
/// <para>
/// <c>DESIGNRULES_CORES_DESIGNS</c>: the number of designs (default 100; 500 takes about 2.5 min per two-core run). The
/// command-line tool is published in Release once per benchmark process, into <c>$TMPDIR/designrules-corebench/</c>,
/// with the repository.
/// </para>
/// </summary>
[Config(typeof(ProcessConfig))]
public class CoreScalingBenchmark
{
    /// <summary>
    /// One run per operation (a full check is tens of seconds to minutes long), no warm-up (each run is a fresh process,
    /// so there is nothing to warm), in the benchmark's own process: what is timed is a child process.
    /// </summary>
    private sealed class ProcessConfig : ManualConfig
    {
        public ProcessConfig() => AddJob(Job.Default
            .WithStrategy(RunStrategy.Monitoring).WithLaunchCount(1).WithWarmupCount(0).WithIterationCount(3).WithInvocationCount(1)
            .WithToolchain(new InProcessEmitToolchain(TimeSpan.FromHours(3), logOutput: true)));
    }

    private static readonly TimeSpan Limit = TimeSpan.FromMinutes(30);
    private string work = null!;
    private string root = null!;
    private string tool = null!;

    [GlobalSetup]
    public void Setup()
    {
        if (!File.Exists("/usr/bin/taskset") && !File.Exists("/bin/taskset"))
        {
            throw new PlatformNotSupportedException("CoreScalingBenchmark starts the check on chosen cores with taskset (Linux util-linux).");
        }

        if (Environment.ProcessorCount < 2)
        {
            throw new PlatformNotSupportedException("CoreScalingBenchmark needs a machine with at least two cores.");
        }

        int designs = int.Parse(Environment.GetEnvironmentVariable("DESIGNRULES_CORES_DESIGNS") ?? "100", CultureInfo.InvariantCulture);
        work = Path.Combine(Path.GetTempPath(), "designrules-corebench");
        Directory.CreateDirectory(work);
        root = Path.Combine(work, $"synthetic-{designs}");
        if (!Directory.Exists(root))
        {
            Directory.Move(SyntheticRepository.Write(designs), root);
        }

        // The tool as a user runs it: Release, published (never timed).
        var publish = Path.Combine(work, "cli");
        Run("dotnet", ["publish", Path.Combine(SyntheticRepository.RepositoryRoot, "src", "DesignRules.Cli"), "-c", "Release", "-o", publish, "-v:q", "-nologo"], null);
        tool = Path.Combine(publish, "designrules.dll");
    }

    [Benchmark(Baseline = true, Description = "full check, one core")]
    public int OneCore() => Check("0");

    [Benchmark(Description = "full check, two cores")]
    public int TwoCores() => Check("0,1");

    private int Check(string cores)
    {
        var output = Path.Combine(work, "out-" + cores.Replace(',', '-'));
        if (Directory.Exists(output))
        {
            Directory.Delete(output, recursive: true);
        }

        // No --cache: every design is evaluated, as on a first build.
        return Run("taskset", ["-c", cores, "dotnet", tool, "check", root, "--root", root, "--json", Path.Combine(output, "report.json"), "--pages", Path.Combine(output, "pages"), "--today", "2026-12-01"], root);
    }

    private static int Run(string file, IReadOnlyList<string> arguments, string? directory)
    {
        var (exitCode, output, error) = ChildProcess.Run(file, arguments, directory, Limit);

        // The check's exit codes: 0 clean, 1 findings at error level; anything else is a failed run, not a timing.
        if (exitCode > 1)
        {
            throw new InvalidOperationException($"{file} {string.Join(' ', arguments)} failed ({exitCode}):\n{output}\n{error}");
        }

        return exitCode;
    }
}
