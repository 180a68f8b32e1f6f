using System.Runtime.InteropServices;

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

    /// <summary>What a later warm sweep needs for linearised steps (see <see cref="VariedDcSolver.ReferenceSweep"/>), or null.</summary>
    internal SweepLinearisation? Linearisation { get; set; }

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
/// <para>Before all that, a warm sweep from a <see cref="ReferenceSweep"/> in which only resistances, amplifier offsets and
/// bias currents changed takes linearised steps (see <see cref="SweepLinearisation"/>): the reference's Jacobian at each
/// swept value, factored once for every sample, with the changed conductances added exactly by a low-rank update, and the
/// full non-linear residual checked at every step with the same convergence test. A stage that stays linear (its
/// amplifiers inside their swing, its diodes where they were) is solved in one step and confirmed by the next, with no
/// factorisation; one that clips or whose diode changes state takes further steps (Newton's, for the diodes). A value whose
/// steps from its own reference do not converge (a rectifier at its dead zone's centre in the reference, open-loop, carried
/// across a diode drop by the sample) is started again from the same sweep's solution at a neighbouring value, and only
/// then takes the paths above.</para>
/// <para>Where the caller names the nodes its figures read (<see cref="SetFigureNodes"/>), a linearised solve may also stop
/// once those have converged while unknowns elsewhere still move — a rectifier behind a linear stage, at its zero crossing,
/// whose diodes take several steps to settle but move the stage's output only through the stage's tiny output impedance.
/// The stop is bounded (see <see cref="FigureConverged"/>): the figure unknowns are then within their tolerance of where
/// the remaining steps would take them; the other unknowns of such a solution are not converged and must not be read.</para>
/// <para>Where the nodes are named before the <see cref="ReferenceSweep"/>, its linearised steps solve only the equations
/// those nodes reach (see <see cref="SweepLinearisation.Unknowns"/>): a stage behind whose input draws a current no voltage
/// changes (an amplifier input's bias current, a capacitor at DC) is left out exactly, with its reference values, while a
/// stage that loads the named nodes through a resistor or a diode is solved with them.</para>
/// </summary>
public sealed class VariedDcSolver
{
    /// <summary>Chord iterations tried per swept value before plain Newton takes over.</summary>
    private const int MaxChordIterations = 6;

    /// <summary>
    /// Linearised steps tried per swept value before the chord iterations take over: the first step is exact for a circuit
    /// whose non-linear devices stay linear, the next confirm it; being Newton steps for every diode and amplifier, more
    /// take a diode across its knee (a rectifier downstream at its zero crossing), each far cheaper than a factorisation.
    /// </summary>
    private const int MaxLinearisedSteps = 24;

    private readonly NewtonSolver solver;
    private readonly CompiledCircuit compiled;
    private readonly Dictionary<string, Device> devices;
    private readonly DenseLu<double> chord;
    private readonly double[] tolerance;
    private readonly double[] residual;
    private readonly LoadContext nonlinear;
    private readonly double[] solveScratch;

    /// <summary>A linearised step over the unknowns its linearisation solves (<see cref="SweepLinearisation.Unknowns"/>).</summary>
    private readonly double[] compressedStep;
    private readonly List<JacobianUpdate> updates = [];
    private double[][] responses = [];

    /// <summary>Per active update of a step (see <see cref="LinearisedSolve"/>): its response, looked up once per step.</summary>
    private double[][] activeResponses = [];
    private double[] changes = [];
    private int[] active = [];
    private double[] update = [];
    private int[] updatePivots = [];
    private double[] updateRhs = [];
    private bool chordValid;

    /// <summary>False when the present values change a resistor outside the unknowns the linearisation solves.</summary>
    private bool linearisedUsable = true;

    /// <summary>Per unknown: whether it is a voltage the caller's figures read (all false: none named).</summary>
    private bool[] figureUnknowns;

    /// <summary>Whether any unknown is named in <see cref="figureUnknowns"/>.</summary>
    private bool hasFigureUnknowns;

