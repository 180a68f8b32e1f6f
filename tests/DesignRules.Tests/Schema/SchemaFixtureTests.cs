namespace DesignRules.Tests.Schema;

/// <summary>The fixture pairs under Fixtures/schema: each accept file validates, each reject file fails.</summary>
public sealed class SchemaFixturesAreAcceptedOrRejected
{
    public static TheoryData<string> AcceptFixtures() => new(SchemaTestFiles.FixtureNames("accept"));

    public static TheoryData<string> RejectFixtures() => new(SchemaTestFiles.FixtureNames("reject"));

    [Theory]
    [MemberData(nameof(AcceptFixtures))]
    public void Every_accept_fixture_matches_its_schema(string name)
    {
        var text = File.ReadAllText(Path.Combine(SchemaTestFiles.Fixtures("accept"), name));
        var results = SchemaCheck.Evaluate(text, out var kind);
        Assert.True(results.IsValid, $"{name} ({kind}) should be valid:{Environment.NewLine}{SchemaCheck.Describe(results)}");
    }

    [Theory]
    [MemberData(nameof(RejectFixtures))]
    public void Every_reject_fixture_fails_its_schema(string name)
    {
        var text = File.ReadAllText(Path.Combine(SchemaTestFiles.Fixtures("reject"), name));
        var results = SchemaCheck.Evaluate(text, out var kind);
        Assert.False(results.IsValid, $"{name} ({kind}) should be rejected: {FirstLine(text)}");
    }

    [Theory]
    [MemberData(nameof(RejectFixtures))]
    public void Every_reject_fixture_says_on_its_first_line_what_is_wrong(string name)
    {
        var first = FirstLine(File.ReadAllText(Path.Combine(SchemaTestFiles.Fixtures("reject"), name)));
        Assert.StartsWith("# Rejected: ", first, StringComparison.Ordinal);
        Assert.True(first.Length > "# Rejected: ".Length + 10, $"{name}: the comment should say what is wrong");
    }

    [Theory]
    [MemberData(nameof(AcceptFixtures))]
    public void Every_accept_fixture_says_on_its_first_line_what_it_shows(string name)
    {
        var first = FirstLine(File.ReadAllText(Path.Combine(SchemaTestFiles.Fixtures("accept"), name)));
        Assert.StartsWith("# Accepted: ", first, StringComparison.Ordinal);
    }

    [Fact]
    public void There_are_at_least_twelve_reject_and_six_accept_fixtures()
    {
        Assert.True(SchemaTestFiles.FixtureNames("reject").Count() >= 12, "at least 12 reject fixtures");
        Assert.True(SchemaTestFiles.FixtureNames("accept").Count() >= 6, "at least 6 accept fixtures");
    }

    [Fact]
    public void Reject_fixtures_cover_both_file_kinds()
    {
        var kinds = SchemaTestFiles.FixtureNames("reject")
            .Select(n => SchemaCheck.KindOf(YamlAsJson.Convert(File.ReadAllText(Path.Combine(SchemaTestFiles.Fixtures("reject"), n)))))
            .ToHashSet();
        Assert.Contains(FileKind.Design, kinds);
        Assert.Contains(FileKind.Parts, kinds);
    }

    private static string FirstLine(string text) => text.Split('\n')[0].TrimEnd('\r');
}
