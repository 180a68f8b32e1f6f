using DesignRules.Model;
using DesignRules.Simulation;

namespace DesignRules.Elaboration.Tests;

public sealed class ProbeNamingTests
{
    private static readonly Design Chain = TestDesigns.Load("""
        design:
          id: names
        supplies: { positive: 15 V, negative: -15 V }
        source: { waveform: sine, amplitude: 1 V, band: 20 Hz..20 kHz, impedance: 600 }
        load: { resistance: 10k, capacitance: 100 pF, returns-to: 1 V }
        stages:
          - id: rect
            block: absolute-value
            amplifier: jfet-input-15v
            diode: silicon-small-signal
            resistors: thin-film-1pct
            values: { r1: 10k, r2: 10k, r3: 10k, r4: 4.99k, r5: 10k }
          - id: hold
            block: peak-detector
            amplifier: jfet-input-15v
            diode: silicon-small-signal
            values: { rdis: 1M, chold: 100 nF, rser: 100, buffer: true }
          - id: smooth
            netlist:
              input: in
              output: out
              elements:
                - { id: r1, type: resistor, value: 10k, between: [in, mid] }
                - { id: c1, type: capacitor, value: 10 nF, between: [mid, ground] }
                - { id: u1, type: amplifier, part: jfet-input-15v, pins: { plus: mid, minus: out, output: out } }
        """);

    [Fact]
    public void Absolute_value_stage_names_its_nodes_amplifiers_and_diodes_after_the_stage()
    {
        var probe = ChainElaborator.Elaborate(Chain).Stage("rect")!;
        Assert.Equal("source.out", probe.InputNode);
        Assert.Equal("rect.out", probe.OutputNode);
        Assert.Equal(["rect.sum1", "rect.sum2"], probe.SummingJunctions);
        Assert.Equal([("rect.u1", "rect.u1.out"), ("rect.u2", "rect.out")], probe.Amplifiers.Select(a => (a.ElementId, a.OutputNode)));
        Assert.Equal([("rect.d1", "rect.u1.out", "rect.sum1"), ("rect.d2", "rect.hw", "rect.u1.out")], probe.Diodes.Select(d => (d.ElementId, d.Anode, d.Cathode)));
        Assert.Equal(["rect.r1", "rect.r2", "rect.r3", "rect.r4", "rect.r5"], probe.Components.Select(c => c.ElementId).Order());
        Assert.All(probe.Components, c => Assert.Equal("thin-film-1pct", c.ResistorFamily!.Id.Value));
        // vout = −(r5/r3·vin + r5/r4·vhw), vhw = −(r2/r1)·max(vin, 0): slopes 10k/4.99k − 1 and −1.
        Assert.Equal(TransferKind.AbsoluteValue, probe.Transfer.Kind);
        Assert.Equal((10e3 / 4.99e3) - 1, probe.Transfer.SlopePositive, 12);
        Assert.Equal(-1, probe.Transfer.SlopeNegative, 12);
    }

    [Fact]
    public void Stages_feed_each_other_node_to_node_and_the_netlist_keeps_its_element_ids()
    {
        var chain = ChainElaborator.Elaborate(Chain);
        Assert.True(chain.Succeeded, string.Join("\n", chain.Problems));
        var hold = chain.Stage("hold")!;
        Assert.Equal("rect.out", hold.InputNode);
        Assert.Equal("hold.out", hold.OutputNode);
        Assert.Equal(["hold.u1", "hold.u2"], hold.Amplifiers.Select(a => a.ElementId));
        Assert.Equal(1e-3 * 100, hold.TimeConstant!.Value, 9);       // rdis·chold = 1 MΩ · 100 nF
        var smooth = chain.Stage("smooth")!;
        Assert.Equal("hold.out", smooth.InputNode);
        Assert.Equal("smooth.out", smooth.OutputNode);
        Assert.Equal(["smooth.r1", "smooth.c1"], smooth.Components.Select(c => c.ElementId));
        Assert.Equal("smooth.mid", smooth.Amplifiers[0].NonInvertingNode);
        Assert.Equal("smooth.out", chain.OutputNode);
        Assert.True(chain.Circuit.ContainsElement("load.r") && chain.Circuit.ContainsElement("load.c") && chain.Circuit.ContainsElement("load.vret"));
        Assert.True(chain.Circuit.ContainsElement("source.rs"));
    }

    [Fact]
    public void Band_ends_set_the_test_frequency_and_the_transient_window()
    {
        var top = ChainElaborator.Elaborate(Chain);
        Assert.Equal(20e3, top.TestFrequency!.Value, 6);
        Assert.Equal(3 / 20e3, top.Window.MeasureFrom, 12);
        Assert.Equal(8 / 20e3, top.Window.StopTime, 12);
        Assert.Equal(1 / 20e3 / 200, top.Window.MaxStep, 15);
        var bottom = ChainElaborator.Elaborate(Chain, new ElaborationOptions { BandEnd = BandEnd.Bottom, AmplitudeScale = 2 });
        Assert.Equal(20, bottom.TestFrequency!.Value, 9);
        Assert.Equal(2, ((SineWaveform)bottom.SourceWaveform).Amplitude, 12);
        Assert.Equal(ChainElaborator.SourceId, bottom.SourceId);
    }
}
