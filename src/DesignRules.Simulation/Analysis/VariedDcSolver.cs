namespace DesignRules.Simulation.Analysis;

/// <summary>
/// Solutions of a DC sweep (one full unknown vector per swept value), kept so that a later solve of the same circuit with
/// changed element values can start from them.
/// </summary>
public sealed class DcSolutions
{
    private readonly IReadOnlyDictionary<string, int> nodes;
    private readonly double[][] solutions;

    internal DcSolutions(IReadOnlyDictionary<string, int> nodes, double[][] solutions, SimulationFailure? failure)
    {
        this.nodes = nodes;
        this.solutions = solutions;
        Failure = failure;
    }

    /// <summary>Why the sweep failed, or null when every value was solved.</summary>
    public SimulationFailure? Failure { get; }

    /// <summary>True when every swept value was solved.</summary>
    public bool Succeeded => Failure is null;

    /// <summary>Number of solved values.</summary>
    public int Count => solutions.Length;

    internal double[] this[int index] => solutions[index];

    /// <summary>The voltage of a circuit node at each solved value (0 for the reference node).</summary>
    /// <param name="node">Node name.</param>
    public double[] Voltage(string node)
    {
        if (CircuitLayout.IsReference(node)) return new double[solutions.Length];
        if (!nodes.TryGetValue(node, out int index)) throw new KeyNotFoundException($"no node '{node}' in this circuit");
        var values = new double[solutions.Length];
        for (int i = 0; i < values.Length; i++) values[i] = solutions[i][index];
        return values;
    }
}

/// <summary>
/// One circuit compiled once for many DC sweeps that differ only in element values: resistances, amplifier input offsets
/// and bias currents, diode saturation currents are changed in place and the sweep is solved again, starting from the
/// solutions of a reference sweep (the nominal circuit) instead of from zero. This is what a tolerance corner or a Monte
/// Carlo sample needs: the same topology, values a few per cent off, so that the solution moves a little.
/// <para>A warm solve first tries chord iterations (Newton with the Jacobian factored once per set of values and reused
/// at every swept value — exact in one step for a circuit that is linear over the sweep, a direct transfer evaluation),
/// then plain Newton from the reference solution, and only then the cold sweep of <see cref="Simulate.DcSweep"/> with its
/// continuation methods, so that it never fails where the cold sweep succeeds. Every step uses the engine's convergence
/// test (<see cref="SolverLimits.RelativeTolerance"/> and the absolute tolerances), so a warm result agrees with a cold one
/// within those tolerances. Not thread-safe: use one instance per thread.</para>
/// </summary>
public sealed class VariedDcSolver
{
    /// <summary>Chord iterations tried per swept value before plain Newton takes over.</summary>
    private const int MaxChordIterations = 6;

    private readonly NewtonSolver solver;
    private readonly CompiledCircuit compiled;
    private readonly Dictionary<string, Device> devices;
    private readonly DenseLu<double> chord;
    private readonly double[] tolerance;
    private readonly double[] residual;
    private bool chordValid;

    private VariedDcSolver(CompiledCircuit compiled, SolverLimits limits)
    {
        this.compiled = compiled;
        solver = new NewtonSolver(compiled, limits);
        devices = compiled.Devices.ToDictionary(d => d.Id, StringComparer.Ordinal);
        int n = compiled.Layout.Size;
        chord = new DenseLu<double>(n, compiled.Ordering);
        residual = new double[n];
        tolerance = new double[n];
        for (int i = 0; i < n; i++)
        {
            tolerance[i] = compiled.Layout.Kinds[i] == UnknownKind.BranchCurrent ? limits.BranchCurrentTolerance : limits.VoltageTolerance;
        }
    }

    /// <summary>Number of unknowns of the compiled circuit (the order of its matrix).</summary>
    public int Size => compiled.Layout.Size;

    /// <summary>Compiles a circuit, or returns null with the first problem (as <see cref="Simulate.DcSweep"/> would report it).</summary>
    /// <param name="circuit">Circuit to compile.</param>
    /// <param name="failure">Why it cannot be compiled.</param>
    /// <param name="limits">Solver bounds (default <see cref="SolverLimits.Default"/>).</param>
    public static VariedDcSolver? Compile(Circuit circuit, out SimulationFailure? failure, SolverLimits? limits = null)
    {
        ArgumentNullException.ThrowIfNull(circuit);
        limits ??= SolverLimits.Default;
        if (limits.Validate() is { } bad)
        {
            failure = new SimulationFailure(FailureKind.UnusableRequest, "solver limits: " + bad);
            return null;
        }

        (var compiled, failure) = CompiledCircuit.Compile(circuit);
        return compiled is null ? null : new VariedDcSolver(compiled, limits);
    }

