using System.Globalization;
using DesignRules.Server;

namespace DesignRules.Build.Tests;

/// <summary>A build's head start runs on a thread of its own at a lower priority; the server's other threads keep theirs.</summary>
public sealed class BackgroundPriorityTests
{
    /// <summary>The nice value of the calling thread, from Linux's /proc (field 19 of the thread's stat line).</summary>
    private static int NiceOfThisThread() => NiceIn("/proc/thread-self/stat");

    private static int NiceIn(string statFile)
    {
        var stat = File.ReadAllText(statFile);
        // The command name (field 2) is in parentheses and may hold spaces: count fields after its closing one.
        var fields = stat[(stat.LastIndexOf(')') + 2)..].Split(' ');
        return int.Parse(fields[19 - 3], CultureInfo.InvariantCulture);
    }

    [Fact]
    public async Task On_Linux_a_head_starts_thread_runs_at_the_lowered_nice_value_and_the_process_keeps_its_own()
    {
        if (!OperatingSystem.IsLinux())
        {
            return;
        }

        var caller = NiceOfThisThread();
        var process = NiceIn("/proc/self/stat");
        var (nice, thread) = await BackgroundPriority.Run(() => (NiceOfThisThread(), Environment.CurrentManagedThreadId));
        Assert.True(Math.Min(caller + BackgroundPriority.Nice, 19) == nice, $"the caller's nice value {caller}, the head start's {nice}");
        Assert.NotEqual(Environment.CurrentManagedThreadId, thread);
        var after = NiceIn("/proc/self/stat");
        Assert.True(process == after, $"the process's nice value was {process}, then {after}");
    }

    [Fact]
    public async Task A_failure_in_the_head_starts_work_reaches_the_caller()
    {
        await Assert.ThrowsAsync<InvalidOperationException>(() => BackgroundPriority.Run<int>(() => throw new InvalidOperationException("the run failed")));
    }
}
