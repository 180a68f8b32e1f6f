using System.Collections.Concurrent;
using DesignRules.Loading;

namespace DesignRules.Yaml;

/// <summary>
/// YAML trees already read by this process, for a long-lived process (the warm evaluation server) that reads the same
/// files run after run: a file whose text is exactly the text read before (compared in full, character by character — no
/// hash, no file time) gets the tree read from it then. Only trees whose reading raised no diagnostic are kept, so a kept
/// tree stands for exactly what reading that text again would give. Trees are never changed once read. Off unless the
/// process turns on the <see cref="SwitchName"/> switch; bounded: past <see cref="Capacity"/> files it starts afresh.
/// </summary>
internal static class ParsedTrees
{
    /// <summary>The <see cref="AppContext"/> switch that turns the memo on (the evaluation server sets it).</summary>
    public const string SwitchName = "DesignRules.KeepParsedFiles";

    /// <summary>How many files' trees a process keeps (a 500-design repository's with its parts files, twice over).</summary>
    public const int Capacity = 2048;

    private static readonly ConcurrentDictionary<(string File, LoaderLimits Limits), (string Text, YamlNode Tree)> Kept = new();

    /// <summary>True when this process keeps trees.</summary>
    public static bool Enabled => AppContext.TryGetSwitch(SwitchName, out var on) && on;

    /// <summary>The tree read earlier from exactly <paramref name="text"/> of <paramref name="file"/> under <paramref name="limits"/>, or null.</summary>
    public static YamlNode? Find(string file, string text, LoaderLimits limits) =>
        Enabled && Kept.TryGetValue((file, limits), out var kept) && string.Equals(kept.Text, text, StringComparison.Ordinal) ? kept.Tree : null;

    /// <summary>Keeps the tree read from <paramref name="text"/> (only one whose reading raised no diagnostic).</summary>
    public static void Keep(string file, string text, LoaderLimits limits, YamlNode tree)
    {
        if (!Enabled)
        {
            return;
        }

        if (Kept.Count >= Capacity)
        {
            Kept.Clear();
        }

        Kept[(file, limits)] = (text, tree);
    }

    /// <summary>How many trees are kept now (tests).</summary>
    internal static int Count => Kept.Count;
}
