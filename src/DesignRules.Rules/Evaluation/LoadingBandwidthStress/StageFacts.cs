using DesignRules.Diagnostics;
using DesignRules.Elaboration;
using DesignRules.Model;
using DesignRules.Simulation;

namespace DesignRules.Rules.Evaluation.LoadingBandwidthStress;

/// <summary>Where a stage's parts are named, and the accuracy each stage must keep.</summary>
internal static class StageFacts
{
    /// <summary>The span of the part reference of an amplifier or diode slot (block) or of the element (netlist).</summary>
    public static SourceSpan PartSpan(Stage stage, string slot) => stage switch
    {
        BlockStage block when block.PartSpans.TryGetValue(slot, out var span) => span,
        NetlistStage netlist when netlist.Elements.FirstOrDefault(e => e.Id.Value == slot) is { } element => element.Span,
        _ => stage.Span,
    };

    /// <summary>The stage's stated accuracy, else the rule's default-accuracy threshold.</summary>
    public static double Accuracy(DesignEvaluation evaluation, DesignRules.Diagnostics.RuleId ruleId, Stage stage) =>
        stage.Requirements.Accuracy?.Value.Value ?? evaluation.Threshold(ruleId, "default-accuracy", stage.Id.Value);

    /// <summary>True for stages that rectify (a precision rectifier: its transfer passes one or both half-cycles).</summary>
    public static bool IsRectifier(StageProbe probe) => StageProperties.IsRectifying(probe);
}

/// <summary>The transients of a design at each band end, with failures reported once (DR920) and skipped.</summary>
internal static class TransientRuns
{
    public static IEnumerable<(BandEnd End, ElaboratedChain Chain, TransientResult Result)> Of(DesignEvaluation evaluation)
    {
        foreach (var end in evaluation.Analyses.BandEnds)
        {
            var chain = evaluation.Analyses.Chain(end);
            if (!chain.Succeeded)
            {
                yield break;
            }

            var result = evaluation.Analyses.Transient(end);
            if (!result.Succeeded)
            {
                evaluation.ReportFailure("transient", result.Failure!, chain);
                continue;
            }

            if (!evaluation.IsSettled(end))
            {
                continue;
            }

            yield return (end, chain, result);
        }
    }

    /// <summary>The measurement window: the last whole periods after start-up, or the window after start-up for a DC source.</summary>
    public static (double Start, double End) Window(ElaboratedChain chain, TransientResult result) => MeasurementWindow.Of(chain, result);

    /// <summary>Average of f(sample) over [start, end] by the trapezoidal rule on the transient's own time points.</summary>
    public static double Average(IReadOnlyList<double> time, Func<int, double> f, double start, double end)
    {
        double sum = 0, span = 0;
        for (int i = 1; i < time.Count; i++)
        {
            if (time[i - 1] < start - 1e-15 || time[i] > end + 1e-15)
            {
                continue;
            }

            double dt = time[i] - time[i - 1];
            sum += 0.5 * (f(i) + f(i - 1)) * dt;
            span += dt;
        }

        return span > 0 ? sum / span : f(time.Count - 1);
    }
}

/// <summary>The forward current and voltage of the engine's diode law (<see cref="DiodeModel"/>), for the stress rules.</summary>
internal static class DiodeConduction
{
    /// <summary>Current at terminal voltage <paramref name="v"/> (anode − cathode), A; 0 for v ≤ 0 (reverse currents are not forward stress).</summary>
    public static double ForwardCurrent(DiodeModel model, double v, double temperature) => model.ForwardCurrent(v, temperature);

    /// <summary>Forward voltage at a forward current, V.</summary>
    public static double ForwardVoltage(DiodeModel model, double current, double temperature) => model.ForwardVoltage(current, temperature);
}
