using System.Diagnostics;
using System.Globalization;
using System.Text;

namespace DesignRules.Run;

/// <summary>The parts of a run whose wall time a detailed log shows, in the order they happen.</summary>
public enum RunPhase
{
    /// <summary>The results cache hashes the given files (before anything reads them).</summary>
    Inputs,

    /// <summary>The rule set and every design and parts file are read.</summary>
    Loading,

    /// <summary>Each design is evaluated or taken from the results cache.</summary>
    Designs,

    /// <summary>Levels, SARIF and JSON.</summary>
    Reports,

    /// <summary>Pages and plots.</summary>
    Pages,
}

/// <summary>
/// Where a run's wall time went, phase by phase: for the host's detailed log, to find what a build spends its time on
/// (never in a report, whose bytes must not depend on the clock).
/// </summary>
public sealed class RunTimings
{
    private readonly TimeSpan[] phases;

    internal RunTimings(TimeSpan[] phases) => this.phases = phases;

    /// <summary>No run measured (a run that ended on a fault).</summary>
    public static RunTimings None { get; } = new(new TimeSpan[Enum.GetValues<RunPhase>().Length]);

    /// <summary>The wall time of <paramref name="phase"/>.</summary>
    public TimeSpan this[RunPhase phase] => phases[(int)phase];

    /// <summary>The whole run.</summary>
    public TimeSpan Total => phases.Aggregate(TimeSpan.Zero, (sum, t) => sum + t);

    /// <summary>"inputs 0.01 s, loading 0.20 s, designs 0.90 s, reports 0.02 s, pages 0.10 s".</summary>
    public override string ToString()
    {
        var text = new StringBuilder();
        foreach (var phase in Enum.GetValues<RunPhase>())
        {
            text.Append(phase == RunPhase.Inputs ? string.Empty : ", ").Append(phase.ToString().ToLowerInvariant()).Append(' ').Append(Seconds(this[phase]));
        }

        return text.ToString();
    }

    private static string Seconds(TimeSpan time) => time.TotalSeconds.ToString("0.00", CultureInfo.InvariantCulture) + " s";
}

/// <summary>Measures a run's phases one after another: each lap ends one phase and starts the next.</summary>
internal sealed class RunClock
{
    private readonly TimeSpan[] phases = new TimeSpan[Enum.GetValues<RunPhase>().Length];
    private long last = Stopwatch.GetTimestamp();
    private readonly TimeSpan startProcessor = Environment.CpuUsage.TotalTime;

    /// <summary>Ends <paramref name="phase"/> now (time is added, so a phase may be entered twice).</summary>
    public void Lap(RunPhase phase)
    {
        var now = Stopwatch.GetTimestamp();
        phases[(int)phase] += Stopwatch.GetElapsedTime(last, now);
        last = now;
    }

    /// <summary>
    /// "inputs 0.01 s, loading 0.05 s, designs 0.40 s; processor 0.55 s, ended 1.20 s before": the phases up to
    /// <paramref name="phase"/> (ended now), the process's processor time over them (every thread, this run's and any other
    /// run's beside it), and the time since they ended, when the text is read — for a head start's run, told by the build's.
    /// </summary>
    public Func<string> Account(RunPhase phase)
    {
        Lap(phase);
        var through = (int)phase;
        var text = string.Join(", ", Enum.GetValues<RunPhase>().Where(p => (int)p <= through)
            .Select(p => p.ToString().ToLowerInvariant() + " " + phases[(int)p].TotalSeconds.ToString("0.00", CultureInfo.InvariantCulture) + " s"));
        var processor = (Environment.CpuUsage.TotalTime - startProcessor).TotalSeconds;
        var ended = Stopwatch.GetTimestamp();
        return () => string.Create(CultureInfo.InvariantCulture,
            $"{text}; processor {processor:0.00} s, ended {Stopwatch.GetElapsedTime(ended).TotalSeconds:0.00} s before");
    }

    /// <summary>Ends <paramref name="phase"/> and returns every phase's time.</summary>
    public RunTimings Stop(RunPhase phase)
    {
        Lap(phase);
        return new RunTimings((TimeSpan[])phases.Clone());
    }
}