    private VariedDcSolver(CompiledCircuit compiled, SolverLimits limits)
    {
        this.compiled = compiled;
        solver = new NewtonSolver(compiled, limits);
        devices = compiled.Devices.ToDictionary(d => d.Id, StringComparer.Ordinal);
        int n = compiled.Layout.Size;
        chord = new DenseLu<double>(n, compiled.Ordering);
        figureUnknowns = new bool[n];
        residual = new double[n];
        solveScratch = new double[n];
        compressedStep = new double[n];
        nonlinear = new LoadContext(n, compiled.Layout.StateCount)
        {
            Mode = AnalysisMode.Dc,
            JunctionShunt = limits.JunctionShunt,
            Temperature = compiled.Temperature,
        };
        tolerance = new double[n];
        for (int i = 0; i < n; i++)
        {
            tolerance[i] = compiled.Layout.Kinds[i] == UnknownKind.BranchCurrent ? limits.BranchCurrentTolerance : limits.VoltageTolerance;
        }
    }

    /// <summary>Number of unknowns of the compiled circuit (the order of its matrix).</summary>
    public int Size => compiled.Layout.Size;

    /// <summary>
    /// Whether warm sweeps from a <see cref="ReferenceSweep"/> may take linearised steps (on by default; off gives the chord
    /// and Newton path alone, to compare with).
    /// </summary>
    public bool Linearised { get; set; } = true;

    /// <summary>
    /// Whether the nodes named by <see cref="SetFigureNodes"/> may decide when a linearised solve stops (on by default; off
    /// gives the engine's test on every unknown, to compare with).
    /// </summary>
    public bool StopAtFigureNodes { get; set; } = true;

    /// <summary>
    /// Whether a warm sweep from a reference may write its solutions into arrays this solver keeps per reference and reuses
    /// at the next warm sweep from the same reference (off by default): no allocation per sweep, but the solutions it returns
    /// are then valid only until that next sweep. For a caller that reads them at once, such as a tolerance sample.
    /// </summary>
    public bool ReuseSolutions { get; set; }

    /// <summary>Per reference sweep: the solution arrays a warm sweep from it fills when <see cref="ReuseSolutions"/> is on.</summary>
    private readonly Dictionary<DcSolutions, double[][]> reusedSolutions = new(ReferenceEqualityComparer.Instance);

    /// <summary>Swept values a linearised solve accepted once the figure nodes had converged, the rest still moving (for tests).</summary>
    internal int FigureConvergedValues { get; private set; }

    /// <summary>
    /// Names the nodes whose voltages the caller's figures read from warm sweeps (a stage's input, output and amplifier
    /// outputs), so that a linearised solve may accept a swept value once they have converged (see
    /// <see cref="FigureConverged"/>), even while unknowns elsewhere still move; those others must then not be read. An empty
    /// list restores the engine's test on every unknown. The reference node is ignored (its voltage is 0 by definition).
    /// </summary>
    /// <param name="nodes">Node names of this circuit.</param>
    public void SetFigureNodes(IEnumerable<string> nodes)
    {
        ArgumentNullException.ThrowIfNull(nodes);
        var named = new bool[Size];
        bool any = false;
        foreach (var node in nodes)
        {
            if (CircuitLayout.IsReference(node)) continue;
            if (!compiled.Layout.Nodes.TryGetValue(node, out int index)) throw new KeyNotFoundException($"no node '{node}' in this circuit");
            named[index] = true;
            any = true;
        }

        figureUnknowns = named;
        hasFigureUnknowns = any;
    }

    /// <summary>Swept values solved by linearised steps since this solver was made (for tests).</summary>
    internal int LinearisedValues { get; private set; }

    /// <summary>Swept values where linearised steps were tried and did not converge, so a fuller path solved them (for tests).</summary>
    internal int LinearisedFallbacks { get; private set; }

