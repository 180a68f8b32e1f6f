using DesignRules.Loading;
using DesignRules.Reports;
using DesignRules.Rules;

namespace DesignRules.Run;

/// <summary>
/// Everything one run needs, read from the command line's options (<see cref="FromCommandLine"/>) or the MSBuild task's
/// properties (<see cref="FromBuild"/>). Paths are full paths.
/// </summary>
/// <param name="Files">Design and parts files to check, in any order.</param>
/// <param name="Root">The repository root: the rule-set file, templates and page paths are found from it.</param>
/// <param name="Today">The date waiver expiry is judged against.</param>
public sealed record RunRequest(IReadOnlyList<string> Files, string Root, DateOnly Today)
{
    /// <summary>The file name that sends a report to standard output instead of a file.</summary>
    public const string StandardOutput = "-";

    /// <summary>The rule-set file, or null for none.</summary>
    public string? RuleSetFile { get; init; }

    /// <summary>Level changes applied after the rule set (<c>--levels</c>, <c>DesignRulesLevels</c>).</summary>
    public LevelOverrides Levels { get; init; } = LevelOverrides.None;

    /// <summary>How the host treats warnings (all or some as errors, some not at all); reports say what the host said.</summary>
    public WarningLevels Warnings { get; init; } = WarningLevels.None;

    /// <summary>Where the SARIF report goes: a file, <see cref="StandardOutput"/>, or null for none.</summary>
    public string? SarifFile { get; init; }

    /// <summary>Where the JSON report goes: a file, <see cref="StandardOutput"/>, or null for none.</summary>
    public string? JsonFile { get; init; }

    /// <summary>The folder SARIF and JSON paths are relative to.</summary>
    public string ReportRoot { get; init; } = string.Empty;

    /// <summary>The address help links start with, or null.</summary>
    public string? HelpUriBase { get; init; }

    /// <summary>The pages folder, or null for no pages.</summary>
    public string? PagesFolder { get; init; }

    /// <summary>The repository's own templates, or null for the built-in ones.</summary>
    public string? TemplateFolder { get; init; }

    /// <summary>What was searched for design files, for the "no design found" error.</summary>
    public DesignSearch? Search { get; init; }

    /// <summary>
    /// The folder of the per-design results cache (<c>obj/…/designrules/cache</c> in a build, <c>--cache DIR</c> on the
    /// command line), or null to evaluate every design.
    /// </summary>
    public string? CacheFolder { get; init; }

    /// <summary>The most threads each parallel loop of the run uses (designs, the runs inside a design, pages): 1 runs it on one thread; null for one per core.</summary>
    public int? MaxDegreeOfParallelism { get; init; }

    /// <summary>
    /// The baseline report (a JSON report of an earlier run, <c>--baseline</c>, <c>DesignRulesBaseline</c>), read when the
    /// request was made; null for none. With it every SARIF result carries its <c>baselineState</c>.
    /// </summary>
    public Reports.Comparison.ReportSnapshot? Baseline { get; init; }

    /// <summary>
    /// The new-only gate (<c>--new-only</c>, <c>DesignRulesNewOnly</c>): only findings new against <see cref="Baseline"/>
    /// fail the run; the others are shown as notes that say they are in the baseline.
    /// </summary>
    public bool NewOnly { get; init; }

    /// <summary>
    /// A build's head start (<c>DesignRulesHeadStart</c>): a run that only fills the results cache while the build restores,
    /// ahead of the build's own check.
    /// </summary>
    public bool HeadStart { get; init; }

    /// <summary>Stands in for the tool's identity in cache keys (tests: "another tool version"); null for the real one.</summary>
    internal string? ToolIdentityOverride { get; init; }

