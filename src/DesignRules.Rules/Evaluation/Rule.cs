namespace DesignRules.Rules.Evaluation;

/// <summary>
/// One rule: the catalogue entry with the same id holds its title, level, message and thresholds; the class holds
/// only how the figure is compared with the limit.
/// </summary>
internal abstract class Rule
{
    /// <summary>The catalogue id this class implements.</summary>
    public abstract DesignRules.Diagnostics.RuleId Id { get; }

    /// <summary>Compares the design's figures with the rule's limits and reports through <paramref name="evaluation"/>.</summary>
    public abstract void Evaluate(DesignEvaluation evaluation);
}