    /// <summary>Swept values solved by linearised steps started from a neighbouring value's solution of the same sweep (for tests).</summary>
    internal int NeighbourStarts { get; private set; }

    /// <summary>Linearised steps of attempts that did not converge (for measurements).</summary>
    internal int AbandonedSteps { get; private set; }

    /// <summary>Newton iterations taken by the fallback after linearised steps (for tests and measurements).</summary>
    internal int FallbackNewtonIterations { get; private set; }

    /// <summary>Linearised steps taken since this solver was made, converged or not (for tests).</summary>
    internal int LinearisedSteps { get; private set; }

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
    /// The sweep of <see cref="Sweep(string, IReadOnlyList{double})"/>, kept with its linearisation (the Jacobian at each
    /// solution, factored, and the structure of the equations) so that a warm <see cref="Sweep(string, IReadOnlyList{double}, DcSolutions)"/>
    /// from it in which only resistances, amplifier offsets and bias currents changed can take linearised steps.
    /// </summary>
    /// <param name="sourceId">Independent source to sweep.</param>
    /// <param name="values">Source values, V or A.</param>
    public DcSolutions ReferenceSweep(string sourceId, IReadOnlyList<double> values)
    {
        var sweep = Sweep(sourceId, values);
        if (sweep.Succeeded)
        {
            sweep.Linearisation = SweepLinearisation.Of(solver, sourceId, [.. values], sweep, hasFigureUnknowns ? figureUnknowns : null);
            chordValid = false;
        }

        return sweep;
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
        double[][]? buffers = null;
        if (ReuseSolutions && !reusedSolutions.TryGetValue(reference, out buffers))
        {
            buffers = new double[values.Count][];
            for (int i = 0; i < buffers.Length; i++) buffers[i] = new double[Size];
            reusedSolutions.Add(reference, buffers);
        }

        var linearisation = Linearised && reference.Linearisation is { } l && l.Serves(sourceId, values) ? l : null;
        if (linearisation is not null)
        {
            PrepareLinearised(linearisation);
            nonlinear.OverrideSource = sourceId;
            if (linearisedUsable)
            {
                // Every value from its own reference solution first; the values are independent of each other here.
                for (int i = 0; i < values.Count; i++)
                {
                    nonlinear.OverrideValue = values[i];
                    int before = LinearisedSteps;
                    if (LinearisedSolve(linearisation, i, null)) solutions[i] = Keep(solver.Context.X, buffers, i);
                    else AbandonedSteps += LinearisedSteps - before;
                }

                // A value whose steps from its reference did not converge (a rectifier behind the stage at its dead zone's
                // centre in the reference, open-loop, which the sample's offset carries across a diode drop: steps from the
                // open-loop Jacobian overshoot into the swing clamp) is tried again from the same sample's solution at a
                // neighbouring value, where that rectifier already conducts: the nearer side first, then the other. The same
                // bounded steps and the same convergence test; only the start differs.
                for (int i = 0; i < values.Count; i++)
                {
                    if (solutions[i] is not null) continue;
                    nonlinear.OverrideValue = values[i];
                    foreach (int j in Neighbours(values, i))
                    {
                        if (solutions[j] is null || !LinearisedSolve(linearisation, i, solutions[j])) continue;
                        NeighbourStarts++;
                        solutions[i] = Keep(solver.Context.X, buffers, i);
                        break;
                    }
                }
            }
        }

        for (int i = 0; i < values.Count; i++)
        {
            if (solutions[i] is not null)
            {
                LinearisedValues++;
                continue;
            }

            if (linearisation is not null) LinearisedFallbacks++;
            context.OverrideValue = values[i];

            // After linearised steps failed (Newton's method already, in low-rank form), the chord iterations, a weaker form of
            // the same steps, are skipped: in the example's Monte Carlo they never solved a value the linearised steps had
            // not (every fallback there is a rectifier taken across its dead zone, which only plain Newton settles).
            if (!WarmSolve(reference[i], chord: linearisation is null))
            {
                return Sweep(sourceId, values);
            }

            solutions[i] = Keep(context.X, buffers, i);
        }

        return new DcSolutions(compiled.Layout.Nodes, solutions, null);
    }

