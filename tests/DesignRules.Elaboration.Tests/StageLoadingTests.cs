using DesignRules.Simulation;

namespace DesignRules.Elaboration.Tests;

/// <summary>Stages, source and load are joined node to node, so each loads the other as the real circuit does.</summary>
public sealed class StageLoadingTests
{
    [Fact]
    public void Source_impedance_adds_to_the_input_resistor_of_an_inverting_stage()
    {
        var design = TestDesigns.Load(TestDesigns.DcDesign("""
              - id: amp
                block: inverting
                amplifier: jfet-input-15v
                values: { rin: 10k, rf: 100k }
            """, sourceExtra: ", impedance: 2.2k"));
        var chain = TestDesigns.Elaborate(design);
        var sweep = Simulate.DcSweep(chain.Circuit, chain.SourceId, [-0.5, 0.5]);
        Assert.True(sweep.Succeeded, sweep.Failure?.ToString());
        var output = sweep.Voltage("amp.out");
        // Textbook: the source impedance is in series with rin, gain = −rf/(rin + Rs) = −100k/12.2k; open-loop-gain error ≈ NG/A0 ≈ 5e-5.
        double expected = -100e3 / (10e3 + 2.2e3);
        Assert.True(Math.Abs(((output[1] - output[0]) / expected) - 1) < 1e-4, $"{output[1] - output[0]} vs {expected}");
        // The block's ideal transfer is the stage's own (−rf/rin); the source loss shows only in the circuit.
        Assert.Equal(-10.0, chain.Stage("amp")!.Transfer.Gain, 12);
    }

    [Fact]
    public void A_heavy_next_stage_input_divides_the_previous_stage_output()
    {
        // An unbuffered RC filter (r = 10k) feeding an inverting stage whose rin (10k) goes to a virtual ground: at DC
        // the filter output is vin·rin/(r + rin), a divider, instead of vin when unloaded (textbook voltage divider).
        const string filter = """
              - id: avg
                block: averaging-filter
                resistors: thin-film-1pct
                capacitors: c0g-5pct
                values: { r: 10k, c: 10 nF }
            """;
        var loaded = Operate(filter + "\n" + """
              - id: amp
                block: inverting
                amplifier: jfet-input-15v
                values: { rin: 10k, rf: 10k }
            """);
        var unloaded = Operate(filter + "\n" + """
              - id: amp
                block: follower
                amplifier: jfet-input-15v
            """);

        Assert.Equal(1.0, unloaded.Voltage("avg.out"), 4);          // the follower draws only its bias current
        Assert.Equal(1.0 * 10e3 / (10e3 + 10e3), loaded.Voltage("avg.out"), 4);
        Assert.Equal(-0.5, loaded.Voltage("amp.out"), 4);           // −rf/rin of the divided level
    }

    private static OperatingPointResult Operate(string stages)
    {
        var chain = TestDesigns.Elaborate(TestDesigns.Load(TestDesigns.DcDesign(stages)));
        Assert.Equal("avg.out", chain.Stages[1].InputNode);
        var op = Simulate.OperatingPoint(chain.Circuit);
        Assert.True(op.Succeeded, op.Failure?.ToString());
        return op;
    }
}