    /// <summary>Reads the command line's options; every unusable option or path is a problem, never an exception.</summary>
    public static RequestParse FromCommandLine(CommandLineInputs inputs)
    {
        ArgumentNullException.ThrowIfNull(inputs);
        var problems = new List<RequestProblem>();
        var given = inputs.Paths.Count > 0 ? inputs.Paths : ["."];
        var files = RepositoryFiles.Find(given, out var missing);
        problems.AddRange(missing.Select(path => new RequestProblem(path, "no such file or folder")));

        var root = inputs.Root ?? (given.Count == 1 && Directory.Exists(given[0]) ? given[0] : ".");
        var ruleSet = inputs.RuleSet;
        if (ruleSet is not null && !File.Exists(ruleSet))
        {
            problems.Add(new RequestProblem(ruleSet, "no such rule-set file"));
        }

        var levels = LevelOverrides.Parse(inputs.Levels, out var levelProblem);
        if (levels is null)
        {
            problems.Add(new RequestProblem("--levels", levelProblem!));
        }

        var today = RepositoryConventions.Today();
        if (inputs.Today is not null && !RepositoryConventions.TryParseDate(inputs.Today, out today))
        {
            problems.Add(new RequestProblem("--today", DateProblem));
        }

        if (!Directory.Exists(root))
        {
            problems.Add(new RequestProblem(root, "no such folder"));
        }

        // Report and pages paths that cannot be written are the user's mistake: say so now, before the check runs.
        AddOutputProblems(problems, ("--sarif", inputs.Sarif), ("--json", inputs.Json), ("--pages", inputs.Pages));
        if (inputs.Sarif == StandardOutput && inputs.Json == StandardOutput)
        {
            problems.Add(new RequestProblem("--sarif, --json", "only one report can go to standard output ('-'); give the other a file name"));
        }

        if (inputs.Pages is not null && inputs.Templates is not null && !Directory.Exists(inputs.Templates))
        {
            problems.Add(new RequestProblem(inputs.Templates, "no such template folder"));
        }

        var baseline = ReadBaseline(problems, ("--baseline", inputs.Baseline), ("--new-only", inputs.NewOnly));

        if (inputs.Cache is not null && File.Exists(inputs.Cache))
        {
            problems.Add(new RequestProblem("--cache", $"'{Diagnostics.DiagnosticText.Escape(inputs.Cache)}' is a file, not a folder; name a folder for the cache (it is created when missing)"));
        }

        if (problems.Count > 0)
        {
            return new RequestParse(null, problems);
        }

        ruleSet ??= RepositoryConventions.FindRuleSet(root);
        var request = new RunRequest(files.ToList(), Path.GetFullPath(root), today)
        {
            RuleSetFile = ruleSet is null ? null : Path.GetFullPath(ruleSet),
            Levels = levels!,
            Warnings = inputs.WarningsAsErrors ? WarningLevels.None with { AllAsErrors = true } : WarningLevels.None,
            SarifFile = Output(inputs.Sarif),
            JsonFile = Output(inputs.Json),
            ReportRoot = inputs.Root is { } explicitRoot ? Path.GetFullPath(explicitRoot) : RepositoryPaths.FindRepositoryRoot(root),
            HelpUriBase = inputs.HelpUriBase,
            PagesFolder = inputs.Pages is null ? null : Path.GetFullPath(inputs.Pages),
            TemplateFolder = inputs.Pages is null || inputs.Templates is null ? null : Path.GetFullPath(inputs.Templates),
            Search = new DesignSearch(Path.GetFullPath(given[0]), string.Join("; ", given.Select(RepositoryFiles.Searched))),
            CacheFolder = inputs.Cache is null ? null : Path.GetFullPath(inputs.Cache),
            Baseline = baseline,
            NewOnly = inputs.NewOnly,
        };
        return new RequestParse(request, []);
    }