    /// <summary>
    /// The Jacobian updates of this warm sweep: every resistor whose conductance differs from the reference (a fixed
    /// change), and for every diode its junction conductance and for every amplifier its drive row's own coefficient (the
    /// swing clamp) and its output conductance (the current limit), each changed by what a step loads minus what J0 holds.
    /// Offsets and bias currents need none: they are constant terms, loaded with the amplifier.
    /// </summary>
    private void PrepareLinearised(SweepLinearisation linearisation)
    {
        var devices = compiled.Devices;
        var solved = linearisation.Compressed;
        bool Solved(int unknown) => unknown < 0 || solved[unknown] >= 0;
        updates.Clear();
        linearisedUsable = true;
        for (int i = 0; i < devices.Length; i++)
        {
            if (devices[i] is ResistorDevice resistor && resistor.Conductance != linearisation.Conductances[i])
            {
                // A changed resistor the solved equations do not reach would need the unknowns left out: no linearised steps.
                if (!Solved(resistor.A) || !Solved(resistor.B)) linearisedUsable = false;
                updates.Add(new JacobianUpdate(2 * i, resistor.A, resistor.B, resistor.A, resistor.B, resistor.Conductance - linearisation.Conductances[i], null, -1));
            }
        }

        for (int j = 0; j < linearisation.Diodes.Length; j++)
        {
            int i = linearisation.Diodes[j];
            var diode = (DiodeDevice)devices[i];
            if (!Solved(diode.Junction) || !Solved(diode.Cathode)) continue;
            updates.Add(new JacobianUpdate(2 * i, diode.Junction, diode.Cathode, diode.Junction, diode.Cathode, 0, diode, j));
        }

        for (int j = 0; j < linearisation.Amplifiers.Length; j++)
        {
            int i = linearisation.Amplifiers[j];
            var nodes = ((AmplifierDevice)devices[i]).Nodes;

            // An amplifier of a stage beyond the solved equations (its drive and output rows not among them) is left as it was.
            if (Solved(nodes.Drive)) updates.Add(new JacobianUpdate(2 * i, nodes.Drive, -1, nodes.Drive, -1, 0, devices[i], j));
            if (Solved(nodes.Output) && Solved(nodes.Stage)) updates.Add(new JacobianUpdate((2 * i) + 1, nodes.Output, -1, nodes.Output, nodes.Stage, 0, devices[i], j));
        }

        // The updates' unknowns as places among the solved ones, looked up once here instead of at every step.
        int Place(int unknown) => unknown >= 0 ? solved[unknown] : -1;
        for (int j = 0; j < updates.Count; j++)
        {
            var u = updates[j];
            updates[j] = u with { SolvedA = Place(u.A), SolvedB = Place(u.B), SolvedC = Place(u.C), SolvedD = Place(u.D) };
        }

        int k = updates.Count;
        if (responses.Length != k)
        {
            responses = new double[k][];
            activeResponses = new double[k][];
            changes = new double[k];
            active = new int[k];
            update = new double[k * k];
            updatePivots = new int[k];
            updateRhs = new double[k];
        }
    }

