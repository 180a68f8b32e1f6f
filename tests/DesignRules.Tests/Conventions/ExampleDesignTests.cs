using DesignRules.Loading;
using DesignRules.Tests.Loading;

namespace DesignRules.Tests.Conventions;

/// <summary>The shipped examples and library stay clean.</summary>
public sealed class ExampleDesignTests
{
    [Fact]
    public void Every_example_design_and_parts_file_loads_without_diagnostics()
    {
        var root = Path.Combine(FixtureFiles.RepositoryRoot(), "example-design");
        var files = RepositoryFiles.Find([root], out var missing);
        Assert.Empty(missing);

        var result = DesignLoader.LoadFiles(files);

        Assert.True(result.Diagnostics.Count == 0, string.Join(Environment.NewLine, result.Diagnostics));
        Assert.True(result.Designs.Count >= 2, $"only {result.Designs.Count} example designs");
    }

    [Fact]
    public void The_built_in_library_marks_every_amplifier_and_diode_as_typical()
    {
        var result = new DesignLoader().LoadText("probe.yaml", "library:\n  id: probe\n");
        var builtin = result.Libraries.Single(l => l.File == DesignLoader.BuiltinLibraryFile);
        Assert.NotEmpty(builtin.Amplifiers);
        Assert.All(builtin.Amplifiers, a => Assert.True(a.Typical, a.Id.Value));
        Assert.All(builtin.Diodes, d => Assert.True(d.Typical, d.Id.Value));
        Assert.Empty(result.Diagnostics);
    }
}
