using System.Globalization;
using DesignRules.Diagnostics;
using DesignRules.Elaboration;
using DesignRules.Model;
using DesignRules.Quantities;
using DesignRules.Simulation;

namespace DesignRules.Rules.Evaluation;

/// <summary>
/// Everything the rules see of one design: the model, the analyses (each run at most once, on first use), the
/// effective levels and thresholds, and the place findings are reported to.
/// </summary>
internal sealed class DesignEvaluation : IAnalysisFailures
{
    private readonly List<Finding> findings = [];
    private readonly HashSet<(string, string, string)> judged = [];
    private readonly Dictionary<string, List<Figure>> figures = new(StringComparer.Ordinal);
    private readonly Dictionary<string, SampleDistribution> distributions = new(StringComparer.Ordinal);
    private readonly List<YieldEstimate> yields = [];
    private readonly RuleSet ruleSet;

    public DesignEvaluation(Design design, RuleSet ruleSet, int maxDegreeOfParallelism = -1)
    {
        Design = design;
        this.ruleSet = ruleSet;
        Analyses = new DesignAnalyses(design, ruleSet.MonteCarlo, this) { MaxDegreeOfParallelism = maxDegreeOfParallelism };
    }

    public Design Design { get; }

    /// <summary>
    /// True in an evaluation that re-runs a rule on a design with a fix hint applied (<see cref="Refit"/>): there the rules
    /// give their closed-form hints only, so that confirming a hint never recurses.
    /// </summary>
    public bool ConfirmsHint { get; private init; }

    /// <summary>A fresh evaluation of <paramref name="design"/> (a changed copy of this one's) under the same rule set, to confirm a fix hint.</summary>
    public DesignEvaluation Refit(Design design)
    {
        // A re-run judges one rule, which may need one band end's transient only: run each as asked, not all together.
        var refit = new DesignEvaluation(design, ruleSet, Analyses.MaxDegreeOfParallelism) { ConfirmsHint = true };
        refit.Analyses.BandEndsTogether = false;
        return refit;
    }

    public DesignAnalyses Analyses { get; }

    /// <summary>
    /// The most re-runs the engine-searched fix hints of one design may take together (<see cref="HintProbe"/>): a bound on
    /// the time hints add to a check, whatever the number of findings. Rules run one after another, so which hints get
    /// searched is deterministic; one that finds the budget spent gives no searched hint.
    /// </summary>
    public const int HintRunBudget = 32;

    /// <summary>
    /// The most time steps of settled transient the re-runs of one design's searched hints may take together, counting
    /// each re-run of a transient rule as the steps the design's own settled transients took (every band end): a design
    /// that needs fine steps gets few re-runs, and one whose transient needed continuation runs to settle (a long
    /// averaging time constant) none, so that hints never cost much more than the re-runs of a quick design.
    /// Deterministic: it depends on the design only.
    /// </summary>
    public const long HintStepBudget = 80_000;

    private int hintRuns;
    private long hintSteps;

    /// <summary>
    /// Takes one re-run from <see cref="HintRunBudget"/> and, for a rule judged on the settled transient
    /// (<paramref name="transient"/>), its time steps from <see cref="HintStepBudget"/>; false when either would be exceeded.
    /// </summary>
    public bool TakeHintRun(bool transient)
    {
        // A transient that needed continuation runs to settle (a slow mode extrapolated) makes every re-run as slow, and
        // its corners too: such a design is not searched at all.
        if (transient && Analyses.IsPeriodic && Analyses.BandEnds.Any(e => SettleSteps(e) < 0))
        {
            return false;
        }

        long cost = transient && Analyses.IsPeriodic ? Analyses.BandEnds.Sum(SettleSteps) : 0;
        lock (findings)
        {
            if (hintRuns >= HintRunBudget || hintSteps + cost > HintStepBudget)
            {
                return false;
            }

            hintRuns++;
            hintSteps += cost;
            return true;
        }
    }

    public MonteCarloSettings MonteCarlo => ruleSet.MonteCarlo;

    public IReadOnlyList<Finding> Findings => findings;

    /// <summary>
    /// Records a key figure of a stage (or of the design, with a null stage) for the reports, whether or not a rule
    /// fires, with the limit a rule judged it against where there is one (<see cref="Figure.AtMost"/>,
    /// <see cref="Figure.AtLeast"/>): e.g. <c>FigureKinds.SlewDemand.Of("rect.u1.out", 14.2e6)</c>. A key recorded twice
    /// keeps the first value.
    /// </summary>
    public void Record(string? stageId, Figure figure)
    {
        var name = figure.Key;
        var key = stageId ?? string.Empty;
        lock (figures)
        {
            if (!figures.TryGetValue(key, out var list))
            {
                figures[key] = list = [];
            }

            if (list.All(f => f.Key != name))
            {
                list.Add(figure);
            }
        }
    }