    /// <summary>
    /// Linearised steps at swept value <paramref name="level"/>: from the reference solution, x ← x + Js⁻¹·r(x) with r the
    /// full residual (linear devices from the sparse matrix with the changed conductances, non-linear devices loaded at x)
    /// and Js the reference Jacobian J0 with the conductance updates U·D·Uᵀ added (Sherman–Morrison–Woodbury:
    /// Js⁻¹·r = y − Z·w, y = J0⁻¹·r, Z = J0⁻¹·U, (I + D·Uᵀ·Z)·w = D·Uᵀ·y). With the diodes' conductances updated at each step
    /// this is Newton's method for every diode and resistor, and a chord method for the amplifiers (exact while they stay
    /// inside their swing). Converged, with the engine's test, when a step moves no unknown by more than its tolerance and
    /// no junction was limited; the solution is then in the solver's X.
    /// </summary>
    private bool LinearisedSolve(SweepLinearisation linearisation, int level, double[]? start)
    {
        var x = nonlinear.X;
        int n = x.Length;
        Array.Copy(linearisation.Solutions[level], x, n);
        if (start is not null)
        {
            // Only the solved unknowns start elsewhere; the others keep this value's reference solution, as always.
            foreach (int i in linearisation.Unknowns) x[i] = start[i];
        }

        var devices = compiled.Devices;
        var nonlinearDevices = linearisation.NonlinearDevices;
        var reachedDevices = linearisation.ReachedNonlinearDevices;
        var unreachedAmplifiers = linearisation.UnreachedAmplifiers;
        foreach (int d in nonlinearDevices) devices[d].Prime(x);
        int k = updates.Count;
        Array.Clear(responses);

        var system = nonlinear.System;
        var matrix = system.Matrix;
        var rhs = system.Rhs;
        var linearRhs = linearisation.LinearRhs[level];
        var rowStart = linearisation.LinearRowStart;
        var columns = linearisation.LinearColumns;
        var entries = linearisation.LinearEntries;
        var nonlinearStart = linearisation.NonlinearRowStart;
        var nonlinearColumns = linearisation.NonlinearColumns;
        var jacobian = linearisation.Jacobians[level];
        var unknowns = linearisation.Unknowns;
        var otherRows = linearisation.OtherRows;
        int count = unknowns.Length;
        var y = compressedStep;
        double relative = solver.Limits.RelativeTolerance;
        double previousSize = double.PositiveInfinity;
        int thrown = 0;
        for (int iteration = 0; iteration < MaxLinearisedSteps; iteration++)
        {
            // The non-linear devices at x, in a dense system that holds only them.
            LinearisedSteps++;
            nonlinear.Limited = false;
            foreach (int d in reachedDevices) devices[d].Load(nonlinear);
            foreach (int d in unreachedAmplifiers)
            {
                // What such an amplifier's load puts into the solved equations: its input bias currents (as in its Load).
                var amplifier = (AmplifierDevice)devices[d];
                var model = amplifier.Parameters.Model;
                nonlinear.AddRhs(amplifier.Nodes.Plus, -model.InputBiasCurrentNonInverting * nonlinear.SourceScale);
                nonlinear.AddRhs(amplifier.Nodes.Minus, -model.InputBiasCurrentInverting * nonlinear.SourceScale);
            }

            // r = b_L − A_L·x − Σ ΔG·u·(uᵀ·x) + (b_N − A_N·x) over the solved rows, written straight into y (indexed as the
            // solved unknowns, where the solve below takes it); the non-linear entries are cleared as they are read. Rows
            // outside the solved unknowns are not evaluated, only cleared: their equations are not solved, and no solved
            // unknown depends on them (see SweepLinearisation.Unknowns).
            for (int s = 0; s < count; s++)
            {
                int row = unknowns[s];
                double sum = linearRhs[row] + rhs[row];
                for (int e = rowStart[row]; e < rowStart[row + 1]; e++) sum -= entries[e] * x[columns[e]];
                int at = row * n;
                for (int e = nonlinearStart[row]; e < nonlinearStart[row + 1]; e++)
                {
                    int c = nonlinearColumns[e];
                    sum -= matrix[at + c] * x[c];
                    matrix[at + c] = 0;
                }

                y[s] = sum;
                rhs[row] = 0;
            }

            foreach (int row in otherRows)
            {
                int at = row * n;
                for (int e = nonlinearStart[row]; e < nonlinearStart[row + 1]; e++) matrix[at + nonlinearColumns[e]] = 0;
                rhs[row] = 0;
            }

            // The changes of this step: fixed for a resistor (whose current is part of the residual), read back for the
            // non-linear devices; only the non-zero ones enter the small system.
            var diodes = linearisation.DiodeConductances[level];
            var slopes = linearisation.AmplifierDriveSlopes[level];
            var outputs = linearisation.AmplifierOutputConductances[level];
            int m = 0;
            var list = CollectionsMarshal.AsSpan(updates);
            for (int j = 0; j < k; j++)
            {
                ref readonly var u = ref list[j];
                double held = u.Device switch
                {
                    DiodeDevice => diodes[u.Index],
                    AmplifierDevice when u.Key % 2 == 0 => slopes[u.Index],
                    AmplifierDevice => outputs[u.Index],
                    _ => 0,
                };
                double change = u.Device switch
                {
                    DiodeDevice diode => diode.LoadedJunctionConductance - held,
                    AmplifierDevice amplifier when u.Key % 2 == 0 => amplifier.LoadedDriveSlope - held,
                    AmplifierDevice amplifier => amplifier.LoadedOutputConductance - held,
                    _ => u.Change,
                };
                if (u.Device is null)
                {
                    double current = change * (At(x, u.A) - At(x, u.B));
                    if (u.SolvedA >= 0) y[u.SolvedA] -= current;
                    if (u.SolvedB >= 0) y[u.SolvedB] += current;
                }

                // A non-linear device whose coefficient moved by a negligible share of what J0 holds (an amplifier well
                // inside its swing, whose smooth clamp still changes its slope in the twelfth digit) is left out of the
                // step's Jacobian: the residual above is still the exact one, so this changes only how fast the steps
                // contract (by about that share), never where they converge, and the convergence test is unchanged.
                if (change == 0 || (u.Device is not null && Math.Abs(change) <= NegligibleUpdate * Math.Abs(held))) continue;
                changes[m] = change;
                active[m++] = j;
            }

            // y = J0⁻¹·r over the solved unknowns, then the Woodbury correction for the updates.
            jacobian.Solve(y, solveScratch);
            if (m > 0)
            {
                var z = activeResponses;
                for (int j = 0; j < m; j++)
                {
                    ref readonly var u = ref list[active[j]];
                    z[j] = responses[active[j]] ??= linearisation.Response(level, u.Key, u.A, u.B);
                }

                for (int j = 0; j < m; j++)
                {
                    ref readonly var u = ref list[active[j]];
                    int cc = u.SolvedC, cd = u.SolvedD;
                    double change = changes[j];
                    for (int c = 0; c < m; c++)
                    {
                        update[(j * m) + c] = (j == c ? 1 : 0) + (change * (At(z[c], cc) - At(z[c], cd)));
                    }

                    updateRhs[j] = change * (At(y, cc) - At(y, cd));
                }

                if (!SmallFactor(update, updatePivots, m)) return false;
                SmallSolve(update, updatePivots, updateRhs, m);
                var ys = y.AsSpan(0, count);
                for (int j = 0; j < m; j++)
                {
                    double w = updateRhs[j];
                    if (w == 0) continue;
                    var zj = z[j].AsSpan(0, count);
                    for (int i = 0; i < ys.Length; i++) ys[i] -= w * zj[i];
                }
            }

            // The step measured in tolerances (1: an unknown moved by exactly what the convergence test allows), over every
            // unknown and over the figure unknowns alone.
            bool converged = !nonlinear.Limited;
            double size = 0, figureSize = 0;
            for (int s = 0; s < count; s++)
            {
                int i = unknowns[s];
                double next = x[i] + y[s];
                if (!double.IsFinite(next)) return false;
                double allowed = (relative * Math.Max(Math.Abs(next), Math.Abs(x[i]))) + tolerance[i];
                double moved = Math.Abs(y[s]) / allowed;
                if (moved > 1) converged = false;
                size = Math.Max(size, moved);
                if (figureUnknowns[i]) figureSize = Math.Max(figureSize, moved);
                x[i] = next;
            }

            if (!converged && hasFigureUnknowns && StopAtFigureNodes && FigureConverged(iteration, nonlinear.Limited, figureSize, size, previousSize))
            {
                FigureConvergedValues++;
                converged = true;
            }

            if (converged)
            {
                Array.Copy(x, solver.Context.X, n);
                return true;
            }

            // Junction-limited steps that keep moving some unknown by about its whole value without contracting: an
            // amplifier thrown between its swing clamps. From the value's own reference, where a neighbour can restart it,
            // such steps are given up after a few (in the example's Monte Carlo they never converged).
            thrown = start is null && nonlinear.Limited && size >= ThrownStepSize && size > FigureContraction * previousSize ? thrown + 1 : 0;
            if (thrown >= ThrownStepLimit) return false;
            previousSize = size;
        }

        return false;
    }

