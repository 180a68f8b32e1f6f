namespace DesignRules.Simulation.Analysis;

/// <summary>
/// Transient analysis by implicit integration of f(x) + dq(x)/dt = s(t): backward Euler on the first step and after
/// every source corner, then Gear-2 (variable-step BDF2) or the trapezoidal rule. Each step is solved by Newton; the
/// local truncation error of every integrated state, estimated from divided differences of its history, accepts or
/// rejects the step and sets the next one (bounded by the maximum step and the next breakpoint). A step whose Newton
/// solve fails is cut by 8; below the minimum step the run ends with a located failure.
/// </summary>
internal sealed class TransientAnalysis
{
    private readonly CompiledCircuit circuit;
    private readonly NewtonSolver solver;
    private readonly TransientOptions options;
    private readonly SolverLimits limits;
    private readonly int size;
    private readonly int states;
    private readonly double[] q0, q1, q2, dq0;
    private readonly double[] x0, x1;
    private readonly double[] scaleInverse;
    private readonly double[] absoluteTolerance;

    public TransientAnalysis(CompiledCircuit circuit, NewtonSolver solver, TransientOptions options)
    {
        this.circuit = circuit;
        this.solver = solver;
        this.options = options;
        limits = solver.Limits;
        size = circuit.Layout.Size;
        states = circuit.Layout.StateCount;
        q0 = new double[states];
        q1 = new double[states];
        q2 = new double[states];
        dq0 = new double[states];
        x0 = new double[size];
        x1 = new double[size];
        scaleInverse = new double[states];
        absoluteTolerance = new double[states];
        for (int k = 0; k < states; k++)
        {
            scaleInverse[k] = 1 / circuit.Layout.StateScales[k];
            absoluteTolerance[k] = circuit.Layout.StateIsCurrent[k] ? options.LteCurrentTolerance : options.LteVoltageTolerance;
        }
    }

