using DesignRules.Model;
using DesignRules.Simulation;

namespace DesignRules.Elaboration.Tests;

public sealed class PartConversionTests
{
    private const string Parts = """
        library:
          id: test-parts
        amplifiers:
          - id: asymmetric-15v
            description: Test amplifier with unequal slew rates (invented figures)
            gbw: 4 MHz
            slew-rate: { rising: 12 V/us, falling: 9 V/us }
            open-loop-gain: 100 dB
            second-pole: 20 MHz
            output-headroom: { positive: 1.2 V, negative: 1.8 V, at-load: 2k }
            output-resistance: 80
            output-current: 22 mA
            input-range: { positive: 2.5 V, negative: -0.1 V }
            offset-voltage: { typical: 0.5 mV, maximum: 2 mV }
            bias-current: { typical: 20 nA, maximum: 100 nA }
            supply-span: { minimum: 8 V, maximum: 36 V }
            max-differential-input: 15 V
            noise-density: 9 nV/rtHz
            current-noise: 0.3 pA/rtHz
            noise-corner: 40 Hz
            overload-recovery: 2 us
        diodes:
          - id: point-diode
            description: Test diode given by a forward-voltage point (invented figures)
            forward-voltage: { voltage: 0.7 V, current: 10 mA }
            emission: 1.9
            series-resistance: 2
            reverse-voltage: 75 V
            forward-current: 150 mA
        """;

    private static Design LoadDesign() => TestDesigns.Load("""
        design:
          id: parts
        libraries: [parts.yaml]
        supplies: { positive: 15 V, negative: -15 V }
        source: { waveform: dc, offset: 0.1 V }
        load: { resistance: 10k }
        stages:
          - { id: rect, block: half-wave-follower, amplifier: asymmetric-15v, diode: point-diode, values: { rload: 10k } }
        """, Parts);

    [Fact]
    public void Every_amplifier_figure_maps_one_to_one_onto_the_engine_model()
    {
        var part = ((BlockStage)LoadDesign().Stages[0]).Amplifiers["u1"];
        var model = PartModels.Amplifier(part, 1e-3, new BiasCurrents(2e-9, 3e-9));
        Assert.Equal(4e6, model.GainBandwidth, 6);
        Assert.Equal(1e5, model.OpenLoopGain, 3);                 // 100 dB = 10^(100/20) (definition of the decibel)
        Assert.Equal(12e6, model.SlewRateRising, 3);
        Assert.Equal(9e6, model.SlewRateFalling, 3);
        Assert.Equal(20e6, model.SecondPoleFrequency!.Value, 3);
        Assert.Equal(1.2, model.SwingHeadroomPositive, 12);
        Assert.Equal(1.8, model.SwingHeadroomNegative, 12);
        Assert.Equal(80, model.OutputResistance, 12);
        Assert.Equal(22e-3, model.OutputCurrentLimit!.Value, 12);
        Assert.Equal(1e-3, model.InputOffsetVoltage);
        Assert.Equal(2e-9, model.InputBiasCurrentNonInverting);
        Assert.Equal(3e-9, model.InputBiasCurrentInverting);
        Assert.Equal(2.5, model.CommonModeHeadroomPositive, 12);
        Assert.Equal(0, model.CommonModeHeadroomNegative);        // beyond the rail: the engine takes 0 (flags beyond-rail inputs)
        Assert.Equal(15, model.MaxDifferentialInput!.Value, 12);
        Assert.Equal(2e-6, model.OverloadRecoveryTime, 15);
        Assert.Equal(9e-9, model.InputVoltageNoise, 1e-21);
        Assert.Equal(0.3e-12, model.InputCurrentNoise, 1e-24);
        Assert.Equal(40, model.NoiseCorner, 12);
    }

    [Fact]
    public void Offset_and_bias_corners_take_zero_typical_or_maximum_figures()
    {
        var part = ((BlockStage)LoadDesign().Stages[0]).Amplifiers["u1"];
        Assert.Equal(0, PartModels.OffsetVoltage(part, OffsetCorner.Nominal));
        Assert.Equal(2e-3, PartModels.OffsetVoltage(part, OffsetCorner.MaximumPositive), 12);
        Assert.Equal(-2e-3, PartModels.OffsetVoltage(part, OffsetCorner.MaximumNegative), 12);
        Assert.Equal(new BiasCurrents(20e-9, 20e-9), PartModels.BiasCurrents(part, BiasCorner.Typical));
        Assert.Equal(new BiasCurrents(100e-9, 100e-9), PartModels.BiasCurrents(part, BiasCorner.Maximum));
        Assert.Equal(new BiasCurrents(0, 0), PartModels.BiasCurrents(part, BiasCorner.None));
    }

    [Fact]
    public void A_diode_given_by_a_forward_voltage_point_passes_through_that_point()
    {
        var part = ((BlockStage)LoadDesign().Stages[0]).Diodes["d1"];
        Assert.True(PartModels.TryDiode(part, 298.15, 1, out var model, out string problem), problem);

        // Shockley: Is = I/(exp(Vj/(n·V_T)) − 1) with Vj = Vf − I·Rs = 0.7 − 0.01·2 = 0.68 V and V_T = k·T/e from the exact
        // SI 2019 constants (k = 1.380649e-23 J/K, e = 1.602176634e-19 C) at 298.15 K.
        double vt = 1.380649e-23 * 298.15 / 1.602176634e-19;
        double expected = 0.01 / (Math.Exp(0.68 / (1.9 * vt)) - 1);
        Assert.Equal(expected, model.SaturationCurrent, expected * 1e-12);

        // The engine with that model: a 10 mA current source into the diode gives 0.7 V across it (series resistance included).
        var circuit = new Circuit().AddCurrentSource("i1", Circuit.Ground, "a", 0.01).AddDiode("d1", "a", Circuit.Ground, model);
        var op = Simulate.OperatingPoint(circuit);
        Assert.True(op.Succeeded, op.Failure?.ToString());
        Assert.Equal(0.7, op.Voltage("a"), 6);
    }

    [Fact]
    public void A_diode_given_by_its_saturation_current_keeps_it_and_scales_it_on_request()
    {
        var design = TestDesigns.Load("""
            design:
              id: scale
            supplies: { positive: 15 V, negative: -15 V }
            source: { waveform: dc, offset: 0.1 V }
            load: { resistance: 10k }
            stages:
              - { id: rect, block: half-wave-follower, amplifier: jfet-input-15v, diode: silicon-small-signal }
            """);
        var chain = TestDesigns.Elaborate(design, new ElaborationOptions { DiodeSaturationScale = 2, DiodeSaturationScales = new Dictionary<string, double> { ["rect.d1"] = 1.5 } });
        var diode = Assert.Single(chain.Stage("rect")!.Diodes);
        Assert.Equal(4e-9 * 3, diode.Model.SaturationCurrent, 1e-20);   // built-in silicon-small-signal: 4 nA
        Assert.Equal(1.9, diode.Model.EmissionCoefficient, 12);
        Assert.Equal(2.5e-12, diode.Model.JunctionCapacitance, 1e-24);
        Assert.Equal(90, diode.Model.BreakdownVoltage!.Value, 12);
    }
}
