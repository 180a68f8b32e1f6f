namespace DesignRules.Loading;

/// <summary>
/// Bounds on the size of one design, refused at load time with DR912 at the list that is too long, so that what is
/// accepted is analysed in seconds. Large systems are solved as a band, so a stage costs about the same however long
/// the chain; what still grows with the chain is that every stage's worst case and Monte Carlo solve the whole chain
/// (the stages load each other), so a chain of n stages with a Monte Carlo on each costs about n² small solves. The
/// README's limits table lists these with the loader's bounds.
/// </summary>
public static class DesignLimits
{
    /// <summary>Most stages in one design's chain.</summary>
    public const int MaxStages = 32;

    /// <summary>Most components of a <c>sum</c> source.</summary>
    public const int MaxSumComponents = 64;

    /// <summary>Most elements in one netlist stage.</summary>
    public const int MaxNetlistElements = 400;

    /// <summary>Most distinct nodes in one netlist stage (ground and the rails not counted).</summary>
    public const int MaxNetlistNodes = 240;
}
