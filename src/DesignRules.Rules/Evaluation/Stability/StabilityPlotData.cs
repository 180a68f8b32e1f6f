using DesignRules.Figures.Stability;

namespace DesignRules.Rules.Evaluation.Stability;

/// <summary>Plot data of the stability analyses for a stage's page: one loop-gain plot per closed loop, a step plot where the stage rings.</summary>
internal static class StabilityPlotData
{
    /// <summary>Overshoot above which a stage "rings" and its page shows the step response.</summary>
    public const double RingingOvershoot = 0.05;

    public static StagePlots With(DesignEvaluation evaluation, StagePlots plots)
    {
        var loops = evaluation.Analyses.LoopGains;
        var loopPlots = loops.Loops.Where(l => l.StageId == plots.StageId && l.Loop.Margins.State == LoopState.Closed)
            .Select(l => new LoopGainPlot(
                l.Slot,
                l.Frequencies,
                l.Loop.Gain.Select(t => 20 * Math.Log10(Math.Max(t.Magnitude, 1e-12))).ToArray(),
                l.Loop.Margins.PhaseOf(l.Loop.Gain),
                l.Loop.Margins.Crossover!.Value,
                l.Loop.Margins.PhaseMargin!.Value,
                l.OperatingPoint()))
            .ToArray();
        var step = evaluation.Analyses.Steps.Of(plots.StageId);
        var stepPlot = step is { Response.Overshoot: > RingingOvershoot }
            ? new StepPlot(StepAnalyses.StepSize, step.Time, step.Traces.Select(t => new Trace(t.Node, RoleOf(t.Role), t.Values)).ToArray(), step.Response.Overshoot, step.Response.SettlingTime)
            : null;
        return plots with { LoopGains = loopPlots, Step = stepPlot };
    }

    private static TraceRole RoleOf(StepNode node) => node switch
    {
        StepNode.Input => TraceRole.Input,
        StepNode.StageOutput => TraceRole.StageOutput,
        _ => TraceRole.AmplifierOutput,
    };
}
