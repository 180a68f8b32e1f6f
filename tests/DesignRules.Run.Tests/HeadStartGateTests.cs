namespace DesignRules.Run.Tests;

/// <summary>
/// The head start's scheduler: one thread while the build restores, every core once the build's own check begins, and
/// never a loop that cannot finish (the check's loops nest: designs, then band ends and corners inside each).
/// </summary>
public sealed class HeadStartGateTests
{
    private static readonly TimeSpan Bound = TimeSpan.FromSeconds(60);

    /// <summary>Counts the bodies running at once and the most seen.</summary>
    private sealed class Overlap
    {
        private int now;
        private int most;
        private int done;

        public int Most => Volatile.Read(ref most);

        public int Done => Volatile.Read(ref done);

        public void Body(TimeSpan work)
        {
            var running = Interlocked.Increment(ref now);
            int seen;
            while (running > (seen = Volatile.Read(ref most)) && Interlocked.CompareExchange(ref most, running, seen) != seen)
            {
            }

            Thread.Sleep(work);
            Interlocked.Decrement(ref now);
            Interlocked.Increment(ref done);
        }
    }

    private static Task Start(HeadStartGate gate, Action work) =>
        Task.Factory.StartNew(work, CancellationToken.None, TaskCreationOptions.DenyChildAttach, gate);

    /// <summary>As the check's loops name it: the scheduler they were called on.</summary>
    private static ParallelOptions OnCurrent => new() { TaskScheduler = TaskScheduler.Current };

    [Fact]
    public async Task A_parallel_loop_behind_a_closed_gate_runs_one_body_at_a_time()
    {
        var gate = new HeadStartGate(2);
        var overlap = new Overlap();
        await Start(gate, () => Parallel.For(0, 40, OnCurrent, _ => overlap.Body(TimeSpan.FromMilliseconds(5)))).WaitAsync(Bound);
        Assert.Equal(40, overlap.Done);
        Assert.Equal(1, overlap.Most);
        Assert.Equal(1, gate.Slots);
    }

    [Fact]
    public async Task Loops_nested_three_deep_finish_behind_a_closed_gate()
    {
        var gate = new HeadStartGate(2);
        var overlap = new Overlap();
        var run = Start(gate, () => Parallel.For(0, 3, OnCurrent, _ => Parallel.For(0, 3, OnCurrent, _ => Parallel.For(0, 3, OnCurrent, _ => overlap.Body(TimeSpan.FromMilliseconds(1))))));
        await run.WaitAsync(Bound); // a TimeoutException: the nested loops did not finish behind a gate of one slot
        Assert.Equal(27, overlap.Done);
        Assert.Equal(1, overlap.Most);
    }

    [Fact]
    public async Task A_loop_begun_behind_a_closed_gate_uses_both_slots_once_raised_and_runs_every_body_once()
    {
        var gate = new HeadStartGate(2);
        var overlap = new Overlap();
        var raised = false;
        var run = Start(gate, () => Parallel.For(0, 200, OnCurrent, i =>
        {
            if (i == 10 && !raised)
            {
                raised = true;
                gate.Raise();
            }

            overlap.Body(TimeSpan.FromMilliseconds(10));
        }));
        await run.WaitAsync(Bound);
        Assert.Equal(200, overlap.Done);
        Assert.Equal(2, gate.Slots);
        Assert.Equal(2, overlap.Most);
    }

    [Fact]
    public async Task A_build_s_own_check_raises_every_open_head_start()
    {
        var inside = new ManualResetEventSlim();
        var release = new ManualResetEventSlim();
        int slotsSeen = 0;
        var headStart = Task.Run(() => HeadStartGate.Run(() =>
        {
            var gate = (HeadStartGate)TaskScheduler.Current;
            inside.Set();
            release.Wait(Bound);
            return slotsSeen = gate.Slots;
        }));
        Assert.True(inside.Wait(Bound));
        HeadStartGate.RaiseAll();
        release.Set();
        await headStart.WaitAsync(Bound);
        Assert.Equal(Environment.ProcessorCount, slotsSeen);
    }
}
