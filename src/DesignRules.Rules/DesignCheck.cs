using DesignRules.Diagnostics;
using DesignRules.Loading;
using DesignRules.Model;
using DesignRules.Rules.Evaluation;

namespace DesignRules.Rules;

/// <summary>The one library entry point: the MSBuild task and the command line call only this.</summary>
public static class DesignCheck
{
    /// <summary>Loads the design and parts files and the rule-set file, evaluates every rule, and returns all findings.</summary>
    /// <param name="files">Design and parts files; order does not matter (they are sorted).</param>
    /// <param name="options">Rule-set file and the date for waiver expiry.</param>
    public static CheckReport Run(IEnumerable<string> files, CheckOptions options) => Run(files, options, null);

    /// <summary>
    /// As <see cref="Run(IEnumerable{string}, CheckOptions)"/>, and calls <paramref name="designChecked"/> once per design
    /// as soon as it is checked (in the order they finish, one call at a time), so that hosts can show progress.
    /// </summary>
    public static CheckReport Run(IEnumerable<string> files, CheckOptions options, Action<DesignProgress>? designChecked)
    {
        ArgumentNullException.ThrowIfNull(files);
        ArgumentNullException.ThrowIfNull(options);
        var ordered = files.Distinct(StringComparer.Ordinal).Order(StringComparer.Ordinal).ToList();
        var findings = new List<Finding>();

        var ruleSet = RuleSet.Default;
        if (options.RuleSetFile is not null)
        {
            var (read, problems) = RuleSetLoader.Load(options.RuleSetFile);
            ruleSet = read;
            findings.AddRange(problems.Select(FromDiagnostic));
        }

        var loaded = DesignLoader.LoadFiles(ordered);
        findings.AddRange(loaded.Diagnostics.Select(FromDiagnostic));
        findings.AddRange(UnknownDesignsInRuleSet(ruleSet, loaded));

        // Designs are independent: evaluate them side by side, then order the findings so output is deterministic.
        var perDesign = new (List<Finding> Findings, DesignSummary Summary)[loaded.Designs.Count];
        var gate = new object();
        Parallel.For(0, loaded.Designs.Count, i =>
        {
            var started = System.Diagnostics.Stopwatch.GetTimestamp();
            perDesign[i] = Evaluate(loaded.Designs[i], ruleSet, options.Today);
            if (designChecked is not null)
            {
                var open = perDesign[i].Findings.Where(f => !f.IsWaived).ToList();
                var progress = new DesignProgress(loaded.Designs[i].File, loaded.Designs[i].Id.Value,
                    open.Count(f => f.Severity == Severity.Error), open.Count(f => f.Severity == Severity.Warning),
                    System.Diagnostics.Stopwatch.GetElapsedTime(started));
                lock (gate)
                {
                    designChecked(progress);
                }
            }
        });
        foreach (var (list, _) in perDesign)
        {
            findings.AddRange(list);
        }

        return new CheckReport(Sort(findings), RuleCatalogue.Default.Rules, loaded.Designs.Count, ordered.Count)
        {
            Designs = perDesign.Select(p => p.Summary).ToList(),
        };
    }

    internal static (List<Finding> Findings, DesignSummary Summary) Evaluate(Design design, RuleSet ruleSet, DateOnly today)
    {
        var evaluation = new DesignEvaluation(design, ruleSet);
        foreach (var rule in RuleRegistry.All)
        {
            rule.Evaluate(evaluation);
        }

        var findings = Waivers.Apply(design, evaluation.Findings, today, evaluation.IsOn);
        static IReadOnlyList<Figure> Sorted(List<Figure>? list) => list?.ToList() ?? [];
        var summary = new DesignSummary(
            design,
            Sorted(evaluation.Figures.GetValueOrDefault(string.Empty)),
            design.Stages.Select(s => new KeyValuePair<string, IReadOnlyList<Figure>>(s.Id.Value, Sorted(evaluation.Figures.GetValueOrDefault(s.Id.Value)))).ToList())
        {
            Plots = PlotCollector.Collect(evaluation),
            Yields = design.Stages.Select(s => evaluation.Yields.FirstOrDefault(y => y.StageId == s.Id.Value)).OfType<YieldEstimate>().ToList(),
        };
        return (findings, summary);
    }

    private static IEnumerable<Finding> UnknownDesignsInRuleSet(RuleSet ruleSet, LoadResult loaded)
    {
        var ids = loaded.Designs.Select(d => d.Id.Value).ToList();
        foreach (var design in ruleSet.Designs.Values.Where(d => !ids.Contains(d.Id.Value)))
        {
            // Only when every design loaded can an unknown id be told from a design that failed to load.
            if (!loaded.HasErrors)
            {
                yield return FromDiagnostic(DesignFileDiagnostics.UnknownChoice.At(design.Id.Span, design.Id.Value, "a design id",
                    SpellingSuggestion.Hint(design.Id.Value, ids), string.Join(", ", ids)));
            }
        }
    }

    private static Finding FromDiagnostic(Diagnostic d)
    {
        var title = RuleCatalogue.Default.TryGet(d.Id, out var rule) && rule is not null ? rule.Title : d.Id;
        return new Finding(d.Id, title, d.Severity, d.Message, d.Span, d.HelpPage, null, null, null, []);
    }

    private static List<Finding> Sort(List<Finding> findings) =>
        findings.OrderBy(f => f.Span.File, StringComparer.Ordinal).ThenBy(f => f.Span.Line).ThenBy(f => f.Span.Column)
            .ThenBy(f => f.RuleId, StringComparer.Ordinal).ThenBy(f => f.Message, StringComparer.Ordinal).ToList();
}