    /// <summary>
    /// The share of its reference coefficient below which a non-linear device's change is left out of a linearised step's
    /// Jacobian (the steps' contraction changes by about this share; the residual, and so the solution, is exact).
    /// </summary>
    private const double NegligibleUpdate = 1e-9;

    /// <summary>A step's size, in tolerances, at which it moved some unknown by about its whole value (1/RelativeTolerance is 1e6).</summary>
    private const double ThrownStepSize = 1e5;

    /// <summary>Consecutive such steps (limited, not contracting) after which steps from a value's own reference are given up.</summary>
    private const int ThrownStepLimit = 4;

    /// <summary>A copy of <paramref name="x"/>: into the reused array of value <paramref name="i"/>, or a new one.</summary>
    private static double[] Keep(double[] x, double[][]? buffers, int i)
    {
        if (buffers is null) return (double[])x.Clone();
        Array.Copy(x, buffers[i], x.Length);
        return buffers[i];
    }

    /// <summary>The values beside <paramref name="i"/>, the nearer first (the lower on a tie), at most two.</summary>
    private static IEnumerable<int> Neighbours(IReadOnlyList<double> values, int i)
    {
        bool below = i > 0, above = i + 1 < values.Count;
        if (below && above && Math.Abs(values[i + 1] - values[i]) < Math.Abs(values[i] - values[i - 1]))
        {
            yield return i + 1;
            yield return i - 1;
            yield break;
        }

        if (below) yield return i - 1;
        if (above) yield return i + 1;
    }

