using System.Runtime.InteropServices;

namespace DesignRules.Server;

/// <summary>
/// Runs a build's head start on a thread of its own at a lower scheduling priority. The head start works while the build
/// restores, on a two-core machine beside MSBuild's own threads (its restore, its compiler threads, its garbage
/// collector): at the same priority it slowed that restore by about a tenth of a second. Lowered, it takes only the time
/// the build leaves; its one thread of work still runs on whichever core is idle. The thread is the run's own and ends
/// with it, so no pool thread keeps the lowered priority (on Linux an unprivileged process may lower a thread's priority
/// but not raise it again).
/// </summary>
internal static class BackgroundPriority
{
    /// <summary>The nice value of a head start's thread on Linux (0 is the default; 19 the lowest).</summary>
    internal const int Nice = 10;

    /// <summary>Runs <paramref name="work"/> on a new lowered-priority thread; the task completes with its result.</summary>
    public static Task<T> Run<T>(Func<T> work)
    {
        var done = new TaskCompletionSource<T>(TaskCreationOptions.RunContinuationsAsynchronously);
        var thread = new Thread(() =>
        {
            Lower();
            try
            {
                done.SetResult(work());
            }
            catch (Exception ex)
            {
                done.SetException(ex);
            }
        })
        {
            IsBackground = true,
            Name = "DesignRules head start",
        };
        thread.Start();
        return done.Task;
    }

    /// <summary>Lowers the calling thread's priority where the platform lets one thread's be lowered alone; elsewhere nothing.</summary>
    private static void Lower()
    {
        try
        {
            if (OperatingSystem.IsLinux())
            {
                // Linux schedules threads as tasks: PRIO_PROCESS with a thread's id sets that thread's nice value alone.
                _ = SetPriority(0, GetThreadId(), Nice);
            }
            else if (OperatingSystem.IsWindows())
            {
                Thread.CurrentThread.Priority = ThreadPriority.BelowNormal;
            }
        }
        catch (Exception ex) when (ex is DllNotFoundException or EntryPointNotFoundException or PlatformNotSupportedException)
        {
            // The head start then runs at the usual priority, as before.
        }
    }

    [DllImport("libc", EntryPoint = "setpriority")]
    private static extern int SetPriority(int which, int who, int priority);

    [DllImport("libc", EntryPoint = "gettid")]
    private static extern int GetThreadId();
}