    public TransientResult Run()
    {
        var context = solver.Context;
        var map = new SignalMap(circuit);
        // Room for the points a run usually takes at once (about 1.8 to 2.3 times its span over the maximum step in the
        // example's settled runs: the truncation error holds the steps below it through the signal's fast stretches), so
        // the tables are not copied at every doubling from a small start (a tenth of a settled transient) nor grown once
        // more past an estimate just too small (sized at twice the span, a check of the compressor allocated 106 MB
        // instead of 96 MB).
        int expected = ExpectedPoints(options);
        var table = new SampleTable<double>(map.Width, expected);
        var flags = new SampleTable<AmplifierSample>(circuit.Amplifiers.Length, expected);
        var time = new List<double>(expected);
        int accepted = 0, rejected = 0, failedSteps = 0, iterations = 0;
        TransientResult Finish(SimulationFailure? failure) =>
            new(map, table, [.. time], Traces(flags), new TransientStatistics(accepted, rejected, failedSteps, iterations), failure);

        // Initial state: the operating point with the sources at their start-time values, or the state a caller
        // carried over from an earlier run of the same circuit (a continuation towards the periodic steady state).
        double start = options.StartTime;
        context.Time = start;
        context.UseTimeValues = true;
        if (options.InitialState is { } initial && initial.Count == size)
        {
            for (int i = 0; i < size; i++) context.X[i] = initial[i];
        }
        else
        {
            var opFailure = OperatingPointSolver.Solve(solver, "the initial operating point of the transient");
            if (opFailure is not null) return Finish(opFailure with { Time = start });
        }

        EvaluateCharges();
        Array.Copy(context.Charge, q0, states);
        Array.Clear(dq0);
        Array.Copy(context.X, x0, size);
        Record(table, flags, time, start);

        double stop = options.StopTime;
        double maxStep = options.EffectiveMaxStep;
        double firstStep = options.EffectiveInitialStep;
        double minStep = limits.MinTimeStep;
        var breakpoints = CollectBreakpoints(start, stop, Math.Max(minStep * 10, stop * 1e-12));
        int nextBreak = 0;
        double t = start, t1 = start, t2 = start, h = firstStep, hPrevious = firstStep;
        int segmentPoints = 1;
        bool secondOrder = false;
        int steps = 0;
        context.Mode = AnalysisMode.Transient;
        context.UseTimeValues = false;

        // The steps factor one pattern tens of thousands of times, nearly always with the same row interchanges: replay them
        // on the pattern (the dense LU's bits; any load where partial pivoting would choose otherwise is factored dense).
        context.System.PreferSparse = true;
        double endTolerance = Math.Max(minStep, stop * 1e-12);

        while (t < stop - endTolerance)
        {
            if (++steps > limits.MaxTransientSteps)
            {
                return Finish(new SimulationFailure(FailureKind.BudgetSpent, $"the transient used up its budget of {limits.MaxTransientSteps} steps at t = {EngineeringText.Format(t, "s")} of {EngineeringText.Format(stop, "s")}") { Time = t });
            }

            while (nextBreak < breakpoints.Count && breakpoints[nextBreak] <= t + endTolerance) nextBreak++;
            double target = nextBreak < breakpoints.Count ? breakpoints[nextBreak] : stop;
            h = Math.Min(h, maxStep);
            if (segmentPoints == 1) h = Math.Min(h, 0.1 * (target - t));
            bool landing = false;
            if (t + h >= target - endTolerance)
            {
                h = target - t;
                landing = true;
            }
            else if (target - (t + h) < 0.5 * h)
            {
                h = 0.5 * (target - t);
            }

            bool useSecondOrder = secondOrder && segmentPoints >= 2;
            SetCoefficients(h, hPrevious, useSecondOrder);
            context.Time = t + h;

            // Predictor: linear extrapolation within the smooth segment.
            if (segmentPoints >= 2)
            {
                double ratio = h / hPrevious;
                for (int i = 0; i < size; i++) context.X[i] = x0[i] + ((x0[i] - x1[i]) * ratio);
            }
            else
            {
                Array.Copy(x0, context.X, size);
            }

            var outcome = solver.Solve(limits.MaxTransientIterations, 0);
            iterations += outcome.Iterations;
            if (outcome.Status == NewtonStatus.Singular) return Finish(solver.Describe(outcome, "a transient step") with { Time = t + h });
            if (outcome.Status != NewtonStatus.Converged)
            {
                failedSteps++;
                if (h / 8 < minStep)
                {
                    var why = solver.Describe(outcome, "a transient step");
                    string where = why.Node ?? why.ElementId ?? "the circuit";
                    return Finish(new SimulationFailure(
                        FailureKind.StepShrank,
                        $"the time step shrank below {EngineeringText.Format(minStep, "s")} at t = {EngineeringText.Format(t + h, "s")} while '{where}' changed faster than a step that short can follow")
                    {
                        Node = why.Node, ElementId = why.ElementId, Time = t + h,
                    });
                }

                h /= 8;
                secondOrder = false;
                continue;
            }

            EvaluateCharges();
            double errorRatio = TruncationErrorRatio(h, t, t1, t2, useSecondOrder, segmentPoints);
            if (errorRatio > 1 && h > 2 * minStep)
            {
                rejected++;
                double factor = Math.Max(0.1, 0.9 * Math.Pow(errorRatio, useSecondOrder ? -1.0 / 3 : -0.5));
                h = Math.Max(h * factor, minStep);
                continue;
            }

            // Accept.
            var charge = context.Charge;
            var history = context.History;
            double alpha = context.Alpha;
            for (int k = 0; k < states; k++)
            {
                q2[k] = q1[k];
                q1[k] = q0[k];
                q0[k] = charge[k];
                dq0[k] = (alpha * charge[k]) + history[k];
            }

            Array.Copy(x0, x1, size);
            Array.Copy(context.X, x0, size);
            t2 = t1;
            t1 = t;
            t = landing ? target : t + h;
            hPrevious = h;
            accepted++;
            Record(table, flags, time, t);

            if (landing && nextBreak < breakpoints.Count)
            {
                segmentPoints = 1;
                secondOrder = false;
                h = Math.Min(firstStep, h * 2);
            }
            else
            {
                segmentPoints++;
                secondOrder = true;
                double grow = errorRatio > 0 ? 0.9 * Math.Pow(errorRatio, useSecondOrder ? -1.0 / 3 : -0.5) : 2;
                h *= Math.Clamp(grow, 0.5, 2);
            }
        }

        return Finish(null);
    }

    /// <summary>Room for the points a run records: three times its span over the maximum step, within 64 and 65,536.</summary>
    private static int ExpectedPoints(TransientOptions options)
    {
        double steps = 3 * (options.StopTime - options.StartTime) / options.EffectiveMaxStep;
        return double.IsFinite(steps) ? (int)Math.Clamp(steps + 64, 64, 65536) : 64;
    }

    /// <summary>Integration coefficients: dq/dt ≈ α·q + history.</summary>
    private void SetCoefficients(double h, double hPrevious, bool secondOrder)
    {
        var context = solver.Context;
        var history = context.History;
        if (!secondOrder)
        {
            context.Alpha = 1 / h;
            for (int k = 0; k < states; k++) history[k] = -q0[k] / h;
        }
        else if (options.Method == IntegrationMethod.Trapezoidal)
        {
            context.Alpha = 2 / h;
            for (int k = 0; k < states; k++) history[k] = (-2 / h * q0[k]) - dq0[k];
        }
        else
        {
            double w = h / hPrevious;
            context.Alpha = (1 + (2 * w)) / (h * (1 + w));
            double a1 = -(1 + w) / h, a2 = w * w / (h * (1 + w));
            for (int k = 0; k < states; k++) history[k] = (a1 * q0[k]) + (a2 * q1[k]);
        }
    }

