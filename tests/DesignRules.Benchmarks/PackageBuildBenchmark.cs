using System.Diagnostics;
using System.Globalization;
using System.Security.Cryptography;
using System.Text;
using BenchmarkDotNet.Attributes;
using BenchmarkDotNet.Configs;
using BenchmarkDotNet.Engines;
using BenchmarkDotNet.Jobs;
using BenchmarkDotNet.Toolchains.InProcess.Emit;

namespace DesignRules.Benchmarks;

/// <summary>
/// What the check costs a user's build, as a new user meets it: whole-process <c>dotnet build</c> runs of a hardware
/// repository outside the source tree that consumes the PACKED package from a local folder feed (the README's project-SDK
/// form, nothing else). Three builds of the same repository: with the check switched off (<c>-p:DesignRulesEnabled=false</c>,
/// the baseline), with nothing changed, and after one design was edited. The ratio column is the answer; a shared machine
/// moves the means, so only ratios from the same run are compared.
/// <para>
/// <c>DESIGNRULES_BUILD_REPOSITORIES</c>: <c>example</c> (the example's four designs; default) and/or <c>synthetic-N</c>
/// (<see cref="SyntheticRepository"/> with N designs), comma-separated. <c>DESIGNRULES_BUILD_PACKAGES</c>: <c>current</c>
/// (the package packed from this working tree; default) and/or <c>label=FEED-FOLDER|VERSION</c> entries naming a package
/// packed earlier (e.g. from another commit), so a before/after comparison runs in one job. Repositories and packs are kept
/// under <c>$TMPDIR/designrules-buildbench/</c> between the benchmark's processes (each case runs in its own); delete it to start afresh.
/// </para>
/// <para>
/// <c>DESIGNRULES_BUILD_SERVER</c>: <c>on</c> (the package's default: the untimed first build starts the warm evaluation
/// server, the edited builds hand it their run) and/or <c>off</c> (<c>-p:DesignRulesServer=false</c>: every check in the
/// build's own process), comma-separated; default <c>on,off</c>. Each case has its own server folder, deleted (which stops
/// its servers) before the case's first build and after its last, so no case meets another's warm server.
/// </para>
/// <para>
/// Each "nothing changed" and "one design changed" build follows an "off" build of its own, run in the iteration's setup
/// (outside the timed build); the case's cleanup prints the median of each timed build over its "off" build: the ratio
/// with the host's drift between cases taken out.
/// </para>
/// </summary>
[Config(typeof(ProcessConfig))]
public class PackageBuildBenchmark
{
    /// <summary>
    /// One run per build (a build is seconds long), five of them after one warm-up, in the benchmark's own process: what is
    /// timed is a child process, so the benchmark needs no separate build of itself.
    /// </summary>
    private sealed class ProcessConfig : ManualConfig
    {
        public ProcessConfig() => AddJob(Job.Default
            .WithStrategy(RunStrategy.Monitoring).WithLaunchCount(1).WithWarmupCount(1).WithIterationCount(5).WithInvocationCount(1)
            .WithToolchain(new InProcessEmitToolchain(TimeSpan.FromHours(3), logOutput: true)));
    }

    private static readonly TimeSpan Limit = TimeSpan.FromMinutes(30);

    /// <summary>The unit of /proc/PID/stat's processor times (USER_HZ, 100 on every Linux the benchmark runs on).</summary>
    private const int TicksPerSecond = 100;
    private string root = null!;
    private string packages = null!;
    private int edit;
    private readonly List<double> cpuSeconds = [];
    private readonly List<double> wallSeconds = [];
    private readonly List<double> settleSeconds = [];
    private readonly List<double> serverDuringSeconds = [];
    private readonly List<double> serverAfterSeconds = [];

    // Each "nothing changed" and "one design changed" build with the "off" build run just before it (see PairWithOff).
    private readonly List<(double Timed, double Off)> pairs = [];
    private double? pairedOff;
    private string? pairedCase;

    [ParamsSource(nameof(PackageChoices))]
    public string Package { get; set; } = "current";

