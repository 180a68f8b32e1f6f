using DesignRules.Simulation;

namespace DesignRules.Elaboration.Tests;

public sealed class ElaborationOptionTests
{
    private const string Follower = """
          - id: buf
            block: non-inverting
            amplifier: jfet-input-15v
            values: { rg: 10k, rf: 10k }
        """;

    [Fact]
    public void A_value_override_replaces_the_component_value_by_its_element_id()
    {
        var design = TestDesigns.Load(TestDesigns.DcDesign(Follower));
        var chain = TestDesigns.Elaborate(design, new ElaborationOptions { Values = new Dictionary<string, double> { ["buf.rf"] = 30e3 } });
        var op = Simulate.OperatingPoint(chain.Circuit);
        Assert.True(op.Succeeded);
        Assert.Equal(4.0, op.Voltage("buf.out"), 3);                  // 1 + 30k/10k, textbook non-inverting gain, 1 V in
        var rf = chain.Stage("buf")!.Components.Single(c => c.Name == "rf");
        Assert.Equal((30e3, 10e3), (rf.Value, rf.NominalValue));
    }

    [Fact]
    public void Offset_corners_and_per_amplifier_offsets_move_the_output_by_the_noise_gain()
    {
        var design = TestDesigns.Load(TestDesigns.DcDesign(Follower, level: 0));
        // jfet-input-15v: offset maximum 8 mV (built-in library); output offset = Vos·(1 + rf/rg) = 16 mV (textbook).
        var worst = TestDesigns.Elaborate(design, new ElaborationOptions { Offset = OffsetCorner.MaximumNegative, Bias = BiasCorner.None });
        Assert.Equal(-0.016, Simulate.OperatingPoint(worst.Circuit).Voltage("buf.out"), 4);
        var own = TestDesigns.Elaborate(design, new ElaborationOptions { OffsetVoltages = new Dictionary<string, double> { ["buf.u1"] = 3e-3 }, Bias = BiasCorner.None });
        Assert.Equal(0.006, Simulate.OperatingPoint(own.Circuit).Voltage("buf.out"), 4);
        Assert.Equal(3e-3, own.Stage("buf")!.Amplifiers[0].Model.InputOffsetVoltage);
    }

    [Fact]
    public void An_override_naming_no_element_is_a_problem_not_an_exception()
    {
        var design = TestDesigns.Load(TestDesigns.DcDesign(Follower));
        var chain = ChainElaborator.Elaborate(design, new ElaborationOptions { Values = new Dictionary<string, double> { ["buf.r9"] = 1 } });
        var problem = Assert.Single(chain.Problems);
        Assert.Equal("buf.r9", problem.ElementId);
        Assert.False(chain.Succeeded);
    }
}
