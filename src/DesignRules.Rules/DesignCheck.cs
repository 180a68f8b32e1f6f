using System.Collections.Concurrent;
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
        if (loaded.Designs.Count == 0 && !loaded.HasErrors && options.Search is { } search)
        {
            // Nothing to check is not a pass: name what was searched, so a wrong folder or pattern is found at once. (A
            // design file that failed to load has its own errors already; it was found.)
            var rule = RuleCatalogue.Default[RuleIds.NoDesignFound];
            findings.Add(new Finding(RuleIds.NoDesignFound, rule.Title, rule.DefaultSeverity, rule.Render([search.Description]),
                SourceSpan.WholeFile(search.Location), rule.HelpPage, null, null, null, []));
        }

        // Designs are independent: evaluate them side by side, then order the findings so output is deterministic. A
        // result store (the run layer's cache) may hand back the result of an earlier check of exactly the same design.
        options.DesignsLoaded?.Invoke(loaded.Designs.Count);
        var perDesign = new (List<Finding> Findings, DesignSummary Summary)[loaded.Designs.Count];
        var gate = new object();
        var completed = 0;
        // One design at a time per core (no chunks): Parallel.For hands each core a growing range of indices, so near the
        // end one core could still hold several designs while the other idles; taking the next design only when the last
        // is done leaves at most one design's time at the end with a core idle.
        var indices = Partitioner.Create(Enumerable.Range(0, loaded.Designs.Count), EnumerablePartitionerOptions.NoBuffering);
        Parallel.ForEach(indices, new ParallelOptions { MaxDegreeOfParallelism = options.MaxDegreeOfParallelism ?? -1, TaskScheduler = TaskScheduler.Current }, i =>
        {
            var started = System.Diagnostics.Stopwatch.GetTimestamp();
            var design = loaded.Designs[i];
            var kept = options.Results?.Find(design, ruleSet, options.Today);
            if (kept is not null)
            {
                perDesign[i] = ([.. kept.Findings], kept.Summary);
            }
            else
            {
                perDesign[i] = Evaluate(design, ruleSet, options.Today, options.MaxDegreeOfParallelism ?? -1);
                options.Results?.Keep(design, ruleSet, options.Today, new DesignResult(perDesign[i].Findings, perDesign[i].Summary));
            }

            if (designChecked is not null)
            {
                var open = perDesign[i].Findings.Where(f => !f.IsWaived).ToList();
                lock (gate)
                {
                    completed++;
                    designChecked(new DesignProgress(design.File, design.Id.Value,
                        open.Count(f => f.Severity == Severity.Error), open.Count(f => f.Severity == Severity.Warning),
                        System.Diagnostics.Stopwatch.GetElapsedTime(started))
                    {
                        FromStore = kept is not null,
                        JustEvaluated = kept?.JustEvaluated == true,
                        Completed = completed,
                        Total = loaded.Designs.Count,
                    });
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
            LoadedFiles = [.. loaded.Files.Concat(options.RuleSetFile is null ? [] : [Path.GetFullPath(options.RuleSetFile)]).Distinct(StringComparer.Ordinal).Order(StringComparer.Ordinal)],
        };
    }

    internal static (List<Finding> Findings, DesignSummary Summary) Evaluate(Design design, RuleSet ruleSet, DateOnly today, int maxDegreeOfParallelism = -1)
    {
        var evaluation = new DesignEvaluation(design, ruleSet, maxDegreeOfParallelism);
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
            Requirements = Verdicts(design, evaluation, findings),
        };
        return (findings, summary);
    }

    /// <summary>
    /// Each stated requirement's verdict, only from the rules that judged it: not met when one of them reported it
    /// (unwaived, above note level), waived when its only reports are waived, met when one judged it without a report,
    /// and not checked when none judged it.
    /// </summary>
    private static List<RequirementVerdict> Verdicts(Design design, DesignEvaluation evaluation, List<Finding> findings)
    {
        var list = new List<RequirementVerdict>();
        foreach (var stage in design.Stages)
        {
            foreach (var (kind, _) in RequirementTable.Stated(stage.Requirements))
            {
                string name = kind.Key;
                string id = stage.Id.Value;
                var rules = kind.Rules;
                var reports = findings.Where(f => f.StageId == id && rules.Contains(f.RuleId)).ToList();
                var judgedBy = evaluation.Judgments.Where(j => j.Stage == id && j.Requirement == name).Select(j => j.Rule)
                    .Concat(reports.Select(f => f.RuleId)).Distinct().Order(StringComparer.Ordinal).ToList();
                var open = reports.Where(f => !f.IsWaived && f.Severity != Severity.Note).Select(f => f.RuleId).Distinct().Order(StringComparer.Ordinal).ToList();
                var verdict = open.Count > 0 ? "not met" : reports.Any(f => f.IsWaived) ? "waived" : judgedBy.Count > 0 ? "met" : "not checked";
                list.Add(new RequirementVerdict(id, name, verdict, judgedBy, open));
            }
        }

        return list;
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