    [ParamsSource(nameof(RepositoryChoices))]
    public string Repository { get; set; } = "example";

    [ParamsSource(nameof(ServerChoices))]
    public string Server { get; set; } = "on";

    private string serverFolder = null!;

    public static IEnumerable<string> PackageChoices() => List("DESIGNRULES_BUILD_PACKAGES", "current").Select(p => p.Split('=')[0]);

    public static IEnumerable<string> RepositoryChoices() => List("DESIGNRULES_BUILD_REPOSITORIES", "example");

    public static IEnumerable<string> ServerChoices() => List("DESIGNRULES_BUILD_SERVER", "on,off");

    [GlobalSetup]
    public void Setup()
    {
        var (feed, version) = Feed(Package);
        var work = Path.Combine(Path.GetTempPath(), "designrules-buildbench");
        root = Path.Combine(work, $"{Repository}-{version}");
        packages = Path.Combine(work, "nuget-packages");
        // Short (a socket path stays under about 100 bytes), one per case; deleting it stops the case's servers.
        serverFolder = Path.Combine(work, "srv-" + Convert.ToHexString(SHA256.HashData(Encoding.UTF8.GetBytes($"{Package}|{Repository}|{Server}")))[..8].ToLowerInvariant());
        StopServers();
        if (!File.Exists(Path.Combine(root, "hardware.proj")))
        {
            WriteRepository(root, feed, version);
        }

        // Restore, and the first (full) check, or settle what an earlier case left changed: never timed.
        Build();
    }

    /// <summary>
    /// The processor time the timed builds used (user + system, of the build and every process it waited for), printed
    /// once per case: on a shared machine it moves far less with the other load than the wall time does.
    /// </summary>
    [GlobalCleanup]
    public void Cleanup()
    {
        SettleServers();
        StopServers();
        if (cpuSeconds.Count > 1)
        {
            // The first build is the case's setup build; the next is the warm-up.
            var timed = cpuSeconds.Skip(2).Order().ToList();
            Console.WriteLine(string.Create(CultureInfo.InvariantCulture,
                $"// build processor time [{Package}, {Repository}, server {Server}]: median {timed[timed.Count / 2]:0.00} s of {timed.Count} ({string.Join(", ", timed.Select(t => t.ToString("0.00", CultureInfo.InvariantCulture)))})"));
            var walls = wallSeconds.Skip(2).Order().ToList();
            Console.WriteLine(string.Create(CultureInfo.InvariantCulture,
                $"// build wall time [{Package}, {Repository}, server {Server}]: median {walls[walls.Count / 2]:0.00} s of {walls.Count} ({string.Join(", ", walls.Select(t => t.ToString("0.00", CultureInfo.InvariantCulture)))}); waited for the server to go quiet before the builds and after the last: {string.Join(", ", settleSeconds.Select(t => t.ToString("0.00", CultureInfo.InvariantCulture)))} s"));
            if (pairs.Count > 1)
            {
                // The first pair is the warm-up's.
                var ratios = pairs.Skip(1).Select(p => p.Timed / p.Off).Order().ToList();
                var offs = pairs.Skip(1).Select(p => p.Off).Order().ToList();
                Console.WriteLine(string.Create(CultureInfo.InvariantCulture,
                    $"// paired with an \"off\" build just before each [{Package}, {Repository}, server {Server}, {pairedCase}]: the pairs' ratio median {ratios[ratios.Count / 2]:0.00} ({string.Join(", ", ratios.Select(t => t.ToString("0.00", CultureInfo.InvariantCulture)))}); those \"off\" builds median {offs[offs.Count / 2]:0.00} s ({string.Join(", ", offs.Select(t => t.ToString("0.00", CultureInfo.InvariantCulture)))})"));
            }

            if (Server == "on")
            {
                // The server's share, which the build's own processor time above leaves out: during each timed build, and
                // after it until the server was quiet again (the next build's wait; the last build's is taken at cleanup).
                Console.WriteLine(string.Create(CultureInfo.InvariantCulture,
                    $"// evaluation server processor time [{Package}, {Repository}]: during the timed builds {Seconds(serverDuringSeconds.Skip(2))} s; after them until quiet {Seconds(serverAfterSeconds.Skip(2))} s"));
            }
        }
    }

