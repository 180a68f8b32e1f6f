using DesignRules.Diagnostics;
using DesignRules.Elaboration;
using DesignRules.Model;

namespace DesignRules.Rules.Evaluation.Tolerance;

/// <summary>
/// The tolerance analyses of a design's stages, each computed once by the figures layer (<see cref="DesignAnalyses"/>)
/// and shared by the 4xx rules: the extreme-value worst case of every stage and, for stages with an accuracy
/// requirement, the seeded Monte Carlo yield.
/// </summary>
internal static class ToleranceAnalyses
{
    /// <summary>The stages of the nominal chain (none when the chain could not be built).</summary>
    public static IReadOnlyList<StageProbe> Stages(DesignEvaluation evaluation) => evaluation.Analyses.Stages;

    /// <summary>The stage's worst case, computed once by the figures layer.</summary>
    public static WorstCaseAnalysis WorstCase(DesignEvaluation evaluation, StageProbe stage) => evaluation.Analyses.WorstCase(stage);

    /// <summary>The stage's Monte Carlo, computed once by the figures layer.</summary>
    public static MonteCarloYield MonteCarlo(DesignEvaluation evaluation, StageProbe stage) => evaluation.Analyses.MonteCarloOf(stage);

    /// <summary>" at 85 °C": where in the design's operating range a worst case occurs; empty without a range.</summary>
    public static string AtTemperature(double? celsius) =>
        celsius is { } t ? $" at {new DesignRules.Quantities.Quantity(t, DesignRules.Quantities.Dimension.Temperature).Format()}" : string.Empty;

    /// <summary>Reports a failed run of the stage's analysis (DR920); true when the analysis has no figures at all.</summary>
    public static bool ReportFailure(DesignEvaluation evaluation, WorstCaseAnalysis analysis)
    {
        if (analysis.Failure is { } failure && analysis.FailedChain is { } chain)
        {
            evaluation.ReportFailure($"tolerance analysis of stage '{analysis.Stage.StageId}'", failure, chain);
        }

        return !(analysis.Metric.FullScale > 0) && analysis.Failure is not null;
    }

    /// <summary>The accuracy a stage states, if any (peak and average included).</summary>
    public static double? Accuracy(StageProbe stage) => stage.Stage.Requirements.Accuracy?.Value.Value;

    /// <summary>
    /// The variable that adds most to a figure and a breakdown by group as a fraction of <paramref name="scale"/>
    /// ("resistors 1.8 %, offsets 0.9 %"), for a message and the YAML node it points at.
    /// </summary>
    public static (Contribution? Dominant, string Detail) Breakdown(
        WorstCaseAnalysis analysis, Func<StageFigures, double> figure, double scale, Design design, string? extra = null, Contribution? also = null)
    {
        var contributions = analysis.ContributionsTo(figure, design).ToList();
        if (also is not null)
        {
            contributions.Add(also);
        }

        var dominant = contributions.Where(c => c.Size > 0).OrderByDescending(c => c.Size).ThenBy(c => c.What, StringComparer.Ordinal).FirstOrDefault();
        var parts = contributions.GroupBy(c => c.Group)
            .Select(g => (g.Key, Size: g.Sum(c => c.Size) / scale))
            .Where(g => g.Size >= 1e-5)
            .Select(g => $"{g.Key} {Say.Percent(g.Size)}")
            .ToList();
        double nominal = Math.Abs(figure(analysis.Nominal)) / scale;
        if (nominal >= 1e-5 && double.IsFinite(nominal)) parts.Add($"nominal {Say.Percent(nominal)}");

        // When the nominal values themselves are off more than any tolerance adds, the fix is a component value:
        // point at the resistor the figure is most sensitive to, not at an amplifier's offset.
        if (double.IsFinite(nominal) && dominant is not null && nominal > dominant.Size / scale)
        {
            dominant = contributions.Where(c => c.Size > 0 && c.Group == "resistors").OrderByDescending(c => c.Size)
                .ThenBy(c => c.What, StringComparer.Ordinal).FirstOrDefault() ?? dominant;
        }
        if (extra is not null) parts.Add(extra);
        return (dominant, parts.Count == 0 ? "no tolerance" : string.Join(", ", parts));
    }

    /// <summary>
    /// A peak stage's droop as a contributor to its error: how far the held output falls below the input peak in the nominal
    /// transient (the hold capacitor discharging through the discharge resistor and the load between peaks), pointing at the
    /// hold capacitor's value, whose increase (or the discharge resistor's) lengthens the time constant R·C and so cuts the
    /// droop Vp·(1 − e^(−T/RC)). Null for other stages or when the stage holds no capacitor on its output.
    /// </summary>
    public static Contribution? HoldDroop(WorstCaseAnalysis analysis)
    {
        if (analysis.Metric.Dynamic is not { } hold || !(hold.Low < 0))
        {
            return null;
        }

        var (name, span, through) = analysis.Stage.Stage switch
        {
            BlockStage b when b.Values.TryGetValue("chold", out var c) =>
                ("chold", c.Value.Span, b.Values.ContainsKey("rdis") ? " discharging through rdis" : string.Empty),
            NetlistStage n when n.Elements.FirstOrDefault(e => e.Kind == ElementKind.Capacitor && e.Nodes.Any(x => x.Value == n.Output.Value)) is { } e =>
                (e.Id.Value, e.Value?.Span ?? e.Span, string.Empty),
            _ => (null, (SourceSpan?)null, string.Empty),
        };
        return name is null || span is null ? null : new Contribution($"droop of hold capacitor {name}{through}", "droop", span, -hold.Low, double.NaN);
    }

    /// <summary>The YAML node to point at: the dominant contributor, else the fallback (a requirement).</summary>
    public static SourceSpan Target(Contribution? dominant, SourceSpan fallback) => dominant?.Span ?? fallback;
}
