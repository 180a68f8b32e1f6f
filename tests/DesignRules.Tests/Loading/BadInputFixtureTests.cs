using System.Text.RegularExpressions;
using DesignRules.Loading;

namespace DesignRules.Tests.Loading;

/// <summary>
/// Each file under Fixtures/loader/bad states on its first line the diagnostic it must produce:
/// <c># expect: DR9nn at [file:]line:column</c>. The loader must report exactly that id at that place, and never throw.
/// </summary>
public sealed partial class BadInputFixtureTests
{
    public static TheoryData<string> Files()
    {
        var data = new TheoryData<string>();
        foreach (var file in FixtureFiles.Yaml("loader/bad"))
        {
            data.Add(Path.GetFileName(file));
        }

        return data;
    }

    [Fact]
    public void There_are_at_least_twenty_five_bad_input_fixtures() =>
        Assert.True(Files().Count >= 25, $"only {Files().Count} fixtures");

    [Theory]
    [MemberData(nameof(Files))]
    public void Each_bad_file_yields_its_stated_diagnostic_at_its_stated_position(string name)
    {
        var path = Path.Combine(FixtureFiles.Directory("loader/bad"), name);
        var header = File.ReadLines(path).First();
        var expect = Expectation().Match(header);
        Assert.True(expect.Success, $"{name}: first line must be '# expect: DR9nn at [file:]line:col', was '{header}'");

        var result = DesignLoader.LoadFiles([path]);

        Assert.Empty(result.Designs);
        var id = expect.Groups["id"].Value;
        var file = expect.Groups["file"].Success ? expect.Groups["file"].Value : name;
        var line = int.Parse(expect.Groups["line"].Value);
        var column = int.Parse(expect.Groups["col"].Value);
        Assert.Contains(result.Diagnostics, d =>
            d.Id == id && d.Span.File.Replace('\\', '/').EndsWith(file, StringComparison.Ordinal) &&
            d.Span.Line == line && d.Span.Column == column);
    }

    [GeneratedRegex(@"^# expect: (?<id>DR9\d\d) at (?:(?<file>[\w./-]+\.yaml):)?(?<line>\d+):(?<col>\d+)$")]
    private static partial Regex Expectation();
}
