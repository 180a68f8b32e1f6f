using DesignRules.Quantities;

namespace DesignRules.Model;

/// <summary>How a rule's findings are reported; <see cref="Off"/> drops them.</summary>
public enum RuleLevel
{
    /// <summary>The rule is not evaluated.</summary>
    Off,
    /// <summary>Reported as information.</summary>
    Note,
    /// <summary>Reported as a warning.</summary>
    Warning,
    /// <summary>Reported as an error; fails the build.</summary>
    Error,
}

/// <summary>How tolerance bands are sampled in Monte Carlo analysis.</summary>
public enum ToleranceDistribution
{
    /// <summary>Normal, with the tolerance taken as ±3σ and samples truncated at ±3σ.</summary>
    Normal,
    /// <summary>Uniform across the tolerance band.</summary>
    Uniform,
}

/// <summary>Monte Carlo settings: sample count, seed and distribution.</summary>
/// <param name="Samples">Samples per stage.</param>
/// <param name="Seed">Seed of the random number generator; same seed, same results.</param>
/// <param name="Distribution">How tolerances are sampled.</param>
public sealed record MonteCarloSettings(int Samples, int Seed, ToleranceDistribution Distribution)
{
    /// <summary>The sample cap of sequential sampling when the rule-set file gives none.</summary>
    public const int DefaultMaxSamples = 50_000;

    /// <summary>1,000 samples, seed 1, normal distribution.</summary>
    public static MonteCarloSettings Default { get; } = new(1000, 1, ToleranceDistribution.Normal);

    /// <summary>
    /// Keep drawing batches of <see cref="Samples"/> while a yield requirement is neither shown nor refuted, up to
    /// <see cref="MaxSamples"/>. Sample i is the same whether it is drawn in the first batch or a later one.
    /// </summary>
    public bool Sequential { get; init; }

    /// <summary>The most samples a stage may draw when <see cref="Sequential"/> is on.</summary>
    public int MaxSamples { get; init; } = DefaultMaxSamples;

    /// <summary>
    /// The most samples a rule set may ask for, as a batch (<c>samples</c>) or as the cap of sequential sampling
    /// (<c>max-samples</c>): 50,000 resolves a yield to a few hundredths of a percent and costs the example repository
    /// tens of seconds, where a million cost many minutes (the README's limits table lists it).
    /// </summary>
    public const int SampleLimit = 50_000;

    /// <summary>The accepted sample counts, in words.</summary>
    public const string SamplesRange = "a whole number from 10 to 50,000 (the tool's limit on Monte Carlo samples)";
}

/// <summary>A change to one rule: its level and any thresholds.</summary>
/// <param name="Level">The new level, if changed.</param>
/// <param name="Thresholds">Threshold values by name.</param>
public sealed record RuleOverride(Located<RuleLevel>? Level, IReadOnlyDictionary<string, Located<Quantity>> Thresholds);

/// <summary>Rule changes for one design: for the whole design and per stage.</summary>
/// <param name="Id">The design id as written.</param>
/// <param name="Rules">Changes for the whole design, by rule id.</param>
/// <param name="Stages">Changes per stage id, by rule id.</param>
public sealed record DesignRuleOverrides(
    Located<string> Id,
    IReadOnlyDictionary<string, RuleOverride> Rules,
    IReadOnlyDictionary<string, IReadOnlyDictionary<string, RuleOverride>> Stages);

/// <summary>The optional rule-set file: Monte Carlo settings and rule changes, global, per design and per stage.</summary>
/// <param name="File">The file it was read from, or null for the defaults.</param>
/// <param name="MonteCarlo">Monte Carlo settings.</param>
/// <param name="Rules">Changes for every design, by rule id.</param>
/// <param name="Designs">Changes per design id.</param>
public sealed record RuleSet(
    string? File,
    MonteCarloSettings MonteCarlo,
    IReadOnlyDictionary<string, RuleOverride> Rules,
    IReadOnlyDictionary<string, DesignRuleOverrides> Designs)
{
    /// <summary>No changes: every rule at its catalogue level and thresholds.</summary>
    public static RuleSet Default { get; } = new(null, MonteCarloSettings.Default,
        new Dictionary<string, RuleOverride>(StringComparer.Ordinal), new Dictionary<string, DesignRuleOverrides>(StringComparer.Ordinal));

    /// <summary>The overrides that apply to a rule for a design and stage, broadest first.</summary>
    public IEnumerable<RuleOverride> OverridesFor(string ruleId, string? designId, string? stageId)
    {
        if (Rules.TryGetValue(ruleId, out var global))
        {
            yield return global;
        }

        if (designId is null || !Designs.TryGetValue(designId, out var design))
        {
            yield break;
        }

        if (design.Rules.TryGetValue(ruleId, out var forDesign))
        {
            yield return forDesign;
        }

        if (stageId is not null && design.Stages.TryGetValue(stageId, out var stage) && stage.TryGetValue(ruleId, out var forStage))
        {
            yield return forStage;
        }
    }
}
