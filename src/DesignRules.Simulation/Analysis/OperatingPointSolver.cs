namespace DesignRules.Simulation.Analysis;

/// <summary>
/// Finds a DC operating point: plain Newton first; if it fails (or meets a numerically singular iterate), a shunt ramp
/// (temporary node-to-ground shunts from 10 mS down to the junction shunt, each step halved on failure) and then a
/// source ramp (all independent sources raised from zero). Every loop is bounded by <see cref="SolverLimits"/>.
/// </summary>
internal static class OperatingPointSolver
{
    /// <summary>Solves in the present context; X holds the starting guess and, on success, the solution.</summary>
    public static SimulationFailure? Solve(NewtonSolver solver, string what, bool fromScratch = true)
    {
        var context = solver.Context;
        var limits = solver.Limits;
        context.Mode = AnalysisMode.Dc;
        context.Alpha = 0;
        context.SourceScale = 1;
        double[] start = (double[])context.X.Clone();
        if (fromScratch) solver.ResetDevices();
        var outcome = solver.Solve(limits.MaxDcIterations, 0);
        if (outcome.Status == NewtonStatus.Converged) return null;

        // A matrix that is singular at one Newton iterate (a device far into saturation) is not a structural fault —
        // those are caught before solving — so it goes on to the continuation methods like any non-convergence.
        var first = outcome;

        if (ShuntRamp(solver, start)) return null;
        if (SourceRamp(solver)) return null;
        Array.Copy(start, context.X, start.Length);
        context.SourceScale = 1;
        return solver.Describe(first, what + " (also with the shunt ramp and the source ramp)");
    }

    /// <summary>
    /// Continuation in a swept value: from the solution at <paramref name="from"/> (in X) toward <paramref name="to"/>
    /// in steps that halve on failure and grow on success, at most <see cref="SolverLimits.MaxStepHalvings"/> halvings
    /// in a row and a bounded number of steps. X holds the solution at <paramref name="to"/> on success.
    /// </summary>
    public static bool Continue(NewtonSolver solver, Action<double> setValue, double from, double to)
    {
        var limits = solver.Limits;
        var context = solver.Context;
        context.Mode = AnalysisMode.Dc;
        context.Alpha = 0;
        context.SourceScale = 1;
        setValue(from);
        if (solver.Solve(limits.MaxDcIterations, 0).Status != NewtonStatus.Converged && Solve(solver, "the continuation start") is not null)
        {
            setValue(to);
            return false;
        }

        double[] good = (double[])context.X.Clone();
        double at = from, step = (to - from) / 4;
        int halvings = 0;
        int guard = 64 * (limits.MaxStepHalvings + 2);
        while (guard-- > 0)
        {
            double next = Math.Abs(to - at) <= Math.Abs(step) ? to : at + step;
            setValue(next);
            if (solver.Solve(limits.MaxDcIterations, 0).Status == NewtonStatus.Converged)
            {
                if (next == to) return true;
                Array.Copy(context.X, good, good.Length);
                at = next;
                step *= 2;
                halvings = 0;
                continue;
            }

            Array.Copy(good, context.X, good.Length);
            if (++halvings > limits.MaxStepHalvings) break;
            step /= 2;
        }

        setValue(to);
        return false;
    }

    private static bool ShuntRamp(NewtonSolver solver, double[] start)
    {
        var limits = solver.Limits;
        if (limits.ShuntRampSteps <= 0) return false;
        var context = solver.Context;
        Array.Copy(start, context.X, start.Length);
        solver.ResetDevices();
        double[] good = (double[])context.X.Clone();
        double logShunt = -2;
        double logStep = Math.Max((-2.0 - Math.Log10(Math.Max(limits.JunctionShunt, 1e-15))) / limits.ShuntRampSteps, 0.1);
        double lastGood = double.NaN;
        int halvings = 0;
        int guard = limits.ShuntRampSteps * (limits.MaxStepHalvings + 2) + 4;
        while (guard-- > 0)
        {
            double shunt = Math.Pow(10, logShunt);
            bool final = shunt <= limits.JunctionShunt;
            var outcome = solver.Solve(limits.MaxDcIterations, final ? 0 : shunt);
            if (outcome.Status == NewtonStatus.Converged)
            {
                if (final) return true;
                Array.Copy(context.X, good, good.Length);
                lastGood = logShunt;
                logShunt -= logStep;
                if (Math.Pow(10, logShunt) < limits.JunctionShunt) logShunt = Math.Log10(Math.Max(limits.JunctionShunt, 1e-300)) - 1;
                continue;
            }

            if (outcome.Status == NewtonStatus.Singular || double.IsNaN(lastGood) || ++halvings > limits.MaxStepHalvings) return false;
            Array.Copy(good, context.X, good.Length);
            logStep /= 2;
            logShunt = lastGood - logStep;
        }

        return false;
    }

    private static bool SourceRamp(NewtonSolver solver)
    {
        var limits = solver.Limits;
        var context = solver.Context;
        Array.Clear(context.X);
        solver.ResetDevices();
        double[] good = new double[context.X.Length];
        double scale = 0, step = 1.0 / limits.SourceRampSteps, lastGood = -1;
        int halvings = 0;
        int guard = limits.SourceRampSteps * (limits.MaxStepHalvings + 2) + 4;
        try
        {
            while (guard-- > 0)
            {
                context.SourceScale = scale;
                var outcome = solver.Solve(limits.MaxDcIterations, 0);
                if (outcome.Status == NewtonStatus.Converged)
                {
                    if (scale >= 1) return true;
                    Array.Copy(context.X, good, good.Length);
                    lastGood = scale;
                    scale = Math.Min(1, scale + step);
                    continue;
                }

                if (outcome.Status == NewtonStatus.Singular || lastGood < 0 || ++halvings > limits.MaxStepHalvings) return false;
                Array.Copy(good, context.X, good.Length);
                step /= 2;
                scale = lastGood + step;
            }

            return false;
        }
        finally
        {
            context.SourceScale = 1;
        }
    }
}