    [IterationSetup(Target = nameof(OneDesignChanged))]
    public void ChangeOneDesign()
    {
        SyntheticRepository.TouchOne(root, ++edit + Environment.ProcessId * 1000);
        SettleServers();
        PairWithOff("one design changed");
        SettleServers(count: false);
    }

    [IterationSetup(Target = nameof(NothingChanged))]
    public void PairBeforeBuild()
    {
        SettleServers();
        PairWithOff("nothing changed");
        SettleServers(count: false);
    }

    [IterationSetup(Target = nameof(SwitchedOff))]
    public void SettleBeforeBuild() => SettleServers();

    /// <summary>
    /// Runs an untimed-by-the-benchmark build with the check switched off just before the timed one and keeps its wall
    /// time, so that each timed build has an "off" build of the same minute beside it. The ratio column compares cases
    /// that run a minute or more apart, and a shared host that slows in between moves it (the README's runs show the
    /// builds' own processor time, which the check's server does not enter, rising by a quarter in some cases); the
    /// median of the pairs' ratios is the same question with that drift taken out. The "off" build does not check, so it
    /// leaves the server and the edited design as they were; the server is quiet before it (the settle before it counts
    /// the server's work after the last timed build) and after it.
    /// </summary>
    private void PairWithOff(string timedCase)
    {
        var clock = Stopwatch.StartNew();
        DotnetBuild("-p:DesignRulesEnabled=false");
        pairedOff = clock.Elapsed.TotalSeconds;
        pairedCase = timedCase;
    }

    [Benchmark(Baseline = true, Description = "check switched off")]
    public int SwitchedOff() => Build("-p:DesignRulesEnabled=false");

    [Benchmark(Description = "nothing changed")]
    public int NothingChanged() => Build();

    [Benchmark(Description = "one design changed")]
    public int OneDesignChanged() => Build();

    /// <summary>Stops the case's servers: a server leaves within a second of losing its socket.</summary>
    /// <summary>
    /// Waits until this case's evaluation servers have stopped working. After answering a run the server goes on for a
    /// while on the runtime's own work (recompiling the run's hot methods optimised, collecting garbage): about a second
    /// of processor time after its first runs. A developer's builds are seconds apart at the least, so that work is done
    /// before the next build; builds timed back to back would instead count it in the next build, whichever case that is.
    /// Quiet means no processor time used in 0.3 s; the wait is bounded (20 s) and printed at the end.
    /// </summary>
    /// <param name="count">False for a settle that follows an "off" build: nothing of a timed build is left to count.</param>
    private void SettleServers(bool count = true)
    {
        if (!OperatingSystem.IsLinux())
        {
            return;
        }

        var clock = Stopwatch.StartNew();
        var before = ServerTicks();
        var first = before;
        while (before > 0 && clock.Elapsed < TimeSpan.FromSeconds(20))
        {
            Thread.Sleep(300);
            var now = ServerTicks();
            if (now == before)
            {
                break;
            }

            before = now;
        }

        if (!count)
        {
            return;
        }

        settleSeconds.Add(clock.Elapsed.TotalSeconds);
        if (wallSeconds.Count > 0)
        {
            // What the server did after the last build answered (the case's first settle follows no build of this case).
            serverAfterSeconds.Add((before - first) / (double)TicksPerSecond);
        }
    }

