using BenchmarkDotNet.Attributes;
using DesignRules.Elaboration;
using DesignRules.Loading;
using DesignRules.Model;
using DesignRules.Figures;
using DesignRules.Rules.Evaluation;
using DesignRules.Figures.Tolerance;
using DesignRules.Rules.Evaluation.Tolerance;
using DesignRules.Simulation;

namespace DesignRules.Benchmarks;

/// <summary>
/// Where the time of one tolerance sample goes, for a linear stage (the compressor preamp, non-inverting) and a
/// rectifier stage (the compressor's absolute-value stage), against the floor: one LU solve (factor and solve) of the
/// compiled chain's matrix, and the stage's DC transfer solved cold. "old sample" is the path before samples were
/// warm-started (elaborate the whole design, compile, solve every level from zero); "sample" is one Monte Carlo sample
/// as the analysis runs it now (set the values in the compiled chain, solve warm from the nominal solution by linearised
/// steps: the nominal Jacobian of each level factored once, the sample's changes as low-rank updates, the residual
/// checked at every step, a level accepted once the stage's own nodes have converged, only the equations those nodes reach
/// solved: for both stages the averaging filter behind the rectifier is left out; a level whose steps from the nominal
/// solution do not converge is started again from the sample's solution at the neighbouring level, not by Newton; the
/// level solutions go into arrays the solver keeps); "without linearised steps" is the chord-and-Newton warm path alone, for comparison.
/// BenchmarkDotNet needs benchmark classes to be public and unsealed.
/// </summary>
[MemoryDiagnoser]
public class ToleranceSampleBenchmark
{
    private readonly MonteCarloSettings settings = new(1000, 20261202, ToleranceDistribution.Normal);
    private Design design = null!;
    private WorstCaseAnalysis worstCase = null!;
    private ElaborationOptions baseline = null!;
    private DenseLu<double> lu = null!;
    private double[] matrix = null!;
    private double[] rhs = null!;
    private VariedDcSolver cold = null!;
    private int sample;

    /// <summary>The stage measured: a linear stage and a rectifier stage of the example's compressor design.</summary>
    [Params("preamp", "rectifier")]
    public string Stage { get; set; } = "preamp";

    [GlobalSetup]
    public void Setup()
    {
        var root = Path.Combine(typeof(ToleranceSampleBenchmark).Assembly
            .GetCustomAttributes(typeof(System.Reflection.AssemblyMetadataAttribute), false)
            .Cast<System.Reflection.AssemblyMetadataAttribute>().Single(a => a.Key == "RepositoryRoot").Value!, "example-design");
        var files = RepositoryFiles.Find([root], out _).Order(StringComparer.Ordinal).ToList();
        design = DesignLoader.LoadFiles(files).Designs.Single(d => d.Id.Value == "compressor-vibration-envelope");
        var evaluation = new DesignEvaluation(design, RuleSet.Default);
        var stage = ToleranceAnalyses.Stages(evaluation).Single(s => s.StageId == Stage);
        worstCase = ToleranceAnalyses.WorstCase(evaluation, stage);
        baseline = evaluation.Analyses.Chain(BandEnd.Top).Options;

        // The floor: the chain's MNA matrix at the nominal solution, factored and solved from a saved copy.
        var compiled = CompiledCircuit.Compile(worstCase.Circuit.Chain.Circuit).Circuit!;
        var solver = new NewtonSolver(compiled, SolverLimits.Default);
        if (OperatingPointSolver.Solve(solver, "benchmark") is not null) throw new InvalidOperationException("the nominal chain does not solve");
        solver.Context.System.Clear();
        foreach (var device in compiled.Devices) device.Load(solver.Context);
        lu = new DenseLu<double>(compiled.Layout.Size);
        matrix = (double[])solver.Context.System.Matrix.Clone();
        rhs = (double[])solver.Context.System.Rhs.Clone();
        cold = VariedDcSolver.Compile(worstCase.Circuit.Chain.Circuit, out _)!;
    }

    [Benchmark(Baseline = true, Description = "one LU solve (factor + solve) of the chain's matrix")]
    public double LuSolve()
    {
        Array.Copy(matrix, lu.Matrix, matrix.Length);
        Array.Copy(rhs, lu.Rhs, rhs.Length);
        lu.Factor();
        lu.Solve();
        return lu.Rhs[0];
    }

    [Benchmark(Description = "the stage's DC transfer, solved cold (every level)")]
    public int DcTransferCold() => cold.Sweep(worstCase.Circuit.Chain.SourceId, worstCase.Plan.Levels).Count;

    [Benchmark(Description = "one Monte Carlo sample (values set in the compiled chain, linearised steps from the nominal solution)")]
    public double Sample() => worstCase.Circuit.Measure(Draw(sample++)).Outputs[0];

    [Benchmark(Description = "one Monte Carlo sample without linearised steps (chord and Newton from the nominal solution)")]
    public double SampleWithoutLinearisedSteps()
    {
        worstCase.Circuit.Linearised = false;
        try
        {
            return worstCase.Circuit.Measure(Draw(sample++)).Outputs[0];
        }
        finally
        {
            worstCase.Circuit.Linearised = true;
        }
    }

    [Benchmark(Description = "old sample: elaborate the design")]
    public int OldElaborate() => ChainElaborator.Elaborate(design, worstCase.Variables.Options(baseline, Draw(sample++))).Circuit.ElementCount;

    [Benchmark(Description = "old sample: elaborate and compile")]
    public int OldCompile() => VariedDcSolver.Compile(ChainElaborator.Elaborate(design, worstCase.Variables.Options(baseline, Draw(sample++))).Circuit, out _)!.Size;

    [Benchmark(Description = "old sample: elaborate, compile, solve every level cold")]
    public double OldSample() => DcTransfer.Measure(design, worstCase.Variables.Options(baseline, Draw(sample++)), worstCase.Plan).Outputs[0];

    /// <summary>The variables of Monte Carlo sample <paramref name="index"/>, drawn as the analysis draws them.</summary>
    private Variation Draw(int index) => SampleDraws.Draw(worstCase, settings, index % settings.Samples);
}