    /// <summary>Sets a resistor's resistance, Ω (positive and finite).</summary>
    /// <param name="id">Resistor id.</param>
    /// <param name="ohms">Resistance.</param>
    public void SetResistance(string id, double ohms)
    {
        if (!(ohms > 0) || !double.IsFinite(ohms)) throw new ArgumentOutOfRangeException(nameof(ohms), ohms, "resistance must be positive and finite");
        Get<ResistorDevice>(id).Conductance = 1 / ohms;
        chordValid = false;
    }

    /// <summary>Sets an amplifier's input offset voltage (V, in series with the + input) and its two bias currents (A, into each input).</summary>
    /// <param name="id">Amplifier id.</param>
    /// <param name="offsetVoltage">Input offset voltage.</param>
    /// <param name="biasNonInverting">Bias current into the + input.</param>
    /// <param name="biasInverting">Bias current into the − input.</param>
    public void SetAmplifierInputs(string id, double offsetVoltage, double biasNonInverting, double biasInverting)
    {
        var amplifier = Get<AmplifierDevice>(id);
        var model = amplifier.Parameters.Model;
        if (model.InputOffsetVoltage == offsetVoltage && model.InputBiasCurrentNonInverting == biasNonInverting && model.InputBiasCurrentInverting == biasInverting) return;
        amplifier.Parameters = new AmplifierParameters(
            model with { InputOffsetVoltage = offsetVoltage, InputBiasCurrentNonInverting = biasNonInverting, InputBiasCurrentInverting = biasInverting },
            amplifier.Parameters.Rails);
        chordValid = false;
    }

    /// <summary>A diode's saturation current Is, A.</summary>
    /// <param name="id">Diode id.</param>
    public double DiodeSaturationCurrent(string id) => Get<DiodeDevice>(id).SaturationCurrent;

    /// <summary>Sets a diode's saturation current Is, A (positive and finite).</summary>
    /// <param name="id">Diode id.</param>
    /// <param name="amperes">Saturation current.</param>
    public void SetDiodeSaturationCurrent(string id, double amperes)
    {
        if (!(amperes > 0) || !double.IsFinite(amperes)) throw new ArgumentOutOfRangeException(nameof(amperes), amperes, "saturation current must be positive and finite");
        var diode = Get<DiodeDevice>(id);
        if (diode.SaturationCurrent == amperes) return;
        diode.SaturationCurrent = amperes;
        chordValid = false;
    }

    /// <summary>
    /// The DC sweep of a source from zero, exactly as <see cref="Simulate.DcSweep"/> solves it (each value from the previous
    /// solution, continuation where a step fails), keeping every solution for later warm starts.
    /// </summary>
    /// <param name="sourceId">Independent source to sweep.</param>
    /// <param name="values">Source values, V or A.</param>
    public DcSolutions Sweep(string sourceId, IReadOnlyList<double> values)
    {
        ArgumentNullException.ThrowIfNull(values);
        if (Check(sourceId, values) is { } bad) return new DcSolutions(compiled.Layout.Nodes, [], bad);
        var context = solver.Context;
        Array.Clear(context.X);
        context.OverrideSource = sourceId;
        var solved = new List<double[]>(values.Count);
        for (int i = 0; i < values.Count; i++)
        {
            context.OverrideValue = values[i];
            var failure = OperatingPointSolver.Solve(solver, $"the DC sweep of '{sourceId}'", fromScratch: i == 0);
            if (failure is not null && OperatingPointSolver.Continue(solver, v => context.OverrideValue = v, i > 0 ? values[i - 1] : 0, values[i]))
            {
                failure = null;
            }

            if (failure is not null)
            {
                return new DcSolutions(compiled.Layout.Nodes, [.. solved], failure with { SweepValue = values[i] });
            }

            solved.Add((double[])context.X.Clone());
        }

        chordValid = false;
        return new DcSolutions(compiled.Layout.Nodes, [.. solved], null);
    }

