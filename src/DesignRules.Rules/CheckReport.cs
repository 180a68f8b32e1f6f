using DesignRules.Diagnostics;

namespace DesignRules.Rules;

/// <summary>The result of one check run: every finding in a stable order, and the rules that were in force.</summary>
/// <param name="Findings">Findings ordered by file, line, column and rule id.</param>
/// <param name="Rules">Every rule the run knows, for reports that list the catalogue (e.g. SARIF's tool.driver).</param>
/// <param name="DesignCount">How many designs loaded and were checked.</param>
/// <param name="FileCount">How many files were read.</param>
public sealed record CheckReport(IReadOnlyList<Finding> Findings, IReadOnlyList<DiagnosticDescriptor> Rules, int DesignCount, int FileCount)
{
    /// <summary>Per design: its model and the key figures the rules computed, for datasheet pages and JSON.</summary>
    public IReadOnlyList<DesignSummary> Designs { get; init; } = [];

    /// <summary>
    /// Every file the check read or looked for: design and parts files, the parts files they name under
    /// <c>libraries:</c> (wherever they are) and the rule-set file. An incremental build reruns when any of them changes.
    /// </summary>
    public IReadOnlyList<string> LoadedFiles { get; init; } = [];

    /// <summary>Findings at error level that no waiver covers.</summary>
    public int ErrorCount => Findings.Count(f => f.Severity == Severity.Error && !f.IsWaived);

    /// <summary>Findings at warning level that no waiver covers.</summary>
    public int WarningCount => Findings.Count(f => f.Severity == Severity.Warning && !f.IsWaived);
}

/// <summary>One checked design with its key figures and plot data.</summary>
/// <param name="Design">The loaded design.</param>
/// <param name="DesignFigures">Figures of the design as a whole.</param>
/// <param name="StageFigures">Figures per stage id, in stage order.</param>
public sealed record DesignSummary(
    DesignRules.Model.Design Design,
    IReadOnlyList<Figure> DesignFigures,
    IReadOnlyList<KeyValuePair<string, IReadOnlyList<Figure>>> StageFigures)
{
    /// <summary>Plot data per stage, in stage order (empty when the design could not be analysed).</summary>
    public IReadOnlyList<StagePlots> Plots { get; init; } = [];

    /// <summary>The Monte Carlo yield of every stage judged against a yield, with its interval and verdict, in stage order.</summary>
    public IReadOnlyList<YieldEstimate> Yields { get; init; } = [];
    /// <summary>The verdict of every requirement of every stage, from the rules that judged it (see <see cref="Evaluation.RequirementTable"/>).</summary>
    public IReadOnlyList<RequirementVerdict> Requirements { get; init; } = [];
}

/// <summary>The verdict of one requirement of one stage.</summary>
/// <param name="StageId">The stage.</param>
/// <param name="Name">The requirement key (<c>glitch</c>, <c>accuracy</c>, ...).</param>
/// <param name="Verdict"><c>met</c>, <c>not met</c>, <c>waived</c> or <c>not checked</c>.</param>
/// <param name="JudgedBy">The rules that judged it (empty when none did).</param>
/// <param name="Reported">The rules among them that reported it unwaived (why it is not met).</param>
public sealed record RequirementVerdict(string StageId, string Name, string Verdict, IReadOnlyList<string> JudgedBy, IReadOnlyList<string> Reported);
