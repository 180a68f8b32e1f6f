namespace DesignRules.Build.Tests;

/// <summary>Tests that consume the packed package share one pack and run one after another.</summary>
[CollectionDefinition(Name)]
public sealed class PackedFeedGroup : ICollectionFixture<PackedFeed>
{
    public const string Name = "packed DesignRules.Build";
}
