namespace DesignRules.Rules.Evaluation;

/// <summary>Every implemented rule, one instance each. A convention test checks it matches the catalogue.</summary>
internal static class RuleRegistry
{
    public static IReadOnlyList<Rule> All { get; } = typeof(Rule).Assembly.GetTypes()
        .Where(t => t.IsSubclassOf(typeof(Rule)) && !t.IsAbstract)
        .Select(t => (Rule)Activator.CreateInstance(t)!)
        .OrderBy(r => r.Id, StringComparer.Ordinal)
        .ToList();
}
