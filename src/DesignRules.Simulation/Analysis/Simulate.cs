namespace DesignRules.Simulation.Analysis;

/// <summary>
/// Entry points of the engine: DC operating point, DC sweep, AC small-signal sweep and transient. Each compiles the
/// circuit afresh (so one circuit may be analysed from several threads at once) and returns a result that carries
/// either the figures or a located <see cref="SimulationFailure"/>; problems of the circuit never throw.
/// </summary>
public static partial class Simulate
{
    /// <summary>DC operating point with the sources at their quiescent values (<see cref="Waveform.DcValue"/>).</summary>
    /// <param name="circuit">Circuit to solve.</param>
    /// <param name="limits">Solver bounds (default <see cref="SolverLimits.Default"/>).</param>
    public static OperatingPointResult OperatingPoint(Circuit circuit, SolverLimits? limits = null)
    {
        ArgumentNullException.ThrowIfNull(circuit);
        limits ??= SolverLimits.Default;
        if (Prepare(circuit, limits, out var compiled, out var failure) is not { } solver) return Failed(failure!);
        failure = OperatingPointSolver.Solve(solver, "the DC operating point");
        return Result(compiled!, solver, failure);
    }

    /// <summary>
    /// DC sweep: the operating point at each value of an independent voltage or current source, each solved from the
    /// previous solution.
    /// </summary>
    /// <param name="circuit">Circuit to solve.</param>
    /// <param name="sourceId">Id of the voltage or current source to sweep.</param>
    /// <param name="values">Source values, in V or A.</param>
    /// <param name="limits">Solver bounds.</param>
    public static DcSweepResult DcSweep(Circuit circuit, string sourceId, IReadOnlyList<double> values, SolverLimits? limits = null)
    {
        ArgumentNullException.ThrowIfNull(circuit);
        ArgumentNullException.ThrowIfNull(sourceId);
        ArgumentNullException.ThrowIfNull(values);
        limits ??= SolverLimits.Default;
        if (Prepare(circuit, limits, out var compiled, out var failure) is not { } solver) return new DcSweepResult(sourceId, null, null, [], failure);
        if (!compiled!.Devices.Any(d => d.Id == sourceId && d is VoltageSourceDevice or CurrentSourceDevice))
        {
            return new DcSweepResult(sourceId, null, null, [], new SimulationFailure(FailureKind.UnusableRequest, $"'{sourceId}' is not an independent voltage or current source of this circuit") { ElementId = sourceId });
        }

        if (values.Count == 0 || values.Count > limits.MaxSweepPoints || values.Any(v => !double.IsFinite(v)))
        {
            return new DcSweepResult(sourceId, null, null, [], new SimulationFailure(FailureKind.UnusableRequest, "sweep values must be finite, at least one and no more than the sweep-point limit") { ElementId = sourceId });
        }

        var map = new SignalMap(compiled);
        var table = new SampleTable<double>(map.Width);
        var context = solver.Context;
        context.OverrideSource = sourceId;
        var solved = new List<double>(values.Count);
        for (int i = 0; i < values.Count; i++)
        {
            context.OverrideValue = values[i];
            failure = OperatingPointSolver.Solve(solver, $"the DC sweep of '{sourceId}'", fromScratch: i == 0);
            if (failure is not null && OperatingPointSolver.Continue(solver, v => context.OverrideValue = v, i > 0 ? values[i - 1] : 0, values[i]))
            {
                // A large jump in the swept value (a diode changing state) was reached in smaller steps; the first
                // point is approached from a zero source value, which is where circuits are easiest to solve.
                failure = null;
            }

            if (failure is not null)
            {
                failure = failure with { SweepValue = values[i] };
                break;
            }

            SignalMap.Fill(compiled, context.X, table.AddRow(), null);
            solved.Add(values[i]);
        }

        return new DcSweepResult(sourceId, map, table, [.. solved], failure);
    }

    /// <summary>
    /// AC small-signal sweep, linearised at the DC operating point: the source the request names carries its amplitude,
    /// every other source is quiet.
    /// </summary>
    /// <param name="circuit">Circuit to solve.</param>
    /// <param name="sweep">Stimulus source, amplitude and frequencies.</param>
    /// <param name="limits">Solver bounds.</param>
    public static AcResult AcSweep(Circuit circuit, AcSweep sweep, SolverLimits? limits = null)
    {
        ArgumentNullException.ThrowIfNull(circuit);
        ArgumentNullException.ThrowIfNull(sweep);
        return AcSweeps(circuit, limits).Run(sweep);
    }

    /// <summary>
    /// AC sweeps of one circuit at any number of frequency lists (as <see cref="AcSweep(Circuit, Analysis.AcSweep, SolverLimits?)"/>
    /// each), the circuit compiled and its DC operating point solved once, on the first sweep: for a search that sweeps
    /// again where the first sweep showed something, so that each further sweep costs its small-signal solves only.
    /// </summary>
    /// <param name="circuit">Circuit to solve.</param>
    /// <param name="limits">Solver bounds.</param>
    public static AcSweepSession AcSweeps(Circuit circuit, SolverLimits? limits = null)
    {
        ArgumentNullException.ThrowIfNull(circuit);
        return new AcSweepSession(circuit, limits ?? SolverLimits.Default);
    }

