namespace DesignRules.Loading;

/// <summary>
/// Bounds on the size of one design, refused at load time with DR912 at the list that is too long, so that what is
/// accepted is analysed in seconds: every stage's worst case and Monte Carlo run the whole chain, so the cost grows
/// faster than the chain. The README's limits table lists these with the loader's bounds.
/// </summary>
public static class DesignLimits
{
    /// <summary>Most stages in one design's chain.</summary>
    public const int MaxStages = 8;

    /// <summary>Most components of a <c>sum</c> source.</summary>
    public const int MaxSumComponents = 16;

    /// <summary>Most elements in one netlist stage.</summary>
    public const int MaxNetlistElements = 100;

    /// <summary>Most distinct nodes in one netlist stage (ground and the rails not counted).</summary>
    public const int MaxNetlistNodes = 60;
}
