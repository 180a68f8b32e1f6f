namespace DesignRules.Simulation.Numerics;

/// <summary>
/// A renumbering of the unknowns of a large system that gathers its non-zeros near the diagonal (reverse Cuthill–McKee,
/// 1969, on the symmetric pattern of A + Aᵀ), and the lower and upper bandwidths it gives. A signal chain numbered this
/// way is a narrow band: each stage couples only to the stage before and after it, so a banded LU costs time linear in
/// the chain's length where a dense LU costs its cube.
/// </summary>
internal sealed class BandOrdering
{
    private BandOrdering(int[] newOf, int[] oldOf, int lower, int upper)
    {
        NewOf = newOf;
        OldOf = oldOf;
        Lower = lower;
        Upper = upper;
    }

    /// <summary>Position in the ordered system of each original unknown.</summary>
    public int[] NewOf { get; }

    /// <summary>Original unknown at each position of the ordered system.</summary>
    public int[] OldOf { get; }

    /// <summary>Lower bandwidth of the ordered pattern (largest row − column of a non-zero).</summary>
    public int Lower { get; }

    /// <summary>Upper bandwidth of the ordered pattern (largest column − row of a non-zero).</summary>
    public int Upper { get; }

    /// <summary>Orders <paramref name="size"/> unknowns with the given non-zero positions (row, column).</summary>
    public static BandOrdering Compute(int size, IEnumerable<(int Row, int Column)> entries)
    {
        var neighbours = new List<int>[size];
        for (int i = 0; i < size; i++) neighbours[i] = [];
        var pattern = entries.Where(e => e.Row != e.Column).Distinct().ToList();
        foreach (var (r, c) in pattern)
        {
            neighbours[r].Add(c);
            neighbours[c].Add(r);
        }

        for (int i = 0; i < size; i++) neighbours[i] = [.. neighbours[i].Distinct().Order()];

        // Cuthill–McKee: breadth first from a node of least degree in each connected part, neighbours by rising degree.
        var order = new List<int>(size);
        var placed = new bool[size];
        foreach (int start in Enumerable.Range(0, size).OrderBy(i => neighbours[i].Count).ThenBy(i => i))
        {
            if (placed[start]) continue;
            placed[start] = true;
            int head = order.Count;
            order.Add(start);
            while (head < order.Count)
            {
                int node = order[head++];
                foreach (int next in neighbours[node].OrderBy(i => neighbours[i].Count).ThenBy(i => i))
                {
                    if (placed[next]) continue;
                    placed[next] = true;
                    order.Add(next);
                }
            }
        }

        order.Reverse();
        var oldOf = order.ToArray();
        var newOf = new int[size];
        for (int i = 0; i < size; i++) newOf[oldOf[i]] = i;
        int lower = 0, upper = 0;
        foreach (var (r, c) in pattern)
        {
            int d = newOf[c] - newOf[r];
            if (d > upper) upper = d;
            if (-d > lower) lower = -d;
        }

        return new BandOrdering(newOf, oldOf, lower, upper);
    }
}
