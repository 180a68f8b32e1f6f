namespace DesignRules.Rules;

/// <summary>What a check run needs besides the design files.</summary>
/// <param name="RuleSetFile">The optional rule-set file (severities, thresholds, Monte Carlo settings).</param>
/// <param name="Today">The date waivers' expiry is judged against; passed in so that runs are reproducible.</param>
public sealed record CheckOptions(string? RuleSetFile, DateOnly Today);
