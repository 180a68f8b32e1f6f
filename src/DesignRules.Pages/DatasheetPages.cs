using System.Collections.Concurrent;
using DesignRules.Diagnostics;
using DesignRules.Rules;
using Scriban;
using Scriban.Runtime;
using Scriban.Syntax;

namespace DesignRules.Pages;

/// <summary>
/// Writes the datasheet pages of a check: an index, a page per design with a section per stage, and SVG plots
/// beside them. Same report, same bytes. The MSBuild task and the command line both call this after the check.
/// </summary>
public static class DatasheetPages
{
    /// <summary>The id of a pages folder the tool will not write into (a file in its place, a link, a file in the way, a lock held too long).</summary>
    public static RuleId FolderProblemId => RuleIds.PagesFolderRefused;

    private static DiagnosticDescriptor FolderProblem => RuleCatalogue.Default[FolderProblemId];

    /// <summary>
    /// The sub-folder of the pages folder that holds a copy of every rule help page a page links to, so that each link
    /// resolves where the pages are read (a wiki, a forge's file view), not inside a package cache.
    /// </summary>
    public const string HelpFolder = "rules";

    /// <summary>Renders every page of <paramref name="report"/> into the options' output folder.</summary>
    public static PageResult Write(CheckReport report, PageOptions options)
    {
        ArgumentNullException.ThrowIfNull(report);
        ArgumentNullException.ThrowIfNull(options);
        var diagnostics = new List<Diagnostic>();
        var templates = TemplateSet.Load(options.TemplateFolder, diagnostics);
        if (!templates.IsComplete)
        {
            // Half a set of pages would mislead a wiki reader; leave the previous pages as they are.
            return new PageResult([], [], diagnostics);
        }

        var output = new OutputFolder(options.OutputFolder) { MaxParallel = options.MaxParallelDesigns ?? -1 };
        var parallel = new ParallelOptions { MaxDegreeOfParallelism = options.MaxParallelDesigns ?? -1, TaskScheduler = TaskScheduler.Current };
        var pages = new List<(DesignSummary Summary, string Page)>();
        var designs = new List<(DesignSummary Summary, string Name, string Page, List<string> Files)>();
        foreach (var summary in report.Designs.OrderBy(d => d.Design.Id.Value, StringComparer.Ordinal))
        {
            var name = OutputFolder.SafeName(summary.Design.Id.Value);
            var page = $"{name}.md";
            var files = new List<string> { page };
            foreach (var plots in summary.Plots)
            {
                var stage = OutputFolder.SafeName(plots.StageId);
                files.AddRange(new (object? Data, string Kind)[] { (plots.Transient, "transient"), (plots.Bode, "response"), (plots.Distribution, "monte-carlo"), (plots.Noise, "noise") }
                    .Where(p => p.Data is not null).Select(p => $"plots/{name}/{stage}-{p.Kind}.svg"));

                // The stability plots belong to the page as much as the others: a kept page keeps them, or they would vanish.
                files.AddRange(plots.LoopGains.Select(l => LoopGainFile(name, stage, l)));
                if (plots.Step is not null)
                {
                    files.Add(StepFile(name, stage));
                }
            }

            designs.Add((summary, name, page, files));
        }

        // A design whose page depends on nothing that changed keeps its page and plots as they are: no rendering. Whether
        // it may is one status call per file (a large repository's pages are thousands of files), so the designs are
        // looked at side by side; each answer is its own design's, and they are used below in the designs' order.
        var keep = new bool[designs.Count];
        if (options.Reuse is { } reuse && designs.Count > 0)
        {
            Parallel.ForEach(Partitioner.Create(0, designs.Count, 16), parallel, range =>
            {
                for (var i = range.Item1; i < range.Item2; i++)
                {
                    keep[i] = reuse.CanKeep(designs[i].Summary.Design.Id.Value, designs[i].Files, output);
                }
            });
        }

        // Each design's page and each of its plots is rendered on its own (a full check of a large repository renders
        // hundreds of pages, and a one-design change renders one page with a dozen plots: one at a time they would keep a
        // second core idle), and so is the index, which is rendered meanwhile on the assumption that every page renders (it
        // lists each design with a page; when a page's template fails, it is rendered again below without that page).
        // Results are gathered in the designs' and plots' order, so the folder, the manifest and the diagnostics come out
        // the same whatever order the renderings finished in.
        var jobs = new List<(int Design, string File, Func<string> Render)>();
        var pageTexts = new (string? Text, List<Diagnostic> Diagnostics)[designs.Count];
        for (var i = 0; i < designs.Count; i++)
        {
            if (!keep[i])
            {
                var at = i;
                jobs.Add((i, designs[i].Page, () =>
                {
                    var design = designs[at];
                    pageTexts[at] = RenderPage(report, design.Summary, design.Name, templates, options);
                    return string.Empty;
                }));
                jobs.AddRange(PlotJobs(designs[i].Summary, designs[i].Name).Select(p => (i, p.File, p.Render)));
            }
        }

        var assumed = designs.Select(d => (d.Summary, d.Page)).ToList();
        var indexDiagnostics = new List<Diagnostic>();
        string? index = null;
        jobs.Add((-1, "index.md", () =>
        {
            index = Render(templates, "index", "index", PageModel.Index(report, assumed), indexDiagnostics);
            return string.Empty;
        }));
        var texts = new string[jobs.Count];
        // One job per core at a time, as the check takes one design at a time (DesignCheck.Run), so no core ends holding a
        // range of several while the other idles.
        var indices = Partitioner.Create(Enumerable.Range(0, jobs.Count), EnumerablePartitionerOptions.NoBuffering);
        Parallel.ForEach(indices, parallel, j => texts[j] = jobs[j].Render());

        var plotsOf = new Dictionary<int, List<(string File, string Text)>>();
        for (var j = 0; j < jobs.Count; j++)
        {
            var (design, file, _) = jobs[j];
            if (design >= 0 && file != designs[design].Page)
            {
                (plotsOf.TryGetValue(design, out var list) ? list : plotsOf[design] = []).Add((file, texts[j]));
            }
        }

        for (var i = 0; i < designs.Count; i++)
        {
            var (summary, _, page, files) = designs[i];
            if (keep[i])
            {
                foreach (var file in files)
                {
                    output.Keep(file);
                }

                pages.Add((summary, page));
                continue;
            }

            diagnostics.AddRange(pageTexts[i].Diagnostics);
            if (pageTexts[i].Text is not { } text)
            {
                continue;
            }

            // The page first, then its plots in the order the stages list them: the order they were always gathered in.
            var contents = new Dictionary<string, string>(StringComparer.Ordinal) { [page] = text };
            foreach (var (file, plot) in plotsOf.GetValueOrDefault(i) ?? [])
            {
                contents[file] = plot;
            }

            foreach (var (file, content) in contents)
            {
                output.Write(file, content);
            }

            options.Reuse?.Record(summary.Design.Id.Value, contents);
            pages.Add((summary, page));
        }

        if (pages.Count != assumed.Count)
        {
            // A page's template failed: the index lists only the pages that were written.
            indexDiagnostics.Clear();
            index = Render(templates, "index", "index", PageModel.Index(report, pages), indexDiagnostics);
        }

        diagnostics.AddRange(indexDiagnostics);
        if (index is not null)
        {
            output.Write("index.md", index);
        }

        if (options.HelpUriBase is null)
        {
            // Every rule of the run, not only those the pages mention: build diagnostics link to these copies too, and a
            // design that failed to load has no page but does have findings.
            var linked = report.Findings.Select(f => f.RuleId).Distinct(StringComparer.Ordinal).Order(StringComparer.Ordinal);
            foreach (var id in linked)
            {
                if (RuleHelp.Markdown(id) is { } help)
                {
                    output.Write($"{HelpFolder}/{id}.md", help);
                }
            }
        }

        try
        {
            var removed = output.Commit(diagnostics);
            options.Reuse?.Save(output);
            return new PageResult(output.Written.ToList(), removed, diagnostics) { Kept = output.Kept.ToList() };
        }
        catch (PagesFolderException ex)
        {
            options.Reuse?.Discard();
            diagnostics.Add(FolderProblem.At(SourceSpan.WholeFile(ex.Path), ex.Message));
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
        {
            diagnostics.Add(FolderProblem.At(SourceSpan.WholeFile(options.OutputFolder),
                $"the pages folder '{options.OutputFolder}' cannot be written ({ex.Message.TrimEnd('.')})"));
        }

        return new PageResult([], [], diagnostics);
    }

    /// <summary>One design's page; null text when its template failed (said in the diagnostics).</summary>
    private static (string? Text, List<Diagnostic> Diagnostics) RenderPage(
        CheckReport report, DesignSummary summary, string name, TemplateSet templates, PageOptions options)
    {
        var diagnostics = new List<Diagnostic>();
        string? PlotPath(string stage, string kind) => $"plots/{name}/{OutputFolder.SafeName(stage)}-{kind}.svg";
        var model = PageModel.Design(report, summary, options.RepositoryRoot, PlotPath, id => HelpLink(id, options));
        return (Render(templates, "design", "design", model, diagnostics), diagnostics);
    }

    /// <summary>One design's plot files, by name, each with the renderer that makes it, in the order the page's files were always gathered in.</summary>
    private static List<(string File, Func<string> Render)> PlotJobs(DesignSummary summary, string name)
    {
        var jobs = new List<(string File, Func<string> Render)>();
        foreach (var plots in summary.Plots)
        {
            var stage = OutputFolder.SafeName(plots.StageId);
            if (plots.Transient is { } transient)
            {
                jobs.Add(($"plots/{name}/{stage}-transient.svg", () => PlotRenderer.Transient(plots.StageId, transient)));
            }

            if (plots.Bode is { } bode)
            {
                jobs.Add(($"plots/{name}/{stage}-response.svg", () => PlotRenderer.Response(plots.StageId, bode)));
            }

            foreach (var loop in plots.LoopGains)
            {
                jobs.Add((LoopGainFile(name, stage, loop), () => StabilityPlotRenderer.LoopGain(plots.StageId, loop)));
            }

            if (plots.Step is { } step)
            {
                jobs.Add((StepFile(name, stage), () => StabilityPlotRenderer.Step(plots.StageId, step)));
            }

            if (plots.Distribution is { } distribution)
            {
                jobs.Add(($"plots/{name}/{stage}-monte-carlo.svg", () => PlotRenderer.Histogram(plots.StageId, distribution)));
            }

            if (plots.Noise is { } noise)
            {
                jobs.Add(($"plots/{name}/{stage}-noise.svg", () => PlotRenderer.NoiseDensity(plots.StageId, noise)));
            }
        }

        return jobs;
    }

    /// <summary>A rule's help link as a page in the pages folder's root writes it.</summary>
    // The same names PageModel links: "{stage}-loop-{amplifier}" and "{stage}-step" through the plot-path function.
    private static string LoopGainFile(string design, string stage, LoopGainPlot loop) =>
        $"plots/{design}/{stage}-loop-{OutputFolder.SafeName(loop.Amplifier)}.svg";

    private static string StepFile(string design, string stage) => $"plots/{design}/{stage}-step.svg";

    private static string HelpLink(string ruleId, PageOptions options) =>
        options.HelpUriBase is { } root ? root.TrimEnd('/', '\\') + "/" + ruleId + ".md" : $"{HelpFolder}/{ruleId}.md";

    private static string? Render(TemplateSet templates, string name, string variable, ScriptObject model, List<Diagnostic> diagnostics)
    {
        var (template, path, _) = templates[name];
        var globals = EngineeringFunctions.Create();
        globals[variable] = model;
        globals["include"] = new MarkdownInclude();
        var context = new MarkdownTemplateContext
        {
            TemplateLoader = templates,
            StrictVariables = true,
            EnableRelaxedMemberAccess = false,
            LoopLimit = 100_000,
            RecursiveLimit = 50,
            NewLine = "\n",
            MemberRenamer = member => member.Name,
        };
        context.PushGlobal(globals);
        context.PushCulture(System.Globalization.CultureInfo.InvariantCulture);
        try
        {
            return template.Render(context);
        }
        catch (ScriptRuntimeException ex)
        {
            var file = string.IsNullOrEmpty(ex.Span.FileName) ? path : ex.Span.FileName;
            diagnostics.Add(TemplateSet.Error(file, ex.Span, ex.OriginalMessage));
            return null;
        }
    }
}
