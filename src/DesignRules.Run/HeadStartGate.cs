using System.Collections.Concurrent;

namespace DesignRules.Run;

/// <summary>
/// Where a build's head start runs: a task scheduler that lets one thread work at a time until the build's own check
/// begins, then every core. While the build restores, its process keeps one core busy, and a head start on both cores
/// slowed that restore; once the build's check has begun the restore is over, and a design the head start has not
/// finished yet is one the check is about to wait for, so the rest of it may use every core.
/// <para>
/// Every parallel loop of the check names the current scheduler in its options (a loop that names none runs on the
/// default one, whatever scheduler its caller runs on), so inside a run started here every loop of every design, nested
/// or not, waits for a slot of this gate. A thread that works for the gate runs a task it waits for
/// inline, so a loop nested in a loop makes progress with a single slot: the gate only limits, it never holds back work
/// the working thread can do itself.
/// </para>
/// </summary>
internal sealed class HeadStartGate : TaskScheduler
{
    private static readonly ConcurrentDictionary<HeadStartGate, byte> Open = new();

    [ThreadStatic]
    private static HeadStartGate? workingFor;

    private readonly LinkedList<Task> queue = new();
    private readonly int most;
    private int slots;
    private int working;

    /// <summary>A gate of one slot, raised to <paramref name="most"/> by <see cref="Raise"/>.</summary>
    public HeadStartGate(int most)
    {
        ArgumentOutOfRangeException.ThrowIfLessThan(most, 1);
        this.most = most;
        slots = 1;
    }

    /// <summary>How many threads may work now.</summary>
    public int Slots
    {
        get
        {
            lock (queue)
            {
                return slots;
            }
        }
    }

    /// <summary>What a parallel loop plans for: every slot the gate may have, so that a loop begun at one slot uses all after a raise.</summary>
    public override int MaximumConcurrencyLevel => most;

    /// <summary>Runs <paramref name="run"/> through a new gate and returns its result; the gate is raised when a build's own check begins.</summary>
    public static T Run<T>(Func<T> run)
    {
        var gate = new HeadStartGate(Environment.ProcessorCount);
        Open[gate] = 0;
        try
        {
            return Task.Factory.StartNew(run, CancellationToken.None, TaskCreationOptions.DenyChildAttach, gate).GetAwaiter().GetResult();
        }
        finally
        {
            Open.TryRemove(gate, out _);
        }
    }

    /// <summary>A build's own check has begun: every open head start may use every core.</summary>
    public static void RaiseAll()
    {
        foreach (var gate in Open.Keys)
        {
            gate.Raise();
        }
    }

    /// <summary>Lets the gate use all its slots from now on (more than once is harmless).</summary>
    public void Raise()
    {
        lock (queue)
        {
            slots = most;
            StartWorkers();
        }
    }

    /// <inheritdoc />
    protected override void QueueTask(Task task)
    {
        lock (queue)
        {
            queue.AddLast(task);
            StartWorkers();
        }
    }

    /// <inheritdoc />
    protected override bool TryExecuteTaskInline(Task task, bool taskWasPreviouslyQueued)
    {
        // Only a thread already working for this gate: any other caller would add a worker beyond the slots.
        if (workingFor != this)
        {
            return false;
        }

        return (!taskWasPreviouslyQueued || TryDequeue(task)) && TryExecuteTask(task);
    }

    /// <inheritdoc />
    protected override bool TryDequeue(Task task)
    {
        lock (queue)
        {
            return queue.Remove(task);
        }
    }

    /// <inheritdoc />
    protected override IEnumerable<Task> GetScheduledTasks()
    {
        lock (queue)
        {
            return [.. queue];
        }
    }

    /// <summary>Starts a worker per free slot, as many as tasks wait (called under the lock; a busy worker takes no queued task).</summary>
    private void StartWorkers()
    {
        for (int free = Math.Min(slots - working, queue.Count); free > 0; free--)
        {
            working++;
            ThreadPool.UnsafeQueueUserWorkItem(_ => Work(), null);
        }
    }

    private void Work()
    {
        var outer = workingFor;
        workingFor = this;
        try
        {
            while (true)
            {
                Task next;
                lock (queue)
                {
                    if (queue.First is not { } first)
                    {
                        working--;
                        return;
                    }

                    next = first.Value;
                    queue.RemoveFirst();
                }

                TryExecuteTask(next);
            }
        }
        finally
        {
            workingFor = outer;
        }
    }
}