    /// <summary>
    /// Whether a linearised step that left some unknowns unconverged may still be accepted because the figure unknowns have
    /// converged. Newton's steps shrink at least geometrically once they contract: if every step from here on is at most
    /// ρ times the one before (ρ the ratio this step's size bears to the last one's, both measured in tolerances over every
    /// unknown), and a figure unknown moves by at most a fixed share of each step (the coupling through which the rest of
    /// the circuit reaches it, fixed to first order), the figure unknowns still move in all by at most
    /// <c>figureSize·(ρ + ρ² + …) = figureSize·ρ/(1 − ρ)</c> tolerances. So the step is accepted when
    /// <list type="bullet">
    /// <item>it is not the first (the first is the linear prediction; only the second shows how the rest answers it),</item>
    /// <item>no junction was limited (a limited step is not a Newton step, so its size says nothing of convergence),</item>
    /// <item>it is at most half the last one (ρ ≤ ½, so ρ/(1 − ρ) ≤ 1: what remains is at most this step's figure move), and</item>
    /// <item>it moved every figure unknown by at most its tolerance (<c>figureSize</c> ≤ 1),</item>
    /// </list>
    /// which bounds the figure unknowns' remaining error by the engine's own tolerance
    /// (<see cref="SolverLimits.RelativeTolerance"/> and the absolute tolerances): the convergence test of a full solve,
    /// applied to the unknowns the figures read, with the geometric tail of the remaining steps bounded explicitly.
    /// </summary>
    private static bool FigureConverged(int iteration, bool limited, double figureSize, double size, double previousSize) =>
        iteration > 0 && !limited && figureSize <= 1 && size <= FigureContraction * previousSize;