    /// <summary>The processor time (in clock ticks) used so far by every server listening in this case's folder; 0 when none runs.</summary>
    private long ServerTicks()
    {
        long ticks = 0;
        foreach (var process in Directory.EnumerateDirectories("/proc").Where(d => Path.GetFileName(d).All(char.IsAsciiDigit)))
        {
            try
            {
                var command = File.ReadAllText(Path.Combine(process, "cmdline")).Replace('\0', ' ');
                if (!command.Contains("DesignRules.Server.dll", StringComparison.Ordinal) || !command.Contains($"--socket-folder {serverFolder} ", StringComparison.Ordinal))
                {
                    continue;
                }

                // /proc/PID/stat: the command name is in parentheses; utime and stime are the 14th and 15th fields.
                var stat = File.ReadAllText(Path.Combine(process, "stat"));
                var fields = stat[(stat.LastIndexOf(')') + 2)..].Split(' ');
                ticks += long.Parse(fields[11], CultureInfo.InvariantCulture) + long.Parse(fields[12], CultureInfo.InvariantCulture);
            }
            catch (Exception e) when (e is IOException or UnauthorizedAccessException or FormatException)
            {
                // A process that ended meanwhile or is not ours.
            }
        }

        return ticks;
    }

    private void StopServers()
    {
        if (Directory.Exists(serverFolder))
        {
            Directory.Delete(serverFolder, recursive: true);
            Thread.Sleep(TimeSpan.FromSeconds(1.5));
        }
    }

    private int Build(params string[] extra)
    {
        if (Server == "off" && !extra.Contains("-p:DesignRulesEnabled=false"))
        {
            extra = [.. extra, "-p:DesignRulesServer=false"];
        }

        var before = ChildProcessorSeconds();
        var serverBefore = ServerTicks();
        var wall = Stopwatch.StartNew();
        var exitCode = DotnetBuild(extra);
        wallSeconds.Add(wall.Elapsed.TotalSeconds);
        if (pairedOff is { } off)
        {
            pairs.Add((wall.Elapsed.TotalSeconds, off));
            pairedOff = null;
        }

        cpuSeconds.Add(ChildProcessorSeconds() - before);
        // A server started by this build counts from zero.
        serverDuringSeconds.Add((ServerTicks() - serverBefore) / (double)TicksPerSecond);
        return exitCode;
    }

    /// <summary>One <c>dotnet build</c> of the repository with the case's package cache and server folder; throws when it fails.</summary>
    private int DotnetBuild(params string[] extra)
    {
        var environment = new Dictionary<string, string> { ["NUGET_PACKAGES"] = packages, ["DESIGNRULES_SERVER_FOLDER"] = serverFolder };
        var (exitCode, output, error) = ChildProcess.Run("dotnet", ["build", "-nodeReuse:false", "-tl:off", "-v:m", .. extra], root, Limit, environment);
        if (exitCode != 0)
        {
            throw new InvalidOperationException($"dotnet build in {root} failed:\n{output}\n{error}");
        }

        return exitCode;
    }

    /// <summary>"median 0.42 (0.40, 0.41, 0.42, 0.45, 0.50)": the values in order, for the cleanup lines.</summary>
    private static string Seconds(IEnumerable<double> values)
    {
        var ordered = values.Order().ToList();
        return ordered.Count == 0 ? "none" : string.Create(CultureInfo.InvariantCulture,
            $"median {ordered[ordered.Count / 2]:0.00} ({string.Join(", ", ordered.Select(t => t.ToString("0.00", CultureInfo.InvariantCulture)))})");
    }

    /// <summary>User plus system time of every child process this process has waited for (getrusage, RUSAGE_CHILDREN).</summary>
    private static double ChildProcessorSeconds()
    {
        if (!OperatingSystem.IsLinux() && !OperatingSystem.IsMacOS())
        {
            return double.NaN;
        }

        var usage = new long[18];
        return GetResourceUsage(-1, usage) == 0 ? usage[0] + (usage[1] / 1e6) + usage[2] + (usage[3] / 1e6) : double.NaN;
    }

    [System.Runtime.InteropServices.DllImport("libc", EntryPoint = "getrusage")]
    private static extern int GetResourceUsage(int who, long[] usage);

