namespace DesignRules.Simulation.Analysis;

/// <summary>
/// What a warm re-solve of a reference DC sweep needs when only linear element values changed (resistances) or only
/// constant terms (amplifier input offsets and bias currents): at every swept value, the reference solution x0 and the
/// Jacobian J0 there, factored once; the DC equations of the linear devices as a sparse matrix A_L and a right-hand side
/// b_L per swept value; the structure of the non-linear devices' equations; and the element values the reference was
/// solved with. Built once from a successful reference sweep and then only read, so every thread's solver of the same
/// circuit can share it (the responses J0⁻¹·u of resistors, filled on first use, are pure functions of it).
/// <para>With it, a changed circuit is solved at each swept value by iterations x ← x + Js⁻¹·r(x) from x0, where Js is
/// J0 with the changed conductances added exactly (a low-rank update by the Sherman–Morrison–Woodbury identity, so no
/// matrix is factored per sample) and r(x) the full non-linear residual, evaluated cheaply: A_L·x from the sparse matrix,
/// and only the non-linear devices loaded. For a circuit whose non-linear devices stay where they were linearised, the
/// first step is exact and the second confirms it.</para>
/// </summary>
internal sealed class SweepLinearisation
{
    private readonly double[]?[][] responses;

    private SweepLinearisation(string sourceId, double[] values, int size)
    {
        SourceId = sourceId;
        Values = values;
        Size = size;
        responses = new double[]?[values.Length][];
    }

    /// <summary>The swept source.</summary>
    public string SourceId { get; }

    /// <summary>The swept values.</summary>
    public double[] Values { get; }

    /// <summary>Order of the system.</summary>
    public int Size { get; }

    /// <summary>
    /// The unknowns a linearised step solves, ascending: every unknown, or, where the caller named the unknowns its figures
    /// read, those and every unknown their equations reach (the closed system they belong to); the others keep their
    /// reference values and must not be read.
    /// </summary>
    public required int[] Unknowns { get; init; }

    /// <summary>Per unknown: its place in <see cref="Unknowns"/>, or −1 where it is not solved.</summary>
    public required int[] Compressed { get; init; }

    /// <summary>The unknowns not in <see cref="Unknowns"/>, ascending: rows a linearised step does not evaluate, only clears.</summary>
    public required int[] OtherRows { get; init; }

    /// <summary>The reference solution at each swept value.</summary>
    public required double[][] Solutions { get; init; }

    /// <summary>The factored Jacobian at each reference solution (reference element values), over <see cref="Unknowns"/> alone.</summary>
    public required DenseLu<double>[] Jacobians { get; init; }

    /// <summary>The linear devices' right-hand side at each swept value.</summary>
    public required double[][] LinearRhs { get; init; }

    /// <summary>The linear devices' matrix with the reference values, compressed by rows: row r holds entries RowStart[r] … RowStart[r + 1] − 1.</summary>
    public required int[] LinearRowStart { get; init; }

    public required int[] LinearColumns { get; init; }

    public required double[] LinearEntries { get; init; }

    /// <summary>Indices (into the compiled devices) of the devices that are not linear in DC.</summary>
    public required int[] NonlinearDevices { get; init; }

    /// <summary>
    /// The <see cref="NonlinearDevices"/> a linearised step loads: those with a matrix row among <see cref="Unknowns"/>. A diode
    /// or amplifier whose rows all lie beyond them (an amplifier of a stage behind, whose only term in the solved equations is
    /// its input bias current, see <see cref="UnreachedAmplifiers"/>) would load only equations that are not solved.
    /// </summary>
    public required int[] ReachedNonlinearDevices { get; init; }

    /// <summary>
    /// Amplifiers among the compiled devices left out of <see cref="ReachedNonlinearDevices"/>: a step adds their input bias
    /// currents (constant terms, the only ones they put into the solved equations) to the right-hand side instead.
    /// </summary>
    public required int[] UnreachedAmplifiers { get; init; }

    /// <summary>Every position the non-linear devices load in DC, compressed by rows like the linear matrix.</summary>
    public required int[] NonlinearRowStart { get; init; }

    public required int[] NonlinearColumns { get; init; }

    /// <summary>Per device: a resistor's conductance in the reference (NaN for other devices).</summary>
    public required double[] Conductances { get; init; }

