using System.Diagnostics;
using System.Globalization;
using DesignRules.Loading;
using DesignRules.Run;

namespace DesignRules.Benchmarks;

/// <summary>
/// The warm evaluation server's run, repeated in one process the way the server repeats it: <c>dotnet run -c Release
/// --project tests/DesignRules.Benchmarks -- served-loop REPOSITORY [RUNS [unchanged]]</c> touches the repository's first design
/// (a comment line, as the package benchmark does) and hands the run layer the call the MSBuild task would send (default
/// items, pages on, results cache under <c>obj/</c>), RUNS times (default 8), printing the run's own account of each run.
/// Not a BenchmarkDotNet case: what it shows is the phase split of one warm run and whether it settles, for finding
/// where the run goes; the figures of record come from <see cref="PackageBuildBenchmark"/> with the packed server.
/// A repository without a results cache yet gets its full check first (untimed, not printed). With
/// <c>DESIGNRULES_LOOP_HEADSTART=1</c> each timed run follows an untimed head start, as a build's check follows the one
/// handed over while the build restores.
/// </summary>
internal static class ServedRunLoop
{
    public static void Run(string[] args)
    {
        CultureInfo.DefaultThreadCurrentCulture = CultureInfo.InvariantCulture;
        CultureInfo.CurrentCulture = CultureInfo.InvariantCulture;
        AppContext.SetSwitch("DesignRules.KeepParsedFiles", true);
        var root = Path.GetFullPath(args[0]);
        var runs = args.Length > 1 ? int.Parse(args[1], CultureInfo.InvariantCulture) : 8;
        // `unchanged` as a third argument: no design touched, so every run is what a run costs beyond the edited design.
        var edit = args.Length < 3 || args[2] != "unchanged";
        var files = RepositoryFiles.Find([root], out _).ToList();
        // The package benchmark's repository keeps the check's state where its project's build put it (obj/Debug/net10.0/).
        var state = Directory.Exists(Path.Combine(root, "obj"))
            ? Directory.EnumerateDirectories(Path.Combine(root, "obj"), "designrules", SearchOption.AllDirectories).FirstOrDefault() ?? Path.Combine(root, "obj", "designrules")
            : Path.Combine(root, "obj", "designrules");
        var call = new BuildCall
        {
            Files = files,
            RepositoryRoot = root,
            RuleSetFile = File.Exists(Path.Combine(root, "design-rules.yaml")) ? Path.Combine(root, "design-rules.yaml") : null,
            PagesFolder = Path.Combine(root, "design-pages"),
            StampFile = Path.Combine(state, "check.stamp"),
            LoadedFilesFile = Path.Combine(state, "loaded.files"),
            ProjectFile = Path.Combine(root, "hardware.proj"),
            TaskProjectFile = Path.Combine(root, "hardware.proj"),
            Searched = "designs/**/*.yaml below " + root,
            Today = "2026-12-01",
            CacheFolder = Path.Combine(state, "cache"),
        };
        // DESIGNRULES_LOOP_HEADSTART=1: before each timed run, the build's head start (untimed), as the task hands it over.
        var headStart = Environment.GetEnvironmentVariable("DESIGNRULES_LOOP_HEADSTART") == "1";
        // DESIGNRULES_LOOP_ALLOCATIONS=1: the runtime's allocation samples (one per ~100 KB) by type, for the last run.
        using var allocations = Environment.GetEnvironmentVariable("DESIGNRULES_LOOP_ALLOCATIONS") == "1" ? new AllocationSamples() : null;
        // DESIGNRULES_LOOP_IDENTITY=FILE: the run layer called directly with the tool identity in FILE (written by the first
        // such loop), so that a changed tool keeps reading the results cache of the build it was measured with: only for
        // timing a change that keeps every result, never for checking results.
        var identityFile = Environment.GetEnvironmentVariable("DESIGNRULES_LOOP_IDENTITY");
        string? identity = null;
        RunRequest? request = null;
        if (identityFile is not null)
        {
            if (!File.Exists(identityFile))
            {
                File.WriteAllText(identityFile, ToolIdentity.Text);
            }

            identity = File.ReadAllText(identityFile);
            request = RunRequest.FromBuild(new BuildInputs(files)
            {
                RepositoryRoot = call.RepositoryRoot,
                RuleSetFile = call.RuleSetFile,
                PagesFolder = call.PagesFolder,
                Searched = call.Searched,
                ProjectFile = call.ProjectFile,
                Today = call.Today,
                CacheFolder = call.CacheFolder,
            }).Request;
        }

        for (var run = 0; run <= runs; run++)
        {
            allocations?.Clear();
            if (run > 0 && edit)
            {
                SyntheticRepository.TouchOne(root, run + (Environment.ProcessId * 1000));
            }

            var headStartLine = string.Empty;
            if (headStart)
            {
                // As the task hands it over while the build restores (CheckDesigns.HandOver: no reports, pages or stamp), apart from the run timed below:
                // that is then the build's own check, which takes the head start's check when nothing is in doubt.
                var (headProcessor, headStarted) = (Process.GetCurrentProcess().TotalProcessorTime, Stopwatch.GetTimestamp());
                BuildCheck.Execute(call with
                {
                    SarifFile = null, JsonFile = null, PagesFolder = null, StampFile = null, LoadedFilesFile = null, BaselineFile = null, NewOnly = false, HeadStart = true,
                }, new Collecting(), hostAsError: null);
                headStartLine = string.Create(CultureInfo.InvariantCulture,
                    $" | head start {Stopwatch.GetElapsedTime(headStarted).TotalSeconds:0.000} s (cpu {(Process.GetCurrentProcess().TotalProcessorTime - headProcessor).TotalSeconds:0.00} s)");
            }

            var log = new Collecting();
            var (gen0, gen1, gen2) = (GC.CollectionCount(0), GC.CollectionCount(1), GC.CollectionCount(2));
            var (paused, allocated) = (GC.GetTotalPauseDuration(), GC.GetTotalAllocatedBytes());
            var (jitted, jitTime) = (System.Runtime.JitInfo.GetCompiledMethodCount(), System.Runtime.JitInfo.GetCompilationTime());
            var processor = Process.GetCurrentProcess().TotalProcessorTime;
            var started = Stopwatch.GetTimestamp();
            string line;
            if (identity is null)
            {
                BuildCheck.Execute(call, log, hostAsError: null);
                line = log.Entries.FirstOrDefault(e => e.Message.StartsWith("DesignRules: run took", StringComparison.Ordinal))?.Message.Split("; meanwhile")[0] ?? "(no run line)";
                line += log.Entries.Any(e => e.Message.Contains("head start's check of the same files was taken", StringComparison.Ordinal)) ? " [head start's check taken]" : string.Empty;
            }
            else
            {
                var outcome = DesignRun.Execute(request! with { ToolIdentityOverride = identity });
                line = outcome.Fault ?? $"{outcome.Report.WarningCount} warning(s), {outcome.FromCache} from the cache | {outcome.Timings}";
            }

            var took = Stopwatch.GetElapsedTime(started);
            processor = Process.GetCurrentProcess().TotalProcessorTime - processor;
            var collections = $"GC {GC.CollectionCount(0) - gen0}/{GC.CollectionCount(1) - gen1}/{GC.CollectionCount(2) - gen2} paused {(GC.GetTotalPauseDuration() - paused).TotalMilliseconds:0} ms, {(GC.GetTotalAllocatedBytes() - allocated) / 1e6:0} MB";
            var jit = $"jit {System.Runtime.JitInfo.GetCompiledMethodCount() - jitted} in {(System.Runtime.JitInfo.GetCompilationTime() - jitTime).TotalSeconds:0.00} s";
            Console.WriteLine(string.Create(CultureInfo.InvariantCulture,
                $"{run}: {took.TotalSeconds:0.000} s (cpu {processor.TotalSeconds:0.00} s), {collections}, {jit} | {line}{headStartLine}"));
        }
    }

