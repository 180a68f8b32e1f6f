namespace DesignRules.Diagnostics;

/// <summary>Finds the closest known word to a misspelled one, for "did you mean" hints.</summary>
public static class SpellingSuggestion
{
    /// <summary>
    /// The least similarity, 1 − edits / length of the longer word, at which a candidate is suggested. One edit in a
    /// one- or two-letter name leaves at most half of it, so such a name gets no suggestion: it says too little about
    /// what was meant. A one-letter name gets none at all, not even a change of letter case.
    /// </summary>
    public const double MinimumSimilarity = 0.6;

    /// <summary>The closest candidate within a distance that suggests a typo, or null.</summary>
    public static string? Closest(string word, IEnumerable<string> candidates)
    {
        string? best = null;
        var bestDistance = int.MaxValue;
        foreach (var candidate in candidates)
        {
            var d = Distance(word.ToLowerInvariant(), candidate.ToLowerInvariant());
            if (d < bestDistance || (d == bestDistance && string.CompareOrdinal(candidate, best) < 0))
            {
                best = candidate;
                bestDistance = d;
            }
        }

        // A third of the word's length (at least 1, at most 3 edits) is where a typo stops being plausible; and the two
        // must be similar enough that a short name is not "corrected" into an unrelated one.
        var allowed = Math.Clamp(word.Length / 3, 1, 3);
        return best is not null && word.Length > 1 && bestDistance <= allowed && Similarity(bestDistance, word, best) >= MinimumSimilarity
            ? best
            : null;
    }

    private static double Similarity(int distance, string a, string b) => 1.0 - ((double)distance / Math.Max(a.Length, b.Length));

    /// <summary>A hint sentence, " Did you mean 'x'?" or empty.</summary>
    public static string Hint(string word, IEnumerable<string> candidates)
    {
        var closest = Closest(word, candidates);
        return closest is null ? string.Empty : $" Did you mean '{closest}'?";
    }

    // Optimal string alignment distance (Levenshtein with adjacent transpositions), bounded input length.
    private static int Distance(string a, string b)
    {
        if (a.Length > 64 || b.Length > 64)
        {
            return int.MaxValue;
        }

        var d = new int[a.Length + 1, b.Length + 1];
        for (var i = 0; i <= a.Length; i++)
        {
            d[i, 0] = i;
        }

        for (var j = 0; j <= b.Length; j++)
        {
            d[0, j] = j;
        }

        for (var i = 1; i <= a.Length; i++)
        {
            for (var j = 1; j <= b.Length; j++)
            {
                var cost = a[i - 1] == b[j - 1] ? 0 : 1;
                d[i, j] = Math.Min(Math.Min(d[i - 1, j] + 1, d[i, j - 1] + 1), d[i - 1, j - 1] + cost);
                if (i > 1 && j > 1 && a[i - 1] == b[j - 2] && a[i - 2] == b[j - 1])
                {
                    d[i, j] = Math.Min(d[i, j], d[i - 2, j - 2] + 1);
                }
            }
        }

        return d[a.Length, b.Length];
    }
}