    /// <summary>
    /// Largest ratio of estimated local truncation error to tolerance over all states. Error estimates: backward Euler
    /// h²/2·q''; trapezoidal h³/12·q'''; Gear-2 2h³/9·q''' (derivatives from divided differences of the accepted history
    /// within the present smooth segment). Returns 0 when the segment is too short to estimate.
    /// </summary>
    private double TruncationErrorRatio(double h, double t, double t1, double t2, bool secondOrder, int segmentPoints)
    {
        var q = solver.Context.Charge;
        double tNew = t + h;
        double worst = 0;
        if (!secondOrder)
        {
            if (segmentPoints < 2) return 0;
            for (int k = 0; k < states; k++)
            {
                double d1a = (q[k] - q0[k]) / (tNew - t), d1b = (q0[k] - q1[k]) / (t - t1);
                double d2 = (d1a - d1b) / (tNew - t1);
                double error = 0.5 * h * h * 2 * Math.Abs(d2);
                worst = Math.Max(worst, Ratio(k, error, q[k]));
            }

            return worst;
        }

        if (segmentPoints < 3) return 0;
        double constant = options.Method == IntegrationMethod.Trapezoidal ? 1.0 / 12 : 2.0 / 9;
        for (int k = 0; k < states; k++)
        {
            double d1a = (q[k] - q0[k]) / (tNew - t), d1b = (q0[k] - q1[k]) / (t - t1), d1c = (q1[k] - q2[k]) / (t1 - t2);
            double d2a = (d1a - d1b) / (tNew - t1), d2b = (d1b - d1c) / (t - t2);
            double d3 = (d2a - d2b) / (tNew - t2);
            double error = constant * h * h * h * 6 * Math.Abs(d3);
            worst = Math.Max(worst, Ratio(k, error, q[k]));
        }

        return worst;
    }

    private double Ratio(int k, double error, double charge)
    {
        double scaled = error * scaleInverse[k];
        double magnitude = Math.Max(Math.Abs(charge), Math.Abs(q0[k])) * scaleInverse[k];
        return scaled / ((options.LteRelativeTolerance * magnitude) + absoluteTolerance[k]);
    }

    /// <summary>
    /// Stores the devices' charges at the accepted solution (the last iteration loaded them at the guess before it), with
    /// the iteration memory a load there would leave; nothing is stamped, the next iteration clears the system first.
    /// </summary>
    private void EvaluateCharges()
    {
        var context = solver.Context;
        foreach (var device in circuit.Devices) device.StoreCharges(context);
    }

    private List<double> CollectBreakpoints(double start, double stop, double separation)
    {
        var all = new List<double>();
        foreach (var device in circuit.Devices)
        {
            var waveform = device switch
            {
                VoltageSourceDevice v => v.Waveform,
                CurrentSourceDevice c => c.Waveform,
                _ => null,
            };
            waveform?.CollectBreakpoints(start, stop, all, limits.MaxBreakpoints);
        }

        all.Sort();
        var merged = new List<double>(all.Count + 1);
        foreach (double b in all)
        {
            if (b <= start + separation || b >= stop - separation) continue;
            if (merged.Count == 0 || b - merged[^1] > separation) merged.Add(b);
        }

        merged.Add(stop);
        return merged;
    }

    private void Record(SampleTable<double> table, SampleTable<AmplifierSample> flags, List<double> time, double t)
    {
        time.Add(t);
        var samples = circuit.Amplifiers.Length > 0 ? flags.AddRow() : default;
        var row = table.AddRow();
        solver.Context.X.AsSpan().CopyTo(row);
        for (int i = 0; i < circuit.Amplifiers.Length; i++)
        {
            var sample = circuit.Amplifiers[i].Observe(solver.Context.X);
            row[size + i] = sample.OutputCurrent;
            samples[i] = sample;
        }
    }

    private AmplifierTrace[] Traces(SampleTable<AmplifierSample> flags)
    {
        var traces = new AmplifierTrace[circuit.Amplifiers.Length];
        int count = flags.Count;
        for (int i = 0; i < traces.Length; i++)
        {
            // Straight from the table in one pass: a copy of the column first (32 bytes a point, so a settled run's column
            // of some 3,000 points landed on the large object heap, whose collections the check then paid for) and six
            // queries over it cost more than the run's whole truncation-error control.
            var slew = new bool[count];
            var swing = new bool[count];
            var current = new bool[count];
            var commonMode = new bool[count];
            var differential = new double[count];
            var outputCurrent = new double[count];
            for (int row = 0; row < count; row++)
            {
                var sample = flags[row, i];
                slew[row] = sample.SlewLimited;
                swing[row] = sample.AtSwingLimit;
                current[row] = sample.CurrentLimited;
                commonMode[row] = sample.InputOutsideCommonModeRange;
                differential[row] = sample.DifferentialInput;
                outputCurrent[row] = sample.OutputCurrent;
            }

            var amplifier = circuit.Amplifiers[i];
            traces[i] = new AmplifierTrace(
                amplifier.Id,
                amplifier.OutputName,
                amplifier.Parameters.Model,
                amplifier.Parameters.Rails,
                slew,
                swing,
                current,
                commonMode,
                differential,
                outputCurrent);
        }

        return traces;
    }
}