    /// <summary>The runtime's allocation-tick events (about one per 100 KB allocated), counted by type name.</summary>
    private sealed class AllocationSamples : System.Diagnostics.Tracing.EventListener
    {
        private readonly Dictionary<string, long> bytes = new(StringComparer.Ordinal);
        private readonly Lock gate = new();

        public AllocationSamples() => AppDomain.CurrentDomain.ProcessExit += (_, _) => Print();

        public void Clear()
        {
            lock (gate)
            {
                bytes.Clear();
            }
        }

        public override void Dispose()
        {
            Print();
            base.Dispose();
        }

        private void Print()
        {
            lock (gate)
            {
                foreach (var (type, size) in bytes.OrderByDescending(b => b.Value).Take(40))
                {
                    Console.WriteLine(string.Create(CultureInfo.InvariantCulture, $"  {size / 1e6,8:0.0} MB  {type}"));
                }

                bytes.Clear();
            }
        }

        protected override void OnEventSourceCreated(System.Diagnostics.Tracing.EventSource eventSource)
        {
            if (eventSource.Name == "Microsoft-Windows-DotNETRuntime")
            {
                EnableEvents(eventSource, System.Diagnostics.Tracing.EventLevel.Verbose, (System.Diagnostics.Tracing.EventKeywords)0x1);
            }
        }

        protected override void OnEventWritten(System.Diagnostics.Tracing.EventWrittenEventArgs eventData)
        {
            if (eventData.EventName?.StartsWith("GCAllocationTick", StringComparison.Ordinal) != true || eventData.Payload is null)
            {
                return;
            }

            var type = eventData.PayloadNames!.IndexOf("TypeName") is var t and >= 0 ? eventData.Payload[t] as string ?? "?" : "?";
            var amount = eventData.PayloadNames.IndexOf("AllocationAmount64") is var a and >= 0 ? Convert.ToInt64(eventData.Payload[a], CultureInfo.InvariantCulture) : 100_000;
            lock (gate)
            {
                bytes[type] = bytes.GetValueOrDefault(type) + amount;
            }
        }
    }

    private sealed class Collecting : IBuildLog
    {
        private readonly Lock gate = new();

        public List<BuildLogEntry> Entries { get; } = [];

        public void Write(BuildLogEntry entry)
        {
            lock (gate)
            {
                Entries.Add(entry);
            }
        }
    }
}