    /// <summary>Per device: a diode's saturation current in the reference (NaN for other devices).</summary>
    public required double[] SaturationCurrents { get; init; }

    /// <summary>Indices of the diodes among the compiled devices.</summary>
    public required int[] Diodes { get; init; }

    /// <summary>Per swept value, per diode of <see cref="Diodes"/>: the junction conductance J0 holds for it.</summary>
    public required double[][] DiodeConductances { get; init; }

    /// <summary>Indices of the amplifiers among the compiled devices.</summary>
    public required int[] Amplifiers { get; init; }

    /// <summary>Per swept value, per amplifier of <see cref="Amplifiers"/>: its drive row's own coefficient in J0.</summary>
    public required double[][] AmplifierDriveSlopes { get; init; }

    /// <summary>Per swept value, per amplifier of <see cref="Amplifiers"/>: its output conductance in J0.</summary>
    public required double[][] AmplifierOutputConductances { get; init; }

    /// <summary>
    /// Linearises a successful sweep of <paramref name="solver"/>'s circuit over <paramref name="values"/>, with the
    /// element values the solver holds now (those the sweep was solved with); null when a Jacobian is singular there.
    /// </summary>
    /// <param name="solver">The solver holding the circuit, at the reference element values.</param>
    /// <param name="sourceId">The swept source.</param>
    /// <param name="values">The swept values.</param>
    /// <param name="sweep">The solved reference sweep.</param>
    /// <param name="figureUnknowns">
    /// Per unknown, whether the caller's figures read it (null or none set: every unknown is solved). With some set, only
    /// the unknowns their equations reach are solved (see <see cref="Unknowns"/>).
    /// </param>
    public static SweepLinearisation? Of(NewtonSolver solver, string sourceId, double[] values, DcSolutions sweep, bool[]? figureUnknowns = null)
    {
        var compiled = solver.Circuit;
        var devices = compiled.Devices;
        int n = compiled.Layout.Size;
        var context = solver.Context;
        context.Mode = AnalysisMode.Dc;
        context.Alpha = 0;
        context.SourceScale = 1;
        context.FirstIteration = false;
        context.OverrideSource = sourceId;

        // The linear devices alone, in a dense system of their own: their matrix once, their right-hand side per value.
        var linear = new LoadContext(n, compiled.Layout.StateCount)
        {
            Mode = AnalysisMode.Dc,
            JunctionShunt = context.JunctionShunt,
            Temperature = context.Temperature,
            OverrideSource = sourceId,
        };
        var dense = new LoadContext(n, compiled.Layout.StateCount)
        {
            Mode = AnalysisMode.Dc,
            JunctionShunt = context.JunctionShunt,
            Temperature = context.Temperature,
            OverrideSource = sourceId,
        };
        var solutions = new double[values.Length][];
        var fullJacobians = new double[values.Length][];
        var linearRhs = new double[values.Length][];
        var diodes = Enumerable.Range(0, devices.Length).Where(i => devices[i] is DiodeDevice).ToArray();
        var diodeConductances = new double[values.Length][];
        var amplifiers = Enumerable.Range(0, devices.Length).Where(i => devices[i] is AmplifierDevice).ToArray();
        var amplifierSlopes = new double[values.Length][];
        var amplifierConductances = new double[values.Length][];
        for (int l = 0; l < values.Length; l++)
        {
            solutions[l] = sweep[l];
            context.OverrideValue = values[l];
            Array.Copy(sweep[l], context.X, n);
            foreach (var device in devices) device.Prime(context.X);
            context.System.Clear();
            context.Limited = false;
            foreach (var device in devices) device.Load(context);
            if (context.Limited) return null;

            // The same Jacobian in a dense system of its own (the solver's may be banded), to read its entries by position.
            dense.OverrideValue = values[l];
            Array.Copy(sweep[l], dense.X, n);
            dense.System.Clear();
            dense.Limited = false;
            foreach (var device in devices) device.Load(dense);
            fullJacobians[l] = (double[])dense.System.Matrix.Clone();
            diodeConductances[l] = [.. diodes.Select(i => ((DiodeDevice)devices[i]).LoadedConductance(context.JunctionShunt))];
            amplifierSlopes[l] = [.. amplifiers.Select(i => ((AmplifierDevice)devices[i]).LoadedDriveSlope)];
            amplifierConductances[l] = [.. amplifiers.Select(i => ((AmplifierDevice)devices[i]).LoadedOutputConductance)];

            linear.OverrideValue = values[l];
            linear.System.Clear();
            foreach (var device in devices) if (device.IsLinearInDc) device.Load(linear);
            linearRhs[l] = (double[])linear.System.Rhs.Clone();
        }

        // The linear matrix does not depend on the swept value: the last one loaded serves.
        var rowStart = new int[n + 1];
        var columns = new List<int>();
        var entries = new List<double>();
        var matrix = linear.System.Matrix;
        for (int r = 0; r < n; r++)
        {
            rowStart[r] = columns.Count;
            for (int c = 0; c < n; c++)
            {
                double a = matrix[(r * n) + c];
                if (a == 0) continue;
                columns.Add(c);
                entries.Add(a);
            }
        }

        rowStart[n] = columns.Count;

        // Where the non-linear devices load, recorded from their calls (not their values, which may be zero somewhere).
        var nonlinear = Enumerable.Range(0, devices.Length).Where(i => !devices[i].IsLinearInDc).ToArray();
        var pattern = new HashSet<(int, int)>();
        var recorder = new LoadContext(n, compiled.Layout.StateCount, null, pattern)
        {
            Mode = AnalysisMode.Dc,
            JunctionShunt = context.JunctionShunt,
            Temperature = context.Temperature,
        };
        Array.Copy(sweep[0], recorder.X, n);
        foreach (int i in nonlinear) devices[i].Prime(recorder.X);
        foreach (int i in nonlinear) devices[i].Load(recorder);
        var positions = pattern.OrderBy(p => p.Item1).ThenBy(p => p.Item2).ToArray();
        var nonlinearRowStart = new int[n + 1];
        foreach (var (r, _) in positions) nonlinearRowStart[r + 1]++;
        for (int r = 0; r < n; r++) nonlinearRowStart[r + 1] += nonlinearRowStart[r];

        // The unknowns the figures' equations reach: the figure unknowns, then every unknown a row of the set has an entry
        // in, until none is added (at most n rounds of the work list). Rows of the set then hold entries only in its
        // columns, so the set's equations are a closed system whose solution is the whole circuit's at those unknowns,
        // exactly: what lies beyond (a stage whose input draws a current no voltage changes, such as the bias current of
        // an amplifier input behind a capacitor) cannot move them. The Jacobian is block triangular, so the set's block is
        // invertible wherever the whole one is.
        var inSet = new bool[n];
        bool named = figureUnknowns is not null && figureUnknowns.Any(f => f);
        var work = new Stack<int>();
        for (int i = 0; i < n; i++)
        {
            if (named && !figureUnknowns![i]) continue;
            inSet[i] = true;
            work.Push(i);
        }

        while (work.Count > 0)
        {
            int row = work.Pop();
            for (int e = rowStart[row]; e < rowStart[row + 1]; e++) Reach(columns[e]);
            for (int e = nonlinearRowStart[row]; e < nonlinearRowStart[row + 1]; e++) Reach(positions[e].Item2);
        }

        void Reach(int column)
        {
            if (inSet[column]) return;
            inSet[column] = true;
            work.Push(column);
        }

        var unknowns = Enumerable.Range(0, n).Where(i => inSet[i]).ToArray();
        var compressed = new int[n];
        Array.Fill(compressed, -1);
        for (int i = 0; i < unknowns.Length; i++) compressed[unknowns[i]] = i;
        int m = unknowns.Length;
        var jacobians = new DenseLu<double>[values.Length];
        for (int l = 0; l < values.Length; l++)
        {
            var full = fullJacobians[l];
            var jacobian = new DenseLu<double>(m, m == n ? compiled.Ordering : null);

            // Every linearised step solves with these factors, so a dense one is factored twice: the first time by the dense
            // LU, whose interchanges the second replays (DenseLu.PreferSparse), leaving factors that are the same bits and a
            // solve that runs over their non-zero positions only, in the dense solve's order (the same bits again). Should
            // the replay not take (it checks every pivot), the dense factors of the second time serve as before.
            jacobian.PreferSparse = true;
            for (int pass = 0; pass < (jacobian.PreferSparse ? 2 : 1); pass++)
            {
                jacobian.Clear();
                for (int r = 0; r < m; r++)
                {
                    int at = unknowns[r] * n;
                    for (int c = 0; c < m; c++)
                    {
                        double a = full[at + unknowns[c]];
                        if (a != 0) jacobian.Add(r, c, a);
                    }
                }

                if (jacobian.Factor() >= 0) return null;
            }

            jacobians[l] = jacobian;
        }

        // Which non-linear devices load a solved row (recorded device by device, from their calls).
        var reached = new List<int>();
        var unreachedAmplifiers = new List<int>();
        foreach (int i in nonlinear)
        {
            var own = new HashSet<(int, int)>();
            var single = new LoadContext(n, compiled.Layout.StateCount, null, own)
            {
                Mode = AnalysisMode.Dc,
                JunctionShunt = context.JunctionShunt,
                Temperature = context.Temperature,
            };
            Array.Copy(sweep[0], single.X, n);
            devices[i].Prime(single.X);
            devices[i].Load(single);
            bool loadsSolvedRow = own.Any(p => inSet[p.Item1]);
            if (loadsSolvedRow || devices[i] is not (AmplifierDevice or DiodeDevice))
            {
                reached.Add(i);
            }
            else if (devices[i] is AmplifierDevice)
            {
                unreachedAmplifiers.Add(i);
            }
        }

        var conductances = new double[devices.Length];
        var saturation = new double[devices.Length];
        for (int i = 0; i < devices.Length; i++)
        {
            conductances[i] = devices[i] is ResistorDevice resistor ? resistor.Conductance : double.NaN;
            saturation[i] = devices[i] is DiodeDevice diode ? diode.SaturationCurrent : double.NaN;
        }

        return new SweepLinearisation(sourceId, values, n)
        {
            Unknowns = unknowns,
            Compressed = compressed,
            OtherRows = [.. Enumerable.Range(0, n).Where(i => !inSet[i])],
            Solutions = solutions,
            Jacobians = jacobians,
            LinearRhs = linearRhs,
            LinearRowStart = rowStart,
            LinearColumns = [.. columns],
            LinearEntries = [.. entries],
            NonlinearDevices = nonlinear,
            ReachedNonlinearDevices = [.. reached],
            UnreachedAmplifiers = [.. unreachedAmplifiers],
            NonlinearRowStart = nonlinearRowStart,
            NonlinearColumns = [.. positions.Select(p => p.Item2)],
            Conductances = conductances,
            SaturationCurrents = saturation,
            Diodes = diodes,
            DiodeConductances = diodeConductances,
            Amplifiers = amplifiers,
            AmplifierDriveSlopes = amplifierSlopes,
            AmplifierOutputConductances = amplifierConductances,
        };
    }

