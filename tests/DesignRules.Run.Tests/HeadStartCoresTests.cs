using System.Collections.Concurrent;

namespace DesignRules.Run.Tests;

/// <summary>
/// The cores a head start uses: its own thread while the build restores, every core once the build's check waits for it.
/// Checked by the threads the items of a parallel loop inside it ran on, and by the loop's results, which must not depend
/// on them.
/// </summary>
public sealed class HeadStartCoresTests
{
    [Fact]
    public void Until_widened_every_item_of_every_parallel_loop_inside_runs_on_the_head_start_s_own_thread()
    {
        var caller = Environment.CurrentManagedThreadId;
        var threads = new ConcurrentBag<int>();
        var sums = HeadStartCores.Run(_ =>
        {
            // Nested loops too: a design's loop of corners inside the loop of designs.
            var outer = new long[16];
            Parallel.For(0, outer.Length, AsTheRunLayerDoes(), i =>
            {
                var inner = new long[32];
                Parallel.For(0, inner.Length, AsTheRunLayerDoes(), j =>
                {
                    threads.Add(Environment.CurrentManagedThreadId);
                    inner[j] = (i * 100) + j;
                    Thread.SpinWait(2000);
                });
                outer[i] = inner.Sum();
            });
            return outer;
        });

        Assert.Equal([caller], threads.Distinct());
        Assert.Equal(Enumerable.Range(0, 16).Select(i => Enumerable.Range(0, 32).Sum(j => (long)((i * 100) + j))), sums);
    }

    [Fact]
    public void Once_widened_the_items_left_are_shared_among_more_threads_with_the_same_results()
    {
        if (Environment.ProcessorCount < 2)
        {
            // One core: there is no other core to give (the first test covers this machine's behaviour).
            return;
        }

        var threads = new ConcurrentDictionary<int, int>();
        var results = HeadStartCores.Run(cores =>
        {
            var squares = new long[400];
            Parallel.For(0, squares.Length, AsTheRunLayerDoes(), i =>
            {
                if (i == 0)
                {
                    // As the build's check does when it arrives (HeadStartChecks.Take).
                    cores.Widen();
                }

                threads.AddOrUpdate(Environment.CurrentManagedThreadId, 1, (_, n) => n + 1);
                squares[i] = (long)i * i;
                Thread.Sleep(1);
            });
            return squares;
        });

        Assert.True(threads.Count >= 2, $"the items ran on {threads.Count} thread(s) after the head start was widened");
        Assert.Equal(Enumerable.Range(0, 400).Select(i => (long)i * i), results);
    }

    // The options every parallel loop of the check takes (a house rule): the scheduler of the task the loop is in.
    private static ParallelOptions AsTheRunLayerDoes() => new() { TaskScheduler = TaskScheduler.Current };

    [Fact]
    public void A_failure_inside_reaches_the_caller_as_itself()
    {
        var thrown = Assert.Throws<InvalidOperationException>(() => HeadStartCores.Run<int>(_ => throw new InvalidOperationException("inside")));
        Assert.Equal("inside", thrown.Message);
    }
}
