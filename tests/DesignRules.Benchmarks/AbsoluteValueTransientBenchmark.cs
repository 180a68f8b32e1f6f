using BenchmarkDotNet.Attributes;
using DesignRules.Elaboration;
using DesignRules.Loading;
using DesignRules.Simulation;

namespace DesignRules.Benchmarks;

/// <summary>
/// Transient of one absolute-value stage (two amplifiers, two diodes) driven at 20 kHz, over 10 periods with the
/// largest step a 200th of a period: the work a glitch or accuracy rule does for one precision-rectifier design.
/// </summary>
[MemoryDiagnoser]
public class AbsoluteValueTransientBenchmark
{
    private const string Design = """
        design:
          id: absolute-value-benchmark
        supplies: { positive: 15 V, negative: -15 V }
        source: { waveform: sine, amplitude: 2 V, frequency: 20 kHz, impedance: 100 }
        load: { resistance: 10k, capacitance: 100 pF }
        stages:
          - id: rect
            block: absolute-value
            amplifier: jfet-input-15v
            diode: silicon-small-signal
            resistors: thin-film-0p1pct
            values: { r1: 10k, r2: 10k, r3: 10k, r4: 5k, r5: 10k }
        """;

    private ElaboratedChain chain = null!;
    private TransientOptions options = null!;

    [GlobalSetup]
    public void Setup()
    {
        var loaded = new DesignLoader().LoadText("benchmark.yaml", Design);
        if (loaded.HasErrors) throw new InvalidOperationException(string.Join("\n", loaded.Diagnostics));
        chain = ChainElaborator.Elaborate(loaded.Designs[0], new ElaborationOptions { StartupPeriods = 0, MeasuredPeriods = 10 });
        if (!chain.Succeeded) throw new InvalidOperationException(string.Join("\n", chain.Problems));
        options = chain.Window.ToOptions();
    }

    [Benchmark]
    public int Elaborate() => ChainElaborator.Elaborate(chain.Design).Circuit.ElementCount;

    [Benchmark]
    public int TenPeriodsAt20kHz()
    {
        var result = Simulate.Transient(chain.Circuit, options);
        if (!result.Succeeded) throw new InvalidOperationException(result.Failure!.ToString());
        return result.Time.Count;
    }
}
