using System.Collections.Concurrent;

namespace DesignRules.Run;

/// <summary>
/// The cores a build's head start may use: one while the build restores, every core once the build's check waits for it.
/// <para>
/// While the build restores, its own process keeps a core busy: a head start on every core would slow the restore by as
/// much as it gains, so it works on the one thread that runs it. Once the build's check of the same files is waiting for
/// it (<see cref="HeadStartChecks.Take"/>), the build's process is idle and every core is the head start's: whatever it
/// still has to evaluate (a design's tolerance corners, band ends, samples) is then shared out as a check's is.
/// </para>
/// <para>
/// The head start runs as a task of this scheduler, so every parallel loop inside it (whose options name the scheduler of
/// the task they are in, <see cref="TaskScheduler.Current"/>: a house rule) hands its further workers to this scheduler. Until <see cref="Widen"/>, those workers are only queued: the loop's
/// first worker, on the head start's own thread, takes the loop's items one by one, and each queued worker is run on that
/// thread when the loop waits for it (by then no items are left for it). After <see cref="Widen"/>, queued workers run on
/// threads of their own and take the remaining items side by side. Which worker evaluates which item never changes an item's
/// result (each is computed into its own slot), so a head start's results are the same bits either way.
/// </para>
/// </summary>
internal sealed class HeadStartCores : TaskScheduler
{
    private readonly ConcurrentQueue<Task> queued = new();
    private int running;
    private int allowed;

    /// <summary>As many as the machine has: a parallel loop inside plans for every core, and gets them after <see cref="Widen"/>.</summary>
    public override int MaximumConcurrencyLevel => Environment.ProcessorCount;

    /// <summary>Runs <paramref name="run"/> on this thread as a task of a new scheduler of this kind, and returns its result.</summary>
    public static T Run<T>(Func<HeadStartCores, T> run)
    {
        var cores = new HeadStartCores();
        var task = new Task<T>(() => run(cores));
        task.RunSynchronously(cores);
        return task.GetAwaiter().GetResult();
    }

    /// <summary>From now on, every core: queued workers start on threads of their own.</summary>
    public void Widen()
    {
        Volatile.Write(ref allowed, Math.Max(0, Environment.ProcessorCount - 1));
        StartWorkers();
    }

    protected override void QueueTask(Task task)
    {
        queued.Enqueue(task);
        StartWorkers();
    }

    // A worker queued before Widen is run where the loop waits for it; run inline, it adds no thread.
    protected override bool TryExecuteTaskInline(Task task, bool taskWasPreviouslyQueued) => TryExecuteTask(task);

    protected override IEnumerable<Task> GetScheduledTasks() => queued.ToArray();

    private void StartWorkers()
    {
        while (!queued.IsEmpty)
        {
            var now = Volatile.Read(ref running);
            if (now >= Volatile.Read(ref allowed))
            {
                return;
            }

            if (Interlocked.CompareExchange(ref running, now + 1, now) == now)
            {
                // A thread of its own, not the thread pool's: the pool's threads may all be blocked (the build's request
                // waiting for this head start is one of them), and the pool adds a thread only every half second or so.
                new Thread(Work) { IsBackground = true, Name = "DesignRules head start" }.Start();
            }
        }
    }

    private void Work()
    {
        try
        {
            // A task run inline meanwhile (waited for before a thread came) is skipped here: TryExecuteTask runs a task once.
            while (queued.TryDequeue(out var task))
            {
                TryExecuteTask(task);
            }
        }
        finally
        {
            Interlocked.Decrement(ref running);
        }

        // A task queued between the last look and the decrement above finds a worker here.
        StartWorkers();
    }
}
