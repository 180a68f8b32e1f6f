using DesignRules.Rules;

namespace DesignRules.Run;

/// <summary>What a host hears while a run goes on. Calls come from worker threads, one at a time.</summary>
public interface IRunProgress
{
    /// <summary>One design has finished (evaluated or taken from the results cache).</summary>
    void DesignChecked(DesignProgress progress);

    /// <summary>
    /// A long run is still going (first after <see cref="LongRunWatch.FirstNotice"/>, then every
    /// <see cref="LongRunWatch.Interval"/>): a short run says nothing here, a long one is never silent.
    /// </summary>
    void StillRunning(int completed, int total, TimeSpan elapsed);
}

/// <summary>
/// Passes design progress on and, while the check runs longer than <see cref="FirstNotice"/>, says every
/// <see cref="Interval"/> how far it has come (a million Monte Carlo samples, or a repository of hundreds of designs).
/// </summary>
public sealed class LongRunWatch : IDisposable
{
    private readonly IRunProgress progress;
    private readonly Timer timer;
    private readonly object gate = new();
    private readonly long started = System.Diagnostics.Stopwatch.GetTimestamp();
    private int completed;
    private int total;
    private bool disposed;

    /// <summary>Starts watching a run that reports to <paramref name="progress"/>.</summary>
    public LongRunWatch(IRunProgress progress)
        : this(progress, FirstNotice, Interval)
    {
    }

    /// <summary>Starts watching with other times (tests).</summary>
    internal LongRunWatch(IRunProgress progress, TimeSpan firstNotice, TimeSpan interval)
    {
        this.progress = progress ?? throw new ArgumentNullException(nameof(progress));
        timer = new Timer(_ => Tick(), null, firstNotice, interval);
    }

    /// <summary>How long a run goes before its first "still checking" line: a check of a few designs never reaches it.</summary>
    public static readonly TimeSpan FirstNotice = TimeSpan.FromSeconds(10);

    /// <summary>How often a long run says it is still going after that.</summary>
    public static readonly TimeSpan Interval = TimeSpan.FromSeconds(15);

    /// <summary>Remembers how many designs the run checks.</summary>
    public void DesignsLoaded(int count)
    {
        lock (gate)
        {
            total = count;
        }
    }

    /// <summary>Passes one finished design on, and remembers how far the run has come.</summary>
    public void DesignChecked(DesignProgress design)
    {
        ArgumentNullException.ThrowIfNull(design);
        lock (gate)
        {
            completed = design.Completed;
            total = design.Total;
            progress.DesignChecked(design);
        }
    }

    /// <inheritdoc />
    public void Dispose()
    {
        lock (gate)
        {
            disposed = true;
        }

        timer.Dispose();
    }

    private void Tick()
    {
        lock (gate)
        {
            if (!disposed)
            {
                progress.StillRunning(completed, total, System.Diagnostics.Stopwatch.GetElapsedTime(started));
            }
        }
    }
}