    /// <summary>
    /// The same sweep with the present element values, each value started from the matching solution of
    /// <paramref name="reference"/> (a sweep of this circuit over the same values); falls back to the cold <see cref="Sweep(string, IReadOnlyList{double})"/> when
    /// a warm start does not converge, so it fails only where the cold sweep fails.
    /// </summary>
    /// <param name="sourceId">Independent source to sweep.</param>
    /// <param name="values">Source values, V or A (the reference's values).</param>
    /// <param name="reference">A successful sweep of this circuit over <paramref name="values"/>.</param>
    public DcSolutions Sweep(string sourceId, IReadOnlyList<double> values, DcSolutions reference)
    {
        ArgumentNullException.ThrowIfNull(values);
        ArgumentNullException.ThrowIfNull(reference);
        if (!reference.Succeeded || reference.Count != values.Count) return Sweep(sourceId, values);
        if (Check(sourceId, values) is { } bad) return new DcSolutions(compiled.Layout.Nodes, [], bad);
        var context = solver.Context;
        context.OverrideSource = sourceId;
        context.Mode = AnalysisMode.Dc;
        context.Alpha = 0;
        context.SourceScale = 1;
        var solutions = new double[values.Count][];
        for (int i = 0; i < values.Count; i++)
        {
            context.OverrideValue = values[i];
            if (!WarmSolve(reference[i]))
            {
                return Sweep(sourceId, values);
            }

            solutions[i] = (double[])context.X.Clone();
        }

        return new DcSolutions(compiled.Layout.Nodes, solutions, null);
    }

    private bool WarmSolve(double[] start)
    {
        var context = solver.Context;
        var x = context.X;
        Array.Copy(start, x, x.Length);
        foreach (var device in compiled.Devices) device.Prime(x);
        if (Chord()) return true;

        // Plain Newton from the reference solution (a diode that changed state, a stage driven into a limit).
        Array.Copy(start, x, x.Length);
        foreach (var device in compiled.Devices) device.Prime(x);
        chordValid = false;
        return solver.Solve(solver.Limits.MaxDcIterations, 0).Status == NewtonStatus.Converged;
    }

    /// <summary>
    /// Chord iterations: x ← x + J0⁻¹·(b(x) − A(x)·x), with J0 the Jacobian factored at the first point solved with the
    /// present values. Converged when a step moves no unknown by more than the engine's tolerance and no junction was limited.
    /// </summary>
    private bool Chord()
    {
        var context = solver.Context;
        var system = context.System;
        var x = context.X;
        int n = x.Length;
        for (int iteration = 0; iteration < MaxChordIterations; iteration++)
        {
            Load();
            if (!chordValid)
            {
                chord.CopyMatrixFrom(system);
                if (chord.Factor() >= 0) return false;
                chordValid = true;
            }

            system.Residual(x, residual);

            Array.Copy(residual, chord.Rhs, n);
            chord.Solve();
            bool converged = !context.Limited;
            var delta = chord.Rhs;
            for (int i = 0; i < n; i++)
            {
                double next = x[i] + delta[i];
                if (!double.IsFinite(next)) return false;
                double allowed = (solver.Limits.RelativeTolerance * Math.Max(Math.Abs(next), Math.Abs(x[i]))) + tolerance[i];
                if (Math.Abs(delta[i]) > allowed) converged = false;
                x[i] = next;
            }

            if (converged) return true;
        }

        return false;
    }

    private void Load()
    {
        var context = solver.Context;
        context.System.Clear();
        context.Limited = false;
        context.FirstIteration = false;
        foreach (var device in compiled.Devices) device.Load(context);
    }

    private SimulationFailure? Check(string sourceId, IReadOnlyList<double> values)
    {
        ArgumentNullException.ThrowIfNull(sourceId);
        if (!devices.TryGetValue(sourceId, out var source) || source is not (VoltageSourceDevice or CurrentSourceDevice))
        {
            return new SimulationFailure(FailureKind.UnusableRequest, $"'{sourceId}' is not an independent voltage or current source of this circuit") { ElementId = sourceId };
        }

        return values.Count == 0 || values.Count > solver.Limits.MaxSweepPoints || values.Any(v => !double.IsFinite(v))
            ? new SimulationFailure(FailureKind.UnusableRequest, "sweep values must be finite, at least one and no more than the sweep-point limit") { ElementId = sourceId }
            : null;
    }

    private T Get<T>(string id)
        where T : Device =>
        devices.TryGetValue(id, out var device) && device is T typed ? typed : throw new KeyNotFoundException($"no {typeof(T).Name} '{id}' in this circuit");
}
