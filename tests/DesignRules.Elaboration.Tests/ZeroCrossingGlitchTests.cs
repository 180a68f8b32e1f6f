using DesignRules.Simulation;
using Xunit.Abstractions;

namespace DesignRules.Elaboration.Tests;

public sealed class ZeroCrossingGlitchTests(ITestOutputHelper output)
{
    // A slew-limited amplifier class for this test (invented figures, no particular part): 0.5 V/µs with a 100 MHz GBW,
    // so it slews as soon as the input error exceeds SR/ωu ≈ 0.8 mV (single-pole slew model, textbook) and its linear
    // settling (closed-loop τ of a few ns) is negligible next to the slew time, and no
    // overload-recovery figure, so recovery from the rail costs slew time only.
    private const string Parts = """
        library:
          id: test-parts
        amplifiers:
          - id: slew-limited-15v
            description: Slew-limited test amplifier, ±15 V class (typical values)
            typical: true
            gbw: 100 MHz
            slew-rate: 0.5 V/us
            open-loop-gain: 106 dB
            output-headroom: { positive: 1.5 V, negative: 1.5 V }
            output-resistance: 50
            output-current: 20 mA
            input-range: { positive: 2 V, negative: 2 V }
            offset-voltage: { typical: 0 mV, maximum: 1 mV }
            bias-current: { typical: 0 pA, maximum: 100 pA }
            supply-span: { minimum: 10 V, maximum: 36 V }
        """;

    [Fact]
    public void The_follower_rectifier_recovers_from_its_rail_while_the_two_diode_form_only_crosses_the_diode_dead_zone()
    {
        // Low resistances (1 kΩ) keep the diodes' 2 pF from carrying a noticeable share of the crossing current.
        var follower = Run("{ id: rect, block: half-wave-follower, amplifier: slew-limited-15v, diode: silicon-small-signal, values: { rload: 1k } }");
        var inverting = Run("{ id: rect, block: half-wave-inverting, amplifier: slew-limited-15v, diode: silicon-small-signal, values: { rin: 1k, rf: 1k } }");
        output.WriteLine($"follower: glitch {follower.Width * 1e6:F3} us, amplifier jump {follower.Jump:F3} V; inverting: glitch {inverting.Width * 1e6:F3} us, jump {inverting.Jump:F3} V");

        // The follower's amplifier sits at its negative swing limit (−15 V + 1.5 V headroom) while the diode is off ...
        Assert.True(follower.LowestOutput < -13.5 + 0.01 && follower.LowestOutput > -13.5 - 0.01, $"{follower.LowestOutput}");
        Assert.True(follower.AtSwingLimitWhileBlocking);
        // ... so at a zero crossing it must climb the whole swing plus a diode drop (and the input's rise meanwhile).
        Assert.True(follower.Jump > 13.5 + 0.2, $"{follower.Jump}");
        // The two-diode form never leaves the diode region: it jumps about two diode drops, each below the part's
        // 0.73 V at 10 mA (built-in library description) because the current is small near the crossing.
        Assert.True(inverting.Jump > 0.3 && inverting.Jump < 2 * 0.73, $"{inverting.Jump}");
        Assert.True(inverting.LowestOutput > -5.0 - 0.73);

        // Slew relation of the design primer: t ≈ ΔV/SR for each form (SR 0.5 V/µs), within 20 % (common practice) ...
        Assert.InRange(follower.Width, 0.8 * follower.Jump / 0.5e6, 1.2 * follower.Jump / 0.5e6);
        Assert.InRange(inverting.Width, 0.8 * inverting.Jump / 0.5e6, 1.2 * inverting.Jump / 0.5e6);
        // ... so the glitch widths stand in the ratio (swing + Vf)/(2·Vf) of the jumps, within 20 %.
        double ratio = follower.Width / inverting.Width, predicted = follower.Jump / inverting.Jump;
        Assert.InRange(ratio, 0.8 * predicted, 1.2 * predicted);
        Assert.True(ratio > 10, $"{ratio}");

        // The engine's own glitch measurement (out-of-band intervals near input zero crossings) agrees.
        double engineRatio = follower.EngineGlitch / inverting.EngineGlitch;
        output.WriteLine($"engine glitch widths: follower {follower.EngineGlitch * 1e6:F3} us, inverting {inverting.EngineGlitch * 1e6:F3} us");
        Assert.InRange(engineRatio, 0.8 * predicted, 1.2 * predicted);
    }

    private sealed record Crossing(double Width, double Jump, double LowestOutput, bool AtSwingLimitWhileBlocking, double EngineGlitch);

    /// <summary>
    /// Drives the stage with 5 V peak at 1 kHz and measures, after each rising zero crossing of the input in the measured
    /// window, how long the stage output stays more than 10 mV from its ideal transfer (the glitch), and how far the
    /// amplifier output moves over that time.
    /// </summary>
    private Crossing Run(string stage)
    {
        var design = TestDesigns.Load($$"""
            design:
              id: glitch
            libraries: [parts.yaml]
            supplies: { positive: 15 V, negative: -15 V }
            source: { waveform: sine, amplitude: 5 V, frequency: 1 kHz }
            load: { resistance: 1M }
            stages:
              - {{stage}}
            """, Parts);
        var chain = TestDesigns.Elaborate(design);
        var result = Simulate.Transient(chain.Circuit, chain.Window.ToOptions() with { MaxStep = 0.1e-6 });
        Assert.True(result.Succeeded, result.Failure?.ToString());
        var probe = chain.Stage("rect")!;
        var time = result.Time;
        var vin = result.Voltage(chain.SourceOutputNode);
        var vout = result.Voltage(probe.OutputNode);
        var amplifier = result.Voltage(probe.Amplifiers[0].OutputNode);
        var flags = result.Amplifier(probe.Amplifiers[0].ElementId).AtSwingLimit;
        double period = chain.Period!.Value, band = 0.010;
        var widths = new List<double>();
        var jumps = new List<double>();
        for (int i = 1; i < time.Count; i++)
        {
            if (time[i] < chain.Window.MeasureFrom || !(vin[i - 1] < 0 && vin[i] >= 0)) continue;
            double crossing = time[i - 1] + ((time[i] - time[i - 1]) * -vin[i - 1] / (vin[i] - vin[i - 1]));
            double last = crossing;
            for (int j = i; j < time.Count && time[j] < crossing + (period / 4); j++)
            {
                if (Math.Abs(vout[j] - probe.Transfer.At(vin[j])) > band) last = time[j];
            }

            widths.Add(last - crossing);
            jumps.Add(Math.Abs(Waveforms.Interpolate(time, amplifier, last) - Waveforms.Interpolate(time, amplifier, crossing)));
        }

        Assert.NotEmpty(widths);
        var blocking = Enumerable.Range(0, time.Count).Where(i => time[i] > chain.Window.MeasureFrom && vin[i] < -1).ToArray();
        var engine = TransferError.Measure(time, vin, vout, probe.Transfer.At, band, chain.Window.MeasureFrom);
        return new Crossing(widths.Average(), jumps.Average(), blocking.Min(i => amplifier[i]), blocking.All(i => flags[i]), engine.WorstGlitchWidth);
    }
}
