using BenchmarkDotNet.Attributes;
using DesignRules.Simulation;

namespace DesignRules.Benchmarks;

/// <summary>
/// Engine throughput on the analyses the rules run most: a DC sweep, an AC sweep, many operating points of perturbed
/// stages (tolerance analysis) and a transient of a two-amplifier, two-diode circuit.
/// BenchmarkDotNet needs benchmark classes to be public and unsealed.
/// </summary>
[MemoryDiagnoser]
public class EngineBenchmarks
{
    private static readonly SupplyRails Rails = new(15, -15);
    private static readonly AmplifierModel Amplifier = AmplifierModel.SinglePole(1e6, 1e5, 8e6) with
    {
        SwingHeadroomPositive = 1.5,
        SwingHeadroomNegative = 1.5,
        OutputCurrentLimit = 25e-3,
    };

    private Circuit inverting = null!;
    private Circuit rectifier = null!;
    private double[] sweepValues = null!;
    private AcSweep acSweep = null!;

    [GlobalSetup]
    public void Setup()
    {
        inverting = InvertingStage(10e3, 1e3);
        rectifier = PrecisionFullWaveRectifier();
        sweepValues = [.. Enumerable.Range(0, 101).Select(i => -2 + (0.04 * i))];
        acSweep = new AcSweep("vin", [.. Enumerable.Range(0, 200).Select(i => 10 * Math.Pow(10, 6.0 * i / 199))]);
    }

    /// <summary>Inverting stage of gain −rf/rin with a 10 kΩ load, driven by <paramref name="input"/> volts DC (and 1 V AC).</summary>
    public static Circuit InvertingStage(double rf, double rin, double input = 0) => new Circuit()
        .AddVoltageSource("vin", "in", Circuit.Ground, new DcWaveform(input))
        .AddResistor("rin", "in", "sum", rin)
        .AddResistor("rf", "sum", "out", rf)
        .AddResistor("load", "out", Circuit.Ground, 10e3)
        .AddAmplifier("u1", Circuit.Ground, "sum", "out", Amplifier, Rails);

    /// <summary>Two-diode inverting half-wave rectifier summed with the input: |vin| at 20 kHz.</summary>
    public static Circuit PrecisionFullWaveRectifier() => new Circuit()
        .AddVoltageSource("vin", "in", Circuit.Ground, new SineWaveform(1, 20e3))
        .AddResistor("r1", "in", "sum1", 10e3)
        .AddAmplifier("u1", Circuit.Ground, "sum1", "o1", Amplifier, Rails)
        .AddDiode("d1", "o1", "sum1")
        .AddDiode("d2", "hw", "o1")
        .AddResistor("r2", "hw", "sum1", 10e3)
        .AddResistor("r3", "in", "sum2", 20e3)
        .AddResistor("r4", "hw", "sum2", 10e3)
        .AddResistor("rf2", "sum2", "out", 20e3)
        .AddAmplifier("u2", Circuit.Ground, "sum2", "out", Amplifier, Rails);

    [Benchmark(Description = "DC sweep, 101 points, inverting stage")]
    public DcSweepResult DcSweep101() => Simulate.DcSweep(inverting, "vin", sweepValues);

    [Benchmark(Description = "AC sweep, 200 points, inverting stage")]
    public AcResult AcSweep200() => Simulate.AcSweep(inverting, acSweep);

    [Benchmark(Description = "1000 DC operating points of perturbed stages, parallel")]
    public double OperatingPoints1000()
    {
        double[] outputs = new double[1000];
        Parallel.For(0, outputs.Length, i =>
        {
            var random = new Random(i);
            double rf = 10e3 * (1 + (0.02 * ((2 * random.NextDouble()) - 1)));
            double rin = 1e3 * (1 + (0.02 * ((2 * random.NextDouble()) - 1)));
            var op = Simulate.OperatingPoint(InvertingStage(rf, rin, input: 0.1));
            outputs[i] = op.Succeeded ? op.Voltage("out") : double.NaN;
        });
        return outputs.Sum();
    }

    [Benchmark(Description = "Transient, 2 amplifiers + 2 diodes, 10 periods at 20 kHz")]
    public TransientResult RectifierTransient() =>
        Simulate.Transient(rectifier, new TransientOptions { StopTime = 10 / 20e3, MaxStep = 1 / (20e3 * 200) });
}
