namespace DesignRules.Simulation.Analysis;

/// <summary>The loop-gain entry point of the engine (see <see cref="LoopGainRequest"/>).</summary>
public static partial class Simulate
{
    /// <summary>
    /// Loop gain T(jω) of each requested amplifier (Bode's return ratio, the loop broken at the amplifier's controlling
    /// input), linearised at the DC operating point with every independent source quiet, and its stability margins.
    /// </summary>
    /// <param name="circuit">Circuit to analyse.</param>
    /// <param name="request">Frequencies, amplifiers and operating point.</param>
    /// <param name="limits">Solver bounds.</param>
    public static LoopGainResult LoopGain(Circuit circuit, LoopGainRequest request, SolverLimits? limits = null)
    {
        ArgumentNullException.ThrowIfNull(circuit);
        ArgumentNullException.ThrowIfNull(request);
        limits ??= SolverLimits.Default;
        if (Prepare(circuit, limits, out var compiled, out var failure) is not { } solver) return new LoopGainResult([], [], Failed(failure!), failure);
        var frequencies = request.Frequencies;
        if (frequencies is null || frequencies.Count == 0 || frequencies.Count > limits.MaxSweepPoints
            || frequencies.Any(f => !(f > 0) || !double.IsFinite(f)) || frequencies.Zip(frequencies.Skip(1)).Any(p => p.Second <= p.First))
        {
            var bad = new SimulationFailure(FailureKind.UnusableRequest, "loop-gain frequencies must be positive, finite, ascending, at least one and no more than the sweep-point limit");
            return new LoopGainResult([], [], Failed(bad), bad);
        }

        var amplifiers = compiled!.Amplifiers.Where(a => request.Amplifiers is null || request.Amplifiers.Contains(a.Id, StringComparer.Ordinal)).ToArray();
        if (request.Amplifiers?.FirstOrDefault(id => amplifiers.All(a => a.Id != id)) is { } unknown)
        {
            var bad = new SimulationFailure(FailureKind.UnusableRequest, $"'{unknown}' is not an amplifier of this circuit") { ElementId = unknown };
            return new LoopGainResult([], [], Failed(bad), bad);
        }

        if (request.BiasSource is { } source)
        {
            if (!compiled.Devices.Any(d => d.Id == source && d is VoltageSourceDevice or CurrentSourceDevice) || !double.IsFinite(request.BiasValue))
            {
                var bad = new SimulationFailure(FailureKind.UnusableRequest, $"the bias source '{source}' is not an independent source of this circuit, or its value is not finite") { ElementId = source };
                return new LoopGainResult([], [], Failed(bad), bad);
            }

            solver.Context.OverrideSource = source;
            solver.Context.OverrideValue = request.BiasValue;
        }

        failure = OperatingPointSolver.Solve(solver, "the operating point of the loop-gain analysis");
        if (failure is not null && request.BiasSource is not null
            && OperatingPointSolver.Continue(solver, v => solver.Context.OverrideValue = v, 0, request.BiasValue))
        {
            failure = null;
        }

        var op = Result(compiled, solver, failure);
        if (failure is not null) return new LoopGainResult([], [], op, failure);
        var analysis = new LoopGainAnalysis(compiled, solver.Context.X, limits);
        var loops = amplifiers.Select(a => analysis.Run(a, frequencies)).ToArray();
        return new LoopGainResult([.. frequencies], loops, op, null);
    }
}