    /// <summary>Reads the MSBuild task's properties; every unusable property is a problem, never an exception.</summary>
    public static RequestParse FromBuild(BuildInputs inputs)
    {
        ArgumentNullException.ThrowIfNull(inputs);
        var problems = new List<RequestProblem>();
        var root = Path.GetFullPath(Blank(inputs.RepositoryRoot) ?? Directory.GetCurrentDirectory());
        var levels = LevelOverrides.Parse(inputs.Levels, out var levelProblem);
        if (levels is null)
        {
            problems.Add(new RequestProblem("DesignRulesLevels", levelProblem!));
        }

        // A mistyped DesignRulesToday is the user's input, like a mistyped --today: a plain error, not a fault of the tool.
        var today = RepositoryConventions.Today();
        if (Blank(inputs.Today) is { } todayText && !RepositoryConventions.TryParseDate(todayText, out today))
        {
            problems.Add(new RequestProblem("DesignRulesToday", $"'{Diagnostics.DiagnosticText.Escape(todayText)}' is not a date; {DateProblem}"));
        }

        AddOutputProblems(problems, ("DesignRulesSarifFile", Blank(inputs.SarifFile)), ("DesignRulesJsonFile", Blank(inputs.JsonFile)),
            ("DesignRulesPagesFolder", Blank(inputs.PagesFolder)));
        var baseline = ReadBaseline(problems, ("DesignRulesBaseline", Blank(inputs.BaselineFile)), ("DesignRulesNewOnly", inputs.NewOnly));
        if (problems.Count > 0)
        {
            return new RequestParse(null, problems);
        }

        var searched = Blank(inputs.Searched)?.Trim() ?? "the DesignRulesDesign items (empty)";
        var request = new RunRequest(
            inputs.Files.Where(f => f.Length > 0).Select(Path.GetFullPath).Distinct(StringComparer.Ordinal).ToList(), root, today)
        {
            RuleSetFile = Blank(inputs.RuleSetFile) is { } ruleSet ? Path.GetFullPath(ruleSet) : null,
            Levels = levels!,
            Warnings = inputs.Warnings,
            SarifFile = Blank(inputs.SarifFile) is { } sarif ? Path.GetFullPath(sarif) : null,
            JsonFile = Blank(inputs.JsonFile) is { } json ? Path.GetFullPath(json) : null,
            ReportRoot = Blank(inputs.ReportRoot) is { } reportRoot ? Path.GetFullPath(reportRoot) : RepositoryPaths.FindRepositoryRoot(root),
            HelpUriBase = Blank(inputs.HelpUriBase),
            PagesFolder = Blank(inputs.PagesFolder) is { } pages ? Path.GetFullPath(pages) : null,
            TemplateFolder = Blank(inputs.TemplateFolder) is { } templates ? Path.GetFullPath(templates) : null,
            Search = new DesignSearch(Blank(inputs.ProjectFile) is { } project ? Path.GetFullPath(project) : root, searched),
            CacheFolder = Blank(inputs.CacheFolder) is { } cache ? Path.GetFullPath(cache) : null,
            Baseline = baseline,
            NewOnly = inputs.NewOnly,
            HeadStart = inputs.HeadStart,
        };
        return new RequestParse(request, []);
    }

    /// <summary>
    /// Reads the baseline report now, so that a missing, foreign or older-format file is an unusable option (exit 2, a plain
    /// error naming the option and the file), never a failure halfway through the run. The gate needs a baseline.
    /// </summary>
    private static Reports.Comparison.ReportSnapshot? ReadBaseline(List<RequestProblem> problems, (string Name, string? Path) baseline,
        (string Name, bool On) newOnly)
    {
        if (baseline.Path is null)
        {
            if (newOnly.On)
            {
                problems.Add(new RequestProblem(newOnly.Name,
                    $"the new-only gate needs a baseline report to tell new findings from old ones; name one with {baseline.Name} (a JSON report of the base branch)"));
            }

            return null;
        }

        var read = Reports.Comparison.ReportSnapshot.Read(Path.GetFullPath(baseline.Path));
        if (read.Problem is not null)
        {
            problems.Add(new RequestProblem(baseline.Name, read.Problem));
        }

        return read.Snapshot;
    }

    private static string DateProblem => $"write the date as {RepositoryConventions.DateFormat}, e.g. {RepositoryConventions.DateExample}";

    private static string? Blank(string? text) => string.IsNullOrWhiteSpace(text) ? null : text;

    private static string? Output(string? path) => path is null ? null : path == StandardOutput ? StandardOutput : Path.GetFullPath(path);

    private static void AddOutputProblems(List<RequestProblem> problems, (string Option, string? Path) sarif, (string Option, string? Path) json,
        (string Option, string? Path) pages)
    {
        foreach (var (option, path) in new[] { sarif, json })
        {
            if (path is not null && path != StandardOutput && OutputPaths.FileProblem(option, path) is { } problem)
            {
                problems.Add(new RequestProblem(null, problem));
            }
        }

        if (pages.Path is not null && OutputPaths.FolderProblem(pages.Option, pages.Path) is { } folderProblem)
        {
            problems.Add(new RequestProblem(null, folderProblem));
        }
    }
}

/// <summary>A request, or the problems that keep the options or properties from making one.</summary>
/// <param name="Request">The request; null when there are problems.</param>
/// <param name="Problems">Each unusable option, property or path, in a plain sentence.</param>
public sealed record RequestParse(RunRequest? Request, IReadOnlyList<RequestProblem> Problems);