    /// <summary>The contraction a step must show against the one before for <see cref="FigureConverged"/>: ρ ≤ ½ bounds the remaining geometric tail by this step.</summary>
    private const double FigureContraction = 0.5;

    /// <summary>Entry <paramref name="index"/> of <paramref name="x"/> (−1: none, 0).</summary>
    private static double At(double[] x, int index) => index >= 0 ? x[index] : 0;

    /// <summary>LU with partial pivoting of a small dense k×k matrix in place; false when it is singular.</summary>
    private static bool SmallFactor(double[] a, int[] pivots, int k)
    {
        for (int c = 0; c < k; c++)
        {
            int p = c;
            for (int r = c + 1; r < k; r++) if (Math.Abs(a[(r * k) + c]) > Math.Abs(a[(p * k) + c])) p = r;
            pivots[c] = p;
            if (!(Math.Abs(a[(p * k) + c]) > 1e-12)) return false;
            if (p != c)
            {
                for (int j = 0; j < k; j++) (a[(c * k) + j], a[(p * k) + j]) = (a[(p * k) + j], a[(c * k) + j]);
            }

            for (int r = c + 1; r < k; r++)
            {
                double f = a[(r * k) + c] /= a[(c * k) + c];
                for (int j = c + 1; j < k; j++) a[(r * k) + j] -= f * a[(c * k) + j];
            }
        }

        return true;
    }

    private static void SmallSolve(double[] a, int[] pivots, double[] b, int k)
    {
        for (int c = 0; c < k; c++)
        {
            int p = pivots[c];
            if (p != c) (b[c], b[p]) = (b[p], b[c]);
            for (int r = c + 1; r < k; r++) b[r] -= a[(r * k) + c] * b[c];
        }

        for (int r = k - 1; r >= 0; r--)
        {
            double sum = b[r];
            for (int j = r + 1; j < k; j++) sum -= a[(r * k) + j] * b[j];
            b[r] = sum / a[(r * k) + r];
        }
    }

    private bool WarmSolve(double[] start, bool chord = true)
    {
        var context = solver.Context;
        var x = context.X;
        if (chord)
        {
            Array.Copy(start, x, x.Length);
            foreach (var device in compiled.Devices) device.Prime(x);
            if (Chord()) return true;
        }

        // Plain Newton from the reference solution (a diode that changed state, a stage driven into a limit).
        Array.Copy(start, x, x.Length);
        foreach (var device in compiled.Devices) device.Prime(x);
        chordValid = false;
        var outcome = solver.Solve(solver.Limits.MaxDcIterations, 0);
        FallbackNewtonIterations += outcome.Iterations;
        return outcome.Status == NewtonStatus.Converged;
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

/// <summary>
/// One rank-one update u·vᵀ·change of the Jacobian in a linearised step: u = e_A − e_B, v = e_C − e_D (−1: no term), its
/// response cached under <paramref name="Key"/>; <paramref name="Device"/> null for a resistor's fixed
/// <paramref name="Change"/>, else the diode or amplifier whose loaded coefficient gives the change at each step
/// (<paramref name="Index"/> its place among the linearisation's diodes or amplifiers; an even key is an amplifier's
/// drive row, an odd one its output row).
/// </summary>
internal readonly record struct JacobianUpdate(int Key, int A, int B, int C, int D, double Change, Device? Device, int Index)
{
    /// <summary>Places of A, B, C and D among the solved unknowns (<see cref="SweepLinearisation.Compressed"/>; −1: no term).</summary>
    public int SolvedA { get; init; } = -1;

    /// <inheritdoc cref="SolvedA"/>
    public int SolvedB { get; init; } = -1;

    /// <inheritdoc cref="SolvedA"/>
    public int SolvedC { get; init; } = -1;

    /// <inheritdoc cref="SolvedA"/>
    public int SolvedD { get; init; } = -1;
}
