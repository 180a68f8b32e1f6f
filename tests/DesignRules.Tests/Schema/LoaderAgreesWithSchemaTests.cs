using DesignRules.Diagnostics;
using DesignRules.Loading;

namespace DesignRules.Tests.Schema;

/// <summary>The loader and the JSON Schema agree on which fixture files are acceptable.</summary>
public sealed class LoaderAgreesWithSchemaTests
{
    public static TheoryData<string> Accepted() => Names("accept");

    public static TheoryData<string> Rejected() => Names("reject");

    [Theory]
    [MemberData(nameof(Accepted))]
    public void The_loader_accepts_what_the_schema_accepts(string name)
    {
        var result = DesignLoader.LoadFiles([Path.Combine(SchemaTestFiles.Fixtures("accept"), name)]);
        Assert.True(!result.HasErrors, name + ": " + string.Join(Environment.NewLine, result.Diagnostics));
    }

    [Theory]
    [MemberData(nameof(Rejected))]
    public void The_loader_rejects_what_the_schema_rejects_with_a_located_error(string name)
    {
        var path = Path.Combine(SchemaTestFiles.Fixtures("reject"), name);
        var result = DesignLoader.LoadFiles([path]);
        Assert.Contains(result.Diagnostics, d => d.Severity == Severity.Error && d.Span.Line > 1);
        Assert.Empty(result.Designs);
    }

    private static TheoryData<string> Names(string folder)
    {
        var data = new TheoryData<string>();
        foreach (var name in SchemaTestFiles.FixtureNames(folder))
        {
            data.Add(name);
        }

        return data;
    }
}