    /// <summary>True when this linearises a sweep of <paramref name="sourceId"/> over exactly <paramref name="values"/>.</summary>
    public bool Serves(string sourceId, IReadOnlyList<double> values)
    {
        if (!string.Equals(sourceId, SourceId, StringComparison.Ordinal) || values.Count != Values.Length) return false;
        for (int i = 0; i < Values.Length; i++)
        {
            if (values[i] != Values[i]) return false;
        }

        return true;
    }

    /// <summary>
    /// J0⁻¹·u at swept value <paramref name="level"/>, u the vector with +1 at unknown <paramref name="a"/> and −1 at
    /// unknown <paramref name="b"/> (−1: none; both unknowns of <see cref="Unknowns"/>), over <see cref="Unknowns"/> (indexed
    /// as there), cached under <paramref name="key"/> (2·device index + 0 or 1): how the
    /// reference solution answers a unit change of a device's conductance, or of one of its rows. Computed on first use,
    /// by whichever thread asks first (the result is the same whoever computes it).
    /// </summary>
    public double[] Response(int level, int key, int a, int b)
    {
        var row = responses[level] ?? Interlocked.CompareExchange(ref responses[level], new double[]?[2 * Conductances.Length], null) ?? responses[level];
        if (Volatile.Read(ref row[key]) is { } known) return known;
        int m = Unknowns.Length;
        var u = new double[m];
        if (a >= 0) u[Compressed[a]] += 1;
        if (b >= 0) u[Compressed[b]] -= 1;
        Jacobians[level].Solve(u, new double[m]);
        return Interlocked.CompareExchange(ref row[key], u, null) ?? u;
    }
}
