using DesignRules.Loading;
using DesignRules.Simulation;

namespace DesignRules.Elaboration.Tests;

public sealed class ExampleDesignTests
{
    public static TheoryData<string> DesignIds()
    {
        var data = new TheoryData<string>();
        foreach (var design in LoadExamples()) data.Add(design.Id.Value);
        return data;
    }

    [Theory]
    [MemberData(nameof(DesignIds))]
    public void Every_example_design_elaborates_and_runs_an_operating_point_and_a_transient_at_its_band_top(string id)
    {
        var design = LoadExamples().Single(d => d.Id.Value == id);
        var chain = TestDesigns.Elaborate(design, new ElaborationOptions { BandEnd = BandEnd.Top });

        var op = Simulate.OperatingPoint(chain.Circuit);
        Assert.True(op.Succeeded, op.Failure + " at " + (op.Failure is null ? "" : chain.Locate(op.Failure).ToString()));

        var transient = Simulate.Transient(chain.Circuit, chain.Window.ToOptions());
        Assert.True(transient.Succeeded, transient.Failure + " at " + (transient.Failure is null ? "" : chain.Locate(transient.Failure).ToString()));
        Assert.True(transient.Time[^1] >= chain.Window.StopTime * (1 - 1e-9));
        foreach (var stage in chain.Stages)
        {
            Assert.True(transient.HasNode(stage.OutputNode));
            foreach (var amplifier in stage.Amplifiers) Assert.Equal(amplifier.OutputNode, transient.Amplifier(amplifier.ElementId).OutputNode);
        }
    }

    private static IReadOnlyList<DesignRules.Model.Design> LoadExamples()
    {
        var root = Path.Combine(TestDesigns.RepositoryRoot(), "example-design");
        var files = RepositoryFiles.Find([root], out var missing);
        Assert.Empty(missing);
        var result = DesignLoader.LoadFiles(files);
        Assert.False(result.HasErrors, string.Join("\n", result.Diagnostics));
        Assert.NotEmpty(result.Designs);
        return result.Designs;
    }
}