    private void WriteRepository(string folder, string feed, string version)
    {
        var source = Repository == "example" ? Path.Combine(SyntheticRepository.RepositoryRoot, "example-design") : null;
        if (source is not null)
        {
            Directory.CreateDirectory(folder);
            foreach (var file in Directory.EnumerateFiles(source, "*.yaml", SearchOption.AllDirectories))
            {
                var target = Path.Combine(folder, Path.GetRelativePath(source, file));
                Directory.CreateDirectory(Path.GetDirectoryName(target)!);
                File.Copy(file, target, overwrite: true);
            }
        }
        else if (Repository.StartsWith("synthetic-", StringComparison.Ordinal))
        {
            var generated = SyntheticRepository.Write(int.Parse(Repository["synthetic-".Length..], CultureInfo.InvariantCulture));
            Directory.CreateDirectory(Path.GetDirectoryName(folder)!);
            Directory.Move(generated, folder);
        }
        else
        {
            throw new ArgumentException($"unknown repository '{Repository}' (example or synthetic-N)");
        }

        // As the README tells a user: the feed in nuget.config, one project file in the project-SDK form.
        File.WriteAllText(Path.Combine(folder, "nuget.config"), $"""
            <?xml version="1.0" encoding="utf-8"?>
            <configuration>
              <packageSources>
                <add key="designrules-local" value="{feed}" />
              </packageSources>
            </configuration>
            """);
        // Nothing above the temp folder may leak in.
        File.WriteAllText(Path.Combine(folder, "Directory.Build.props"), "<Project />\n");
        File.WriteAllText(Path.Combine(folder, "Directory.Build.targets"), "<Project />\n");
        File.WriteAllText(Path.Combine(folder, "hardware.proj"), $"<Project Sdk=\"DesignRules.Build/{version}\">\n</Project>\n");
    }

    /// <summary>The feed folder and version of a package choice; <c>current</c> packs this working tree once per content.</summary>
    private static (string Feed, string Version) Feed(string label)
    {
        var named = List("DESIGNRULES_BUILD_PACKAGES", "current").FirstOrDefault(p => p.StartsWith(label + "=", StringComparison.Ordinal));
        if (named is not null)
        {
            var parts = named[(label.Length + 1)..].Split('|');
            return (Path.GetFullPath(parts[0]), parts[1]);
        }

        var source = SyntheticRepository.RepositoryRoot;
        var version = "0.1.0-bench." + SourceHash(source);
        var feed = Path.Combine(Path.GetTempPath(), "designrules-buildbench", "feeds", version);
        if (!File.Exists(Path.Combine(feed, $"DesignRules.Build.{version}.nupkg")))
        {
            var pack = new ProcessStartInfo("dotnet") { WorkingDirectory = source, UseShellExecute = false };
            foreach (var arg in (string[])["pack", Path.Combine(source, "src", "DesignRules.Build"), "-c", "Release", "-o", feed, $"-p:PackageVersion={version}", "-nodeReuse:false", "-tl:off", "-v:q"])
            {
                pack.ArgumentList.Add(arg);
            }

            using var process = Process.Start(pack)!;
            process.WaitForExit();
            if (process.ExitCode != 0)
            {
                throw new InvalidOperationException("dotnet pack of DesignRules.Build failed");
            }
        }

        return (feed, version);
    }

    /// <summary>A short hash of the sources the package is made of, so that an unchanged tree is packed once.</summary>
    private static string SourceHash(string source)
    {
        var text = new StringBuilder();
        foreach (var folder in new[] { "src", "templates", "rules" })
        {
            foreach (var file in Directory.EnumerateFiles(Path.Combine(source, folder), "*", SearchOption.AllDirectories)
                .Where(f => !f.Contains($"{Path.DirectorySeparatorChar}bin{Path.DirectorySeparatorChar}", StringComparison.Ordinal)
                    && !f.Contains($"{Path.DirectorySeparatorChar}obj{Path.DirectorySeparatorChar}", StringComparison.Ordinal))
                .Order(StringComparer.Ordinal))
            {
                text.Append(file).Append(' ').Append(Convert.ToHexString(SHA256.HashData(File.ReadAllBytes(file)))).Append('\n');
            }
        }

        return Convert.ToHexString(SHA256.HashData(Encoding.UTF8.GetBytes(text.ToString())))[..12].ToLowerInvariant();
    }

    private static List<string> List(string variable, string fallback) =>
        [.. (Environment.GetEnvironmentVariable(variable) ?? fallback).Split(',', StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries)];
}