    /// <summary>
    /// Records that <paramref name="ruleId"/> judged a stage's <paramref name="requirement"/> (compared a figure with it),
    /// whether or not it reported a finding. A requirement no rule judged is "not checked".
    /// </summary>
    public void Judged(string stageId, string requirement, RuleId ruleId)
    {
        lock (judged)
        {
            judged.Add((stageId, requirement, ruleId));
        }
    }

    /// <summary>The time steps the settled transient at <paramref name="end"/> took in its one run; −1 when it needed continuation runs.</summary>
    private long SettleSteps(BandEnd end)
    {
        var steady = Analyses.Steady(end);
        var statistics = steady.Result.Statistics;
        long steps = statistics.AcceptedSteps + statistics.RejectedSteps;
        var time = steady.Result.Time;
        if (Analyses.Chain(end).Period is not { } period || !(period > 0) || time.Count < 2)
        {
            return steps;
        }

        double last = (time[^1] - time[0]) / period;
        return last > 0 && steady.Periods > last * 1.01 ? -1 : steps;
    }

    /// <summary>Every (stage, requirement, rule) judgment recorded.</summary>
    public IReadOnlyCollection<(string Stage, string Requirement, string Rule)> Judgments => judged;

    /// <summary>
    /// Records the Monte Carlo samples of a stage's main figure with the requirement's limits, for the histogram of
    /// the datasheet page. A stage keeps the first distribution recorded.
    /// </summary>
    public void RecordDistribution(string stageId, SampleDistribution distribution)
    {
        lock (distributions)
        {
            distributions.TryAdd(stageId, distribution);
        }
    }

    /// <summary>Records a stage's yield estimate and verdict for the pages and the JSON report; a stage keeps the first.</summary>
    public void RecordYield(YieldEstimate estimate)
    {
        lock (yields)
        {
            if (yields.All(y => y.StageId != estimate.StageId))
            {
                yields.Add(estimate);
            }
        }
    }

    /// <summary>The recorded yield estimates, in the order they were judged.</summary>
    public IReadOnlyList<YieldEstimate> Yields => yields;

    /// <summary>The Monte Carlo yield verdict of each stage by stage id, judged once and shared by DR402 and DR406.</summary>
    internal Dictionary<string, Tolerance.YieldJudgement> YieldJudgements { get; } = new(StringComparer.Ordinal);

    /// <summary>The rule-set file in force, or null when the defaults apply.</summary>
    public string? RuleSetFile => ruleSet.File;

    /// <summary>The recorded Monte Carlo distributions, per stage id.</summary>
    public IReadOnlyDictionary<string, SampleDistribution> Distributions => distributions;

    /// <summary>The recorded figures, per stage id ("" for the design).</summary>
    public IReadOnlyDictionary<string, List<Figure>> Figures => figures;

    /// <summary>The level a rule has for this design and stage after the rule-set file's changes.</summary>
    public RuleLevel LevelOf(RuleId ruleId, string? stageId)
    {
        var level = ToLevel(RuleCatalogue.Default[ruleId].DefaultSeverity);
        foreach (var change in ruleSet.OverridesFor(ruleId, Design.Id.Value, stageId))
        {
            level = change.Level?.Value ?? level;
        }

        return level;
    }

    /// <summary>A threshold's value for this design and stage: catalogue default, then global, design and stage changes.</summary>
    public double Threshold(RuleId ruleId, string name, string? stageId)
    {
        var definition = RuleCatalogue.Default[ruleId].Thresholds.FirstOrDefault(t => t.Name == name)
            ?? throw new KeyNotFoundException($"{ruleId} has no threshold '{name}' in the catalogue.");
        var value = definition.Default.Value;
        foreach (var change in ruleSet.OverridesFor(ruleId, Design.Id.Value, stageId))
        {
            if (change.Thresholds.TryGetValue(name, out var q))
            {
                value = q.Value.Value;
            }
        }

        return value;
    }

    /// <summary>True when the rule is not switched off for this stage.</summary>
    public bool IsOn(RuleId ruleId, string? stageId) => LevelOf(ruleId, stageId) != RuleLevel.Off;

    /// <summary>Reports a finding of <paramref name="ruleId"/> unless the rule is off for the stage.</summary>
    public void Report(RuleId ruleId, string? stageId, SourceSpan span, IReadOnlyDictionary<string, string> arguments, params Figure[] figures) =>
        Report(ruleId, stageId, span, arguments, null, figures);

