using DesignRules.Simulation;

namespace DesignRules.Elaboration.Tests;

public sealed class ElaborationProblemTests
{
    [Fact]
    public void An_amplifier_the_supplies_cannot_power_is_a_problem_located_at_its_stage()
    {
        // jfet-input-15v needs 1.5 V of output headroom to each rail: ±1 V rails leave it no output range.
        var design = TestDesigns.Load(TestDesigns.DcDesign("""
              - id: amp
                block: follower
                amplifier: jfet-input-15v
            """, level: 0.1, supplies: "{ positive: 1 V, negative: -1 V }"));
        var chain = ChainElaborator.Elaborate(design);
        var problem = Assert.Single(chain.Problems);
        Assert.Equal("amp.u1", problem.ElementId);
        // Located where the part is named (the stage itself when the loader recorded no part span).
        var stage = (DesignRules.Model.BlockStage)design.Stages[0];
        var expected = stage.PartSpans.GetValueOrDefault("u1") ?? stage.Span;
        Assert.Equal(expected, problem.Span);
        var op = Simulate.OperatingPoint(chain.Circuit);
        Assert.False(op.Succeeded);
        Assert.Equal(expected, chain.Locate(op.Failure!));
    }

    [Fact]
    public void A_netlist_node_without_a_dc_path_fails_the_analysis_and_is_located_at_its_stage()
    {
        var design = TestDesigns.Load(TestDesigns.DcDesign("""
              - id: net
                netlist:
                  input: in
                  output: out
                  elements:
                    - { id: c1, type: capacitor, value: 1 nF, between: [in, out] }
                    - { id: c2, type: capacitor, value: 1 nF, between: [out, mid] }
                    - { id: c3, type: capacitor, value: 1 nF, between: [mid, vneg] }
            """));
        var chain = ChainElaborator.Elaborate(design);
        Assert.True(chain.Succeeded);
        var op = Simulate.OperatingPoint(chain.Circuit);
        Assert.False(op.Succeeded);
        Assert.True(chain.Circuit.ContainsNode("net.mid"));
        var span = chain.Locate(op.Failure!);
        Assert.Equal(design.File, span.File);
        Assert.True(span.Line > 1, op.Failure!.ToString());
    }
}
