namespace DesignRules.Elaboration.Blocks;

/// <summary>Expands one built-in topology into engine elements (see the README's block table).</summary>
internal interface IBlockBuilder
{
    /// <summary>The block name used in design files.</summary>
    string Name { get; }

    /// <summary>Adds the block's elements for the stage and returns its probe.</summary>
    StageProbe Build(StageBuilder stage);
}

/// <summary>The builder of every built-in block, by name.</summary>
internal static class BlockBuilders
{
    public static IReadOnlyDictionary<string, IBlockBuilder> All { get; } = new IBlockBuilder[]
    {
        new InvertingBlock(), new NonInvertingBlock(), new FollowerBlock(), new DifferenceBlock(), new SummingBlock(),
        new HalfWaveInvertingBlock(), new HalfWaveFollowerBlock(), new AbsoluteValueBlock(), new PeakDetectorBlock(), new AveragingFilterBlock(),
    }.ToDictionary(b => b.Name, StringComparer.Ordinal);
}