    /// <summary>
    /// Reports a finding with its computed fix hint (<see cref="FixHint"/>): the hint's text follows the catalogue message
    /// ("Fix: ..."), and the reports carry it as a <c>fix</c> object (JSON) and, for a YAML value, a SARIF fix.
    /// </summary>
    public void Report(RuleId ruleId, string? stageId, SourceSpan span, IReadOnlyDictionary<string, string> arguments, FixHint? fix, params Figure[] figures)
    {
        var level = LevelOf(ruleId, stageId);
        if (level == RuleLevel.Off)
        {
            return;
        }

        var rule = RuleCatalogue.Default[ruleId];
        var message = rule.Render(arguments);
        if (fix is not null)
        {
            message += " Fix: " + fix.Said;
        }

        lock (findings)
        {
            findings.Add(new Finding(ruleId, rule.Title, ToSeverity(level), message, span, rule.HelpPage,
                Design.Id.Value, stageId, null, figures) { Fix = fix });
        }
    }

    /// <summary>Reports an analysis that could not be completed, at the element or node it names.</summary>
    public void ReportFailure(string analysis, SimulationFailure failure, ElaboratedChain chain)
    {
        var rule = RuleCatalogue.Default[RuleIds.AnalysisFailed];
        var message = FailureMessage(analysis, Design.Id.Value, failure);
        if (findings.Any(f => f.RuleId == RuleIds.AnalysisFailed && f.Message == message))
        {
            return;
        }

        findings.Add(new Finding(RuleIds.AnalysisFailed, rule.Title, Severity.Error, message, chain.Locate(failure), rule.HelpPage, Design.Id.Value, null, null, []));
    }

    /// <summary>The DR920 message of a failed analysis: the failure in its own words (never the kind's code name) and where to look.</summary>
    public static string FailureMessage(string analysis, string designId, SimulationFailure failure) =>
        RuleCatalogue.Default[RuleIds.AnalysisFailed].Render([analysis, designId, failure.ToString(), FailureWording.Advice(failure.Kind)]);

    /// <summary>
    /// True when the transient at <paramref name="end"/> reached its periodic steady state. Otherwise reports DR925 once
    /// (at the design: what did not settle is the whole chain's state) and returns false, so that no rule judges an
    /// unsettled signal.
    /// </summary>
    public bool IsSettled(BandEnd end) => Analyses.IsSettled(end);

    void IAnalysisFailures.Failed(string analysis, SimulationFailure failure, ElaboratedChain chain) => ReportFailure(analysis, failure, chain);

    void IAnalysisFailures.Unsettled(BandEnd end, SettledTransient steady)
    {
        var rule = RuleCatalogue.Default[RuleIds.TransientNotSettled];
        var message = rule.Render([Design.Id.Value, end == BandEnd.Top ? "the top of the band" : "the bottom of the band",
            steady.Periods.ToString(CultureInfo.InvariantCulture), steady.Node ?? "?", Say.Volts(steady.Drift)]);
        lock (findings)
        {
            if (!findings.Any(f => f.RuleId == RuleIds.TransientNotSettled && f.Message == message))
            {
                findings.Add(new Finding(RuleIds.TransientNotSettled, rule.Title, Severity.Error, message, Design.Id.Span, rule.HelpPage, Design.Id.Value, null, null, []));
            }
        }
    }

    private static RuleLevel ToLevel(Severity severity) => severity switch
    {
        Severity.Error => RuleLevel.Error,
        Severity.Warning => RuleLevel.Warning,
        _ => RuleLevel.Note,
    };

    private static Severity ToSeverity(RuleLevel level) => level switch
    {
        RuleLevel.Error => Severity.Error,
        RuleLevel.Warning => Severity.Warning,
        _ => Severity.Note,
    };
}

/// <summary>Formats figures for messages: engineering notation, invariant culture.</summary>
internal static class Say
{
    public static string Volts(double v) => new Quantity(v, Dimension.Voltage).Format();

    public static string Amps(double a) => new Quantity(a, Dimension.Current).Format();

    public static string Ohms(double r) => new Quantity(r, Dimension.Resistance).Format();

    public static string Hertz(double f) => new Quantity(f, Dimension.Frequency).Format();

    public static string Seconds(double t) => new Quantity(t, Dimension.Time).Format();

    public static string Slew(double s) => new Quantity(s, Dimension.SlewRate).Format();

    public static string Watts(double p) => new Quantity(p, Dimension.Power).Format();

    public static string Percent(double ratio) => new Quantity(ratio, Dimension.Ratio).FormatPercent();

    public static string Ratio(double r) => new Quantity(r, Dimension.Ratio).Format();

    public static string Decibels(double ratio) =>
        (20 * Math.Log10(ratio)).ToString("0.#", CultureInfo.InvariantCulture) + " dB";
}