/// <summary>An unusable option, property or path: what it is (null when the message names it) and what is wrong.</summary>
/// <param name="Subject">The option, property or path, or null.</param>
/// <param name="Message">What is wrong and what to write instead.</param>
public sealed record RequestProblem(string? Subject, string Message)
{
    /// <summary>The problem as one line: <c>subject: error: message</c> (the command line's form).</summary>
    public override string ToString() => Subject is null ? $"error: {Message}" : $"{Subject}: error: {Message}";

    /// <summary>The problem as a build error's text: <c>subject: message</c>.</summary>
    public string ForBuild => Subject is null ? Message : $"{Subject}: {Message}";
}

/// <summary>The command line's options of <c>check</c>, as given (null when not given).</summary>
/// <param name="Paths">Files or folders given (none: the current folder).</param>
public sealed record CommandLineInputs(IReadOnlyList<string> Paths)
{
    /// <summary><c>--sarif</c>.</summary>
    public string? Sarif { get; init; }

    /// <summary><c>--json</c>.</summary>
    public string? Json { get; init; }

    /// <summary><c>--pages</c>.</summary>
    public string? Pages { get; init; }

    /// <summary><c>--templates</c>.</summary>
    public string? Templates { get; init; }

    /// <summary><c>--rule-set</c>.</summary>
    public string? RuleSet { get; init; }

    /// <summary><c>--root</c>.</summary>
    public string? Root { get; init; }

    /// <summary><c>--help-uri-base</c>.</summary>
    public string? HelpUriBase { get; init; }

    /// <summary><c>--levels</c>.</summary>
    public string? Levels { get; init; }

    /// <summary><c>--today</c>.</summary>
    public string? Today { get; init; }

    /// <summary><c>--warnings-as-errors</c>.</summary>
    public bool WarningsAsErrors { get; init; }

    /// <summary><c>--cache</c>: the results cache folder (opt-in on the command line).</summary>
    public string? Cache { get; init; }

    /// <summary><c>--baseline</c>: the JSON report of an earlier run to compare with.</summary>
    public string? Baseline { get; init; }

    /// <summary><c>--new-only</c>: fail only on findings new against the baseline.</summary>
    public bool NewOnly { get; init; }
}

/// <summary>The MSBuild task's properties, as MSBuild passes them (empty strings for unset ones).</summary>
/// <param name="Files">Design and parts files (full paths).</param>
public sealed record BuildInputs(IReadOnlyList<string> Files)
{
    /// <summary><c>DesignRulesRoot</c>.</summary>
    public string? RepositoryRoot { get; init; }

    /// <summary><c>DesignRulesRuleSet</c>.</summary>
    public string? RuleSetFile { get; init; }

    /// <summary><c>DesignRulesSarifFile</c>.</summary>
    public string? SarifFile { get; init; }

    /// <summary><c>DesignRulesJsonFile</c>.</summary>
    public string? JsonFile { get; init; }

    /// <summary><c>DesignRulesPagesFolder</c> when pages are on.</summary>
    public string? PagesFolder { get; init; }

    /// <summary><c>DesignRulesTemplateFolder</c>.</summary>
    public string? TemplateFolder { get; init; }

    /// <summary><c>DesignRulesHelpUriBase</c>.</summary>
    public string? HelpUriBase { get; init; }

    /// <summary>The folders and patterns searched, in words.</summary>
    public string? Searched { get; init; }

    /// <summary>The project file (where DR940 points).</summary>
    public string? ProjectFile { get; init; }

    /// <summary><c>DesignRulesToday</c>.</summary>
    public string? Today { get; init; }

    /// <summary><c>DesignRulesLevels</c>.</summary>
    public string? Levels { get; init; }

    /// <summary><c>DesignRulesReportRoot</c>.</summary>
    public string? ReportRoot { get; init; }

    /// <summary>How the build treats warnings (<c>TreatWarningsAsErrors</c>, <c>WarningsAsErrors</c>, <c>NoWarn</c>, <c>-warnaserror</c>).</summary>
    public WarningLevels Warnings { get; init; } = WarningLevels.None;

    /// <summary>The results cache folder below <c>obj/</c>.</summary>
    public string? CacheFolder { get; init; }

    /// <summary><c>DesignRulesBaseline</c>: the JSON report of an earlier run to compare with.</summary>
    public string? BaselineFile { get; init; }

    /// <summary><c>DesignRulesNewOnly</c>: fail only on findings new against the baseline.</summary>
    public bool NewOnly { get; init; }

    /// <summary>The task's head start: only the results cache is filled.</summary>
    public bool HeadStart { get; init; }
}
