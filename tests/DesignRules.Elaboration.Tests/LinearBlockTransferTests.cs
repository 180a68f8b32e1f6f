using DesignRules.Simulation;

namespace DesignRules.Elaboration.Tests;

/// <summary>
/// Each linear block's low-frequency transfer equals its textbook formula within the open-loop-gain error: with a finite
/// open-loop gain A0 and noise gain NG the closed-loop gain is G·1/(1 + NG/A0), so it falls short by about NG/A0
/// (textbook: closed-loop gain of a feedback amplifier, A/(1 + Aβ) with NG = 1/β).
/// </summary>
public sealed class LinearBlockTransferTests
{
    // jfet-input-15v: open-loop-gain 100 dB = 10^(100/20) = 100 000 V/V (built-in library; dB to ratio by definition).
    private static readonly double A0 = Math.Pow(10, 100.0 / 20);

    [Fact]
    public void Inverting_gain_is_minus_rf_over_rin()
    {
        var gain = MeasureSlope("""
              - id: amp
                block: inverting
                amplifier: jfet-input-15v
                values: { rin: 10k, rf: 47k, rcomp: 8.2k }
            """, "amp");
        // Textbook: G = −rf/rin; noise gain 1 + rf/rin.
        AssertWithinGainError(-47e3 / 10e3, 1 + (47e3 / 10e3), gain);
    }

    [Fact]
    public void Non_inverting_gain_is_one_plus_rf_over_rg()
    {
        var gain = MeasureSlope("""
              - id: amp
                block: non-inverting
                amplifier: jfet-input-15v
                values: { rg: 10k, rf: 30.1k }
            """, "amp");
        // Textbook: G = 1 + rf/rg = noise gain.
        AssertWithinGainError(1 + (30.1e3 / 10e3), 1 + (30.1e3 / 10e3), gain);
    }

    [Fact]
    public void Follower_gain_is_one()
    {
        var gain = MeasureSlope("""
              - id: buf
                block: follower
                amplifier: jfet-input-15v
            """, "buf");
        // Textbook: unity follower, noise gain 1.
        AssertWithinGainError(1, 1, gain);
    }

    [Fact]
    public void Summing_output_is_minus_rf_times_the_sum_of_input_and_bias_currents()
    {
        var design = TestDesigns.Load(TestDesigns.DcDesign("""
              - id: sum
                block: summing
                amplifier: jfet-input-15v
                values: { r1: 10k, rf: 20k, r2: 40k, bias: -2 V }
            """));
        var chain = TestDesigns.Elaborate(design);
        var sweep = Simulate.DcSweep(chain.Circuit, chain.SourceId, [-1.0, 0.0, 1.0]);
        Assert.True(sweep.Succeeded, sweep.Failure?.ToString());
        var output = sweep.Voltage("sum.out");
        // Textbook inverting summer: vout = −rf·(vin/r1 + bias/r2); noise gain 1 + rf/(r1 ∥ r2) = 1 + 20k/8k = 3.5.
        double noiseGain = 1 + (20e3 / (1 / ((1 / 10e3) + (1 / 40e3))));
        for (int i = 0; i < 3; i++)
        {
            double vin = i - 1;
            double ideal = -20e3 * ((vin / 10e3) + (-2 / 40e3));
            Assert.True(Math.Abs(output[i] - ideal) <= (2 * noiseGain / A0 * Math.Abs(ideal)) + 1e-5, $"{output[i]} vs {ideal}");
        }

        Assert.Equal(-2.0, chain.Stage("sum")!.Transfer.SlopePositive, 12);
        Assert.Equal(1.0, chain.Stage("sum")!.Transfer.Offset, 12);
    }

    [Fact]
    public void Difference_output_is_r2_over_r1_times_the_differential_input_and_rejects_the_common_mode()
    {
        var design = TestDesigns.Load("""
            design:
              id: bridge
            supplies: { positive: 15 V, negative: -15 V }
            source: { waveform: dc, offset: 10 mV, common-mode: 5 V, impedance: 350 }
            load: { resistance: 1M }
            stages:
              - id: diff
                block: difference
                amplifier: jfet-input-15v
                values: { r1: 10k, r2: 100k, r3: 10k, r4: 100k }
            """);
        var chain = TestDesigns.Elaborate(design);
        var probe = chain.Stage("diff")!;
        Assert.Equal("source.p", probe.InputNode);
        Assert.Equal("source.n", probe.ReferenceInputNode);
        var sweep = Simulate.DcSweep(chain.Circuit, chain.SourceId, [-0.1, 0.0, 0.1]);
        Assert.True(sweep.Succeeded, sweep.Failure?.ToString());
        var output = sweep.Voltage("diff.out");
        var plus = sweep.Voltage("source.p");
        var minus = sweep.Voltage("source.n");

        // Textbook difference amplifier with r2/r1 = r4/r3: vout = (r2/r1)·(v+ − v−); noise gain 1 + r2/r1 = 11.
        double gain = (output[2] - output[0]) / ((plus[2] - minus[2]) - (plus[0] - minus[0]));
        AssertWithinGainError(10, 11, gain);

        // Common mode 5 V, no differential signal: matched ratios reject it; what is left is the finite-gain term,
        // about vcm·(r4/(r3 + r4))·NG/A0 at the input times the noise gain (textbook CMRR of a matched difference amplifier).
        Assert.True(Math.Abs(output[1]) < 5 * 11 * 11 / A0, $"{output[1]}");
        Assert.Equal(10.0, probe.Transfer.SlopePositive, 12);
        Assert.Equal(0.0, probe.Transfer.Offset, 12);
    }

    private static double MeasureSlope(string stageYaml, string stageId)
    {
        var chain = TestDesigns.Elaborate(TestDesigns.Load(TestDesigns.DcDesign(stageYaml)));
        var sweep = Simulate.DcSweep(chain.Circuit, chain.SourceId, [-0.5, 0.5]);
        Assert.True(sweep.Succeeded, sweep.Failure?.ToString());
        var output = sweep.Voltage(chain.Stage(stageId)!.OutputNode);
        double measured = output[1] - output[0];
        Assert.Equal(chain.Stage(stageId)!.Transfer.Gain, measured, 2);
        return measured;
    }

    private static void AssertWithinGainError(double ideal, double noiseGain, double measured)
    {
        double expectedShortfall = noiseGain / A0;
        double relative = (measured / ideal) - 1;
        // The gain falls short of the ideal by about NG/A0 (1/(1 + NG/A0) ≈ 1 − NG/A0); allow half as much again.
        Assert.True(relative <= 1e-9 && -relative <= 1.5 * expectedShortfall, $"gain {measured} vs {ideal}: relative error {relative:E3}, NG/A0 = {expectedShortfall:E3}");
    }
}
