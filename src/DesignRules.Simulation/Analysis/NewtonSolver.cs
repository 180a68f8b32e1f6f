namespace DesignRules.Simulation.Analysis;

/// <summary>How one bounded Newton–Raphson solve ended.</summary>
internal enum NewtonStatus
{
    Converged,
    Singular,
    NotConverged,
}

/// <summary>Outcome of a Newton solve: status, iterations used, and the unknown to blame when it failed.</summary>
internal readonly record struct NewtonOutcome(NewtonStatus Status, int Iterations, int Unknown);

/// <summary>
/// Bounded Newton–Raphson iteration on the modified nodal equations of one compiled circuit. Each iteration the devices
/// load their companion (linearised) stamps at the present guess, the dense system is factored in place and solved,
/// and the new guess is accepted when every unknown moved less than reltol·|x| + abstol (volts or amperes by kind)
/// and no junction voltage was limited. All buffers are allocated once; iterations allocate nothing.
/// </summary>
internal sealed class NewtonSolver
{
    private readonly double[] tolerance;
    private readonly bool[] isNode;

    public NewtonSolver(CompiledCircuit circuit, SolverLimits limits)
    {
        Circuit = circuit;
        Limits = limits;
        var layout = circuit.Layout;
        Context = new LoadContext(layout.Size, layout.StateCount, circuit.Ordering)
        {
            JunctionShunt = limits.JunctionShunt,
            Temperature = circuit.Temperature,
        };
        tolerance = new double[layout.Size];
        isNode = new bool[layout.Size];
        for (int i = 0; i < layout.Size; i++)
        {
            tolerance[i] = layout.Kinds[i] == UnknownKind.BranchCurrent ? limits.BranchCurrentTolerance : limits.VoltageTolerance;
            isNode[i] = layout.Kinds[i] == UnknownKind.NodeVoltage;
        }
    }

    public CompiledCircuit Circuit { get; }

    public SolverLimits Limits { get; }

    public LoadContext Context { get; }

    /// <summary>Resets the devices' iteration memory (junction limiting) before a solve from scratch.</summary>
    public void ResetDevices()
    {
        foreach (var device in Circuit.Devices) device.Reset();
    }

    /// <summary>Iterates from the guess in <see cref="LoadContext.X"/>; on success X holds the solution.</summary>
    /// <param name="maxIterations">Iteration cap.</param>
    /// <param name="shunt">Conductance added from every node to the reference (the shunt ramp), 0 normally.</param>
    public NewtonOutcome Solve(int maxIterations, double shunt)
    {
        var context = Context;
        var system = context.System;
        var x = context.X;
        var devices = Circuit.Devices;
        int n = x.Length;
        int worst = -1;
        for (int iteration = 0; iteration < maxIterations; iteration++)
        {
            system.Clear();
            context.Limited = false;
            context.FirstIteration = iteration == 0;
            foreach (var device in devices) device.Load(context);
            if (shunt > 0)
            {
                for (int i = 0; i < n; i++)
                {
                    if (isNode[i]) system.Add(i, i, shunt);
                }
            }

            int singular = system.Factor();
            if (singular >= 0) return new NewtonOutcome(NewtonStatus.Singular, iteration + 1, singular);
            system.Solve();
            var solution = system.Rhs;
            bool converged = !context.Limited;
            double worstRatio = 0;
            for (int i = 0; i < n; i++)
            {
                double next = solution[i];
                if (!double.IsFinite(next)) return new NewtonOutcome(NewtonStatus.NotConverged, iteration + 1, i);
                double previous = x[i];
                double delta = Math.Abs(next - previous);
                double allowed = (Limits.RelativeTolerance * Math.Max(Math.Abs(next), Math.Abs(previous))) + tolerance[i];
                if (delta > allowed)
                {
                    converged = false;
                    double ratio = delta / allowed;
                    if (ratio > worstRatio)
                    {
                        worstRatio = ratio;
                        worst = i;
                    }
                }

                x[i] = next;
            }

            if (converged) return new NewtonOutcome(NewtonStatus.Converged, iteration + 1, -1);
        }

        return new NewtonOutcome(NewtonStatus.NotConverged, maxIterations, worst);
    }

    /// <summary>Builds a located failure for an outcome that did not converge.</summary>
    public SimulationFailure Describe(NewtonOutcome outcome, string context)
    {
        var layout = Circuit.Layout;
        int unknown = outcome.Unknown;
        string? node = null, element = null;
        if (unknown >= 0)
        {
            element = layout.Owners[unknown];
            if (element is null) node = layout.Names[unknown];
        }

        if (outcome.Status == NewtonStatus.Singular)
        {
            string reason = unknown >= 0 && layout.Kinds[unknown] == UnknownKind.BranchCurrent
                ? $"the current of '{element}' is undetermined in {context}: voltage sources, amplifier outputs or inductors form a loop, or a source is shorted"
                : $"the voltage of '{layout.Names[Math.Max(unknown, 0)]}' is undetermined in {context}: the node is floating or shorted between voltage sources";
            return new SimulationFailure(FailureKind.Undetermined, reason) { Node = node, ElementId = element };
        }

        string blame = Context.LimitedBy is { } limitedBy && unknown < 0 ? limitedBy : element ?? node ?? "the circuit";
        return new SimulationFailure(FailureKind.Unsettled, $"the Newton–Raphson iterations of {context} did not settle; the largest change was at '{(unknown >= 0 ? layout.Names[unknown] : blame)}'")
        {
            Node = node,
            ElementId = element ?? (unknown < 0 ? Context.LimitedBy : null),
        };
    }
}
