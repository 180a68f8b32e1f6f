using System.Collections.Concurrent;

namespace DesignRules.Run;

/// <summary>
/// Which designs runs of this process are evaluating now, by their result key (the content of everything the result
/// depends on). A run about to evaluate a design claims its key; another run of the same process that meets the claim
/// waits for it to end and then reads the result from the cache entry the first run wrote, instead of evaluating the
/// same design side by side. That is what lets the evaluation server start a build's check early (a head start sent
/// while the build restores) without the build's own run evaluating the edited design a second time. Only a key names
/// a claim, so a run never waits for a result of other content; a waiter that finds no entry afterwards (the first run
/// failed, or a file changed during its check) evaluates the design itself.
/// <para>
/// No cycle of waits can form: a thread claims only the design it is about to evaluate, evaluates it without waiting on
/// any claim, and releases it before it looks up its next design; a run that ends releases whatever it still holds.
/// </para>
/// </summary>
internal static class EvaluationClaims
{
    /// <summary>How long a run waits for another run's evaluation of a design before it evaluates the design itself.</summary>
    public static readonly TimeSpan WaitLimit = TimeSpan.FromMinutes(10);

    private static readonly ConcurrentDictionary<string, Claim> Held = new(StringComparer.Ordinal);

    /// <summary>Claims <paramref name="key"/>, the key of <paramref name="designFile"/>'s result, for the caller; null when another run holds it.</summary>
    public static Claim? TryClaim(string key, string designFile)
    {
        var claim = new Claim(key, designFile);
        return Held.TryAdd(key, claim) ? claim : null;
    }

    /// <summary>
    /// Waits while another run holds <paramref name="key"/>, at most <paramref name="limit"/>; true when there was a
    /// claim and it ended in time.
    /// </summary>
    public static bool WaitFor(string key, TimeSpan limit) =>
        Held.TryGetValue(key, out var claim) && claim.Ended.Wait(limit);

    /// <summary>How many keys evaluated by head starts a process remembers until a run reads them (then it starts afresh).</summary>
    public const int HeadStartCapacity = 1024;

    private static readonly ConcurrentDictionary<string, byte> HeadStarted = new(StringComparer.Ordinal);

    /// <summary>A head start (a run that only fills the cache ahead of the build's check) evaluated the result of <paramref name="key"/>.</summary>
    public static void EvaluatedByHeadStart(string key)
    {
        if (HeadStarted.Count >= HeadStartCapacity)
        {
            HeadStarted.Clear();
        }

        HeadStarted[key] = 0;
    }

    /// <summary>
    /// True once for a key a head start evaluated: the run that reads the result says so, instead of calling an edited
    /// design "unchanged".
    /// </summary>
    public static bool TakeEvaluatedByHeadStart(string key) => HeadStarted.TryRemove(key, out _);

    /// <summary>Whether a run holds a claim on a result of <paramref name="designFile"/> now (tests).</summary>
    internal static bool Holds(string designFile) => Held.Values.Any(c => c.DesignFile == Path.GetFullPath(designFile));

    /// <summary>One run's claim of one key; <see cref="Release"/> ends it (more than once is harmless).</summary>
    internal sealed class Claim(string key, string designFile)
    {
        public string DesignFile { get; } = designFile;

        private readonly TaskCompletionSource done = new(TaskCreationOptions.RunContinuationsAsynchronously);

        public Task Ended => done.Task;

        public void Release()
        {
            Held.TryRemove(new KeyValuePair<string, Claim>(key, this));
            done.TrySetResult();
        }
    }
}
