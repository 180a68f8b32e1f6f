using DesignRules.Elaboration;

namespace DesignRules.Figures.Stability;

/// <summary>Which node a step trace records.</summary>
internal enum StepNode
{
    /// <summary>The stage input.</summary>
    Input,

    /// <summary>The stage output.</summary>
    StageOutput,

    /// <summary>An amplifier output that is not the stage output.</summary>
    AmplifierOutput,
}

/// <summary>One node's answer to the step, resampled on the plot grid.</summary>
/// <param name="Node">The node name.</param>
/// <param name="Role">What the node is in its stage.</param>
/// <param name="Values">Voltages on the grid, V.</param>
internal sealed record StepTrace(string Node, StepNode Role, IReadOnlyList<double> Values);

/// <summary>How one stage's output answers the small step, with the record drawn on the page when the stage rings.</summary>
/// <param name="StageId">The stage.</param>
/// <param name="Response">Overshoot and settling of the stage output.</param>
/// <param name="Time">Uniform time grid of the plot, s from the step.</param>
/// <param name="Traces">Stage input, stage output and every amplifier output on that grid.</param>
internal sealed record StageStep(string StageId, StepResponse Response, IReadOnlyList<double> Time, IReadOnlyList<StepTrace> Traces);

/// <summary>The step analysis of a design: a small step at the source, each stage output measured; or why it did not run.</summary>
/// <param name="Stages">Stages whose output settled within the record.</param>
/// <param name="Step">The step's size at the source, V.</param>
/// <param name="Failure">The engine failure, if the transient failed.</param>
/// <param name="Chain">The chain analysed.</param>
internal sealed record StepFigures(IReadOnlyList<StageStep> Stages, double Step, SimulationFailure? Failure, ElaboratedChain Chain)
{
    /// <summary>The step answer of a stage, or null when it was not measured.</summary>
    public StageStep? Of(string stageId) => Stages.FirstOrDefault(s => s.StageId == stageId);
}

/// <summary>
/// A small step (10 mV, so that no amplifier slews) added to the source's quiescent value, run as one transient over a
/// record set by the slowest and fastest loop crossover of the design; overshoot and 1 % settling of every stage output
/// that settles within it. The loop-gain analysis tells how long the record must be, so it runs first.
/// </summary>
internal static class StepAnalyses
{
    /// <summary>Size of the step at the source, V: small enough to keep every amplifier linear.</summary>
    public const double StepSize = 10e-3;

    /// <summary>Settling band as a fraction of the change: 1 % (common practice).</summary>
    public const double Band = 0.01;

    /// <summary>Points of each plotted trace.</summary>
    private const int TracePoints = 400;

    /// <summary>Largest number of time steps the record may need at its smallest step.</summary>
    private const double MaxSteps = 10_000;

    /// <summary>The step answer of every stage of the loops' chain; the loops closed at the quiescent point set the record.</summary>
    public static StepFigures Compute(LoopGainFigures loops)
    {
        var chain = loops.Chain;
        // The step starts from the quiescent point, so the loops closed there set its time scale.
        var crossovers = loops.Loops.Where(l => l.QuiescentCrossover is not null).Select(l => l.QuiescentCrossover!.Value).ToArray();
        if (!chain.Succeeded || crossovers.Length == 0)
        {
            return new StepFigures([], StepSize, null, chain);
        }

        double fast = 2 * Math.PI * crossovers.Max(), slow = 2 * Math.PI * crossovers.Min();
        double start = 5 / fast, rise = 0.05 / fast, maxStep = 0.5 / fast;
        double record = Math.Min(60 / slow, MaxSteps * maxStep);
        double v0 = chain.SourceWaveform.DcValue;
        var step = new PiecewiseLinearWaveform([new(start, v0), new(start + rise, v0 + StepSize)]);
        var run = Simulate.Transient(chain.Circuit.WithWaveform(chain.SourceId, step), new TransientOptions { StopTime = start + record, MaxStep = maxStep });
        if (!run.Succeeded)
        {
            return new StepFigures([], StepSize, run.Failure, chain);
        }

        var grid = Enumerable.Range(0, TracePoints).Select(i => start + (record * i / (TracePoints - 1))).ToArray();
        var stages = new List<StageStep>();
        foreach (var stage in chain.Stages)
        {
            if (stage.TimeConstant is { } tc && 5 * tc > record)
            {
                continue;
            }

            var output = run.Voltage(stage.OutputNode);
            var response = StepResponse.Measure(run.Time, output, start, Band);
            if (!Settled(run.Time, output, start + (0.8 * record), response))
            {
                continue;
            }

            var traces = new List<StepTrace>
            {
                new(stage.InputNode, StepNode.Input, MeasurementWindow.Resample(run.Time, run.Voltage(stage.InputNode), grid)),
                new(stage.OutputNode, StepNode.StageOutput, MeasurementWindow.Resample(run.Time, output, grid)),
            };
            traces.AddRange(stage.Amplifiers.Where(a => a.OutputNode != stage.OutputNode)
                .Select(a => new StepTrace(a.OutputNode, StepNode.AmplifierOutput, MeasurementWindow.Resample(run.Time, run.Voltage(a.OutputNode), grid))));
            stages.Add(new StageStep(stage.StageId, response, grid.Select(t => t - start).ToArray(), traces));
        }

        return new StepFigures(stages, StepSize, null, chain);
    }

    // A measurable answer: the output moved by a visible amount and stayed within the band over the last fifth of the record.
    private static bool Settled(IReadOnlyList<double> time, double[] values, double from, StepResponse response)
    {
        double size = Math.Abs(response.Change);
        if (size < 1e-3 * StepSize)
        {
            return false;
        }

        for (int i = 0; i < time.Count; i++)
        {
            if (time[i] >= from && Math.Abs(values[i] - response.Final) > Band * size)
            {
                return false;
            }
        }

        return true;
    }
}