    /// <summary>The sweeps of one circuit at its one operating point (<see cref="AcSweeps"/>). Not thread-safe.</summary>
    public sealed class AcSweepSession
    {
        private readonly SolverLimits limits;
        private readonly NewtonSolver? solver;
        private readonly CompiledCircuit? compiled;
        private readonly SimulationFailure? compileFailure;
        private OperatingPointResult? op;
        private SimulationFailure? opFailure;

        internal AcSweepSession(Circuit circuit, SolverLimits limits)
        {
            this.limits = limits;
            solver = Prepare(circuit, limits, out compiled, out compileFailure);
        }

        /// <summary>One sweep at the operating point (solved on the first sweep that needs it, then kept).</summary>
        public AcResult Run(AcSweep sweep)
        {
            ArgumentNullException.ThrowIfNull(sweep);
            if (solver is null) return new AcResult(null, null, [], Failed(compileFailure!), compileFailure);
            if (!compiled!.Devices.Any(d => d.Id == sweep.Source && d is VoltageSourceDevice or CurrentSourceDevice))
            {
                var bad = new SimulationFailure(FailureKind.UnusableRequest, $"the AC stimulus '{sweep.Source}' is not an independent voltage or current source of this circuit") { ElementId = sweep.Source };
                return new AcResult(null, null, [], Failed(bad), bad);
            }

            if (!double.IsFinite(sweep.Amplitude))
            {
                var bad = new SimulationFailure(FailureKind.UnusableRequest, "the AC stimulus amplitude must be finite") { ElementId = sweep.Source };
                return new AcResult(null, null, [], Failed(bad), bad);
            }

            // The operating point does not depend on the stimulus or the frequencies: solved once, every sweep reads it
            // (the small-signal analysis copies it and changes nothing of the solver's).
            if (op is null)
            {
                opFailure = OperatingPointSolver.Solve(solver, "the DC operating point");
                op = Result(compiled, solver, opFailure);
            }

            if (opFailure is not null) return new AcResult(null, null, [], op, opFailure);
            var frequencies = sweep.Frequencies;
            if (frequencies is null || frequencies.Count == 0 || frequencies.Count > limits.MaxSweepPoints || frequencies.Any(f => !(f > 0) || !double.IsFinite(f)))
            {
                return new AcResult(null, null, [], op, new SimulationFailure(FailureKind.UnusableRequest, "AC frequencies must be positive, finite, at least one and no more than the sweep-point limit"));
            }

            return AcAnalysis.Run(compiled, solver.Context.X, sweep, limits, op);
        }
    }

    /// <summary>
    /// Noise analysis, linearised at the DC operating point: the output noise density of every resistor (4kT/R),
    /// amplifier (e_n with its 1/f corner, i_n at each input) and diode (2q|I|), integrated over the request's band,
    /// with the gain from the request's input source to refer it to the input (see <see cref="NoiseRequest"/>).
    /// </summary>
    /// <param name="circuit">Circuit to solve.</param>
    /// <param name="request">Output node, input source, band and integration tolerance.</param>
    /// <param name="limits">Solver bounds.</param>
    public static NoiseResult Noise(Circuit circuit, NoiseRequest request, SolverLimits? limits = null)
    {
        ArgumentNullException.ThrowIfNull(circuit);
        ArgumentNullException.ThrowIfNull(request);
        return NoiseCircuit.Compile(circuit, limits).Analyse(request);
    }

    /// <summary>Transient analysis from the DC operating point at t = 0 (see <see cref="TransientOptions"/>).</summary>
    /// <param name="circuit">Circuit to solve.</param>
    /// <param name="options">Stop time, step bounds, method and tolerances.</param>
    /// <param name="limits">Solver bounds.</param>
    public static TransientResult Transient(Circuit circuit, TransientOptions options, SolverLimits? limits = null)
    {
        ArgumentNullException.ThrowIfNull(circuit);
        ArgumentNullException.ThrowIfNull(options);
        limits ??= SolverLimits.Default;
        var empty = new TransientStatistics(0, 0, 0, 0);
        if (options.Validate() is { } bad) return new TransientResult(null, null, [], [], empty, new SimulationFailure(FailureKind.UnusableRequest, bad));
        if (Prepare(circuit, limits, out var compiled, out var failure) is not { } solver) return new TransientResult(null, null, [], [], empty, failure);
        return new TransientAnalysis(compiled!, solver, options).Run();
    }

    private static NewtonSolver? Prepare(Circuit circuit, SolverLimits limits, out CompiledCircuit? compiled, out SimulationFailure? failure)
    {
        compiled = null;
        if (limits.Validate() is { } bad)
        {
            failure = new SimulationFailure(FailureKind.UnusableRequest, "solver limits: " + bad);
            return null;
        }

        (compiled, failure) = CompiledCircuit.Compile(circuit);
        return compiled is null ? null : new NewtonSolver(compiled, limits);
    }

    private static OperatingPointResult Failed(SimulationFailure failure) => new(null, [], [], failure);

    private static OperatingPointResult Result(CompiledCircuit compiled, NewtonSolver solver, SimulationFailure? failure)
    {
        if (failure is not null) return Failed(failure);
        var map = new SignalMap(compiled);
        var values = new double[map.Width];
        var samples = new AmplifierSample[compiled.Amplifiers.Length];
        SignalMap.Fill(compiled, solver.Context.X, values, samples);
        return new OperatingPointResult(map, values, samples, null);
    }
}
