using BenchmarkDotNet.Attributes;
using DesignRules.Elaboration;
using DesignRules.Loading;
using DesignRules.Simulation;

namespace DesignRules.Benchmarks;

/// <summary>
/// The noise analyses a full check of the example adds: the two stages of the compressor vibration envelope that state a
/// noise requirement (the preamp's snr, the rectifier's min-signal), each over the source's 10 Hz..2 kHz band to the
/// default tolerance, the rectifier linearised at the level it passes, on the chain compiled once for noise as the figures
/// layer does (<c>DesignAnalyses.Noise</c>: one compilation, one operating point per input level). The chain itself is
/// elaborated in the setup: a full check has it already. Compare with <see cref="CheckAndPagesBenchmark"/>.
/// </summary>
[MemoryDiagnoser]
public class NoiseBenchmark
{
    private ElaboratedChain chain = null!;
    private NoiseRequest[] requests = null!;

    [GlobalSetup]
    public void Setup()
    {
        var root = Path.Combine(typeof(NoiseBenchmark).Assembly
            .GetCustomAttributes(typeof(System.Reflection.AssemblyMetadataAttribute), false)
            .Cast<System.Reflection.AssemblyMetadataAttribute>().Single(a => a.Key == "RepositoryRoot").Value!, "example-design");
        var loaded = new DesignLoader().Load([Path.Combine(root, "designs", "compressor-vibration-envelope.yaml")]);
        if (loaded.HasErrors) throw new InvalidOperationException(string.Join("\n", loaded.Diagnostics));
        chain = ChainElaborator.Elaborate(loaded.Designs[0], ElaborationOptions.Default);
        if (!chain.Succeeded) throw new InvalidOperationException(string.Join("\n", chain.Problems));
        requests =
        [
            new NoiseRequest(chain.Stage("preamp")!.OutputNode, chain.SourceId, 10, 2e3),
            new NoiseRequest(chain.Stage("rectifier")!.OutputNode, chain.SourceId, 10, 2e3) { InputLevel = 0.3 },
        ];
    }

    [Benchmark(Description = "noise analyses of the example's two noise-checked stages")]
    public double NoiseOfTheExample()
    {
        var circuit = NoiseCircuit.Compile(chain.Circuit);
        return requests.Sum(r => circuit.Analyse(r).OutputRms);
    }
}
