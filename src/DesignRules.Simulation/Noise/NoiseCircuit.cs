using DesignRules.Simulation.Analysis;

namespace DesignRules.Simulation.Noise;

/// <summary>
/// A circuit compiled once for any number of noise analyses: each <see cref="Analyse"/> reuses the compiled devices and
/// solves the DC operating point only once per input source and level (later requests at the same point start from it),
/// so the noise at every stage output of a chain costs one compilation and one operating point. Not thread-safe: one
/// caller analyses it at a time (<see cref="Simulate.Noise"/> compiles a circuit of its own for each call).
/// </summary>
public sealed class NoiseCircuit
{
    private readonly CompiledCircuit? compiled;
    private readonly NewtonSolver? solver;
    private readonly SimulationFailure? compileFailure;
    private readonly Dictionary<(string Source, double? Level), (double[]? Point, SimulationFailure? Failure)> points = [];

    private NoiseCircuit(Circuit circuit, SolverLimits limits)
    {
        Limits = limits;
        if (limits.Validate() is { } bad)
        {
            compileFailure = new SimulationFailure(FailureKind.UnusableRequest, "solver limits: " + bad);
            return;
        }

        (compiled, compileFailure) = CompiledCircuit.Compile(circuit);
        if (compiled is not null) solver = new NewtonSolver(compiled, limits);
    }

    /// <summary>The solver bounds every analysis of this circuit keeps to.</summary>
    public SolverLimits Limits { get; }

    /// <summary>How many DC operating points the analyses so far have solved (one per distinct input source and level).</summary>
    public int OperatingPointsSolved { get; private set; }

    /// <summary>Compiles <paramref name="circuit"/> once; a circuit that cannot be compiled gives that failure on every analysis.</summary>
    /// <param name="circuit">Circuit to analyse.</param>
    /// <param name="limits">Solver bounds (default <see cref="SolverLimits.Default"/>).</param>
    public static NoiseCircuit Compile(Circuit circuit, SolverLimits? limits = null)
    {
        ArgumentNullException.ThrowIfNull(circuit);
        return new NoiseCircuit(circuit, limits ?? SolverLimits.Default);
    }

    /// <summary>
    /// Noise analysis, linearised at the DC operating point: the output noise density of every resistor (4kT/R),
    /// amplifier (e_n with its 1/f corner, i_n at each input) and diode (2q|I|), integrated over the request's band,
    /// with the gain from the request's input source to refer it to the input (see <see cref="NoiseRequest"/>).
    /// </summary>
    /// <param name="request">Output node, input source, band and integration tolerance.</param>
    public NoiseResult Analyse(NoiseRequest request)
    {
        ArgumentNullException.ThrowIfNull(request);
        if (request.Validate() is { } bad) return new NoiseResult(new SimulationFailure(FailureKind.UnusableRequest, bad));
        if (compiled is null || solver is null) return new NoiseResult(compileFailure);
        if (!compiled.Devices.Any(d => d.Id == request.InputSource && d is VoltageSourceDevice or CurrentSourceDevice))
        {
            return new NoiseResult(new SimulationFailure(FailureKind.UnusableRequest, $"the noise input '{request.InputSource}' is not an independent voltage or current source of this circuit") { ElementId = request.InputSource });
        }

        if (request.InputLevel is not null && !compiled.Devices.Any(d => d.Id == request.InputSource && d is VoltageSourceDevice))
        {
            return new NoiseResult(new SimulationFailure(FailureKind.UnusableRequest, $"an input level needs the noise input '{request.InputSource}' to be a voltage source") { ElementId = request.InputSource });
        }

        // The quiescent point does not depend on which source refers the noise to the input.
        var key = (request.InputLevel is null ? string.Empty : request.InputSource, request.InputLevel);
        if (!points.TryGetValue(key, out var point))
        {
            point = SolveOperatingPoint(request);
            points[key] = point;
            OperatingPointsSolved++;
        }

        return point.Point is null ? new NoiseResult(point.Failure) : NoiseAnalysis.Run(compiled, point.Point, request, Limits);
    }

    private (double[]? Point, SimulationFailure? Failure) SolveOperatingPoint(NoiseRequest request)
    {
        var context = solver!.Context;
        Array.Clear(context.X);
        SimulationFailure? failure;
        if (request.InputLevel is { } level)
        {
            context.OverrideSource = request.InputSource;
            context.OverrideValue = level;
            failure = OperatingPointSolver.Solve(solver, "the operating point of the noise analysis");
            if (failure is not null && OperatingPointSolver.Continue(solver, v => context.OverrideValue = v, 0, level))
            {
                // A level that switches a diode on is reached in steps from a zero source, as a DC sweep does.
                failure = null;
            }
        }
        else
        {
            context.OverrideSource = null;
            failure = OperatingPointSolver.Solve(solver, "the DC operating point");
        }

        return failure is null ? ((double[])context.X.Clone(), null) : (null, failure);
    }
}
