using System.CommandLine;
using System.Globalization;
using System.Reflection;
using DesignRules.Loading;
using DesignRules.Pages;
using DesignRules.Reports;
using DesignRules.Rules;

namespace DesignRules.Cli;

/// <summary><c>designrules check [paths] [--sarif FILE] [--json FILE] [--rule-set FILE] …</c>: the main job.</summary>
internal static class CheckCommand
{
    private static readonly Argument<string[]> Paths = new("paths")
    {
        Description = "Design or parts files, or folders holding designs/ and parts/ (default: the current folder).",
        Arity = ArgumentArity.ZeroOrMore,
    };

    private static readonly Option<string?> Sarif = new("--sarif") { Description = "Also write the findings as SARIF 2.1.0 to FILE ('-': standard output).", HelpName = "FILE" };

    private static readonly Option<string?> Json = new("--json") { Description = "Also write the findings with their figures as JSON to FILE ('-': standard output).", HelpName = "FILE" };

    private static readonly Option<bool> WarningsAsErrors = new("--warnings-as-errors")
    {
        Description = "Treat every warning as an error: it is printed and reported as an error and makes the exit code 1.",
    };

    /// <summary>The note printed when the rule-set file is given under the option's earlier name.</summary>
    public const string RenamedRulesNote = "note: '--rules' is renamed '--rule-set'; '--rules' will be removed in the next release.";

    // '--rules' is the option's earlier name, accepted for one release with a note.
    private static readonly Option<string?> RuleSet = new("--rule-set", "--rules")
    {
        Description = $"The rule-set file (default: {RuleSetLoader.DefaultFileName} in the repository root, if present); '--rules' is its earlier name, kept for one release.",
        HelpName = "FILE",
    };

    private static readonly Option<string?> Root = new("--root")
    {
        Description = "The repository root: the rule-set file is found there, and report paths are relative to it (default: the one folder given, else the current folder; report paths from the nearest folder above it with .git).",
        HelpName = "DIR",
    };

    private static readonly Option<string?> HelpBase = new("--help-uri-base")
    {
        Description = "The address rule help links start with; DRnnn.md is appended (default: SARIF embeds the help pages, and --pages copies them beside the pages).",
        HelpName = "URI",
    };

    private static readonly Option<string?> Levels = new("--levels")
    {
        Description = "Change finding levels after the rule set, e.g. 'DR906=warning;DR702=off' (for trials; the rule-set file is the lasting place).",
        HelpName = "LIST",
    };

    private static readonly Option<string?> PagesFolder = new("--pages")
    {
        Description = "Also write datasheet pages (Markdown and SVG plots) of every design into DIR.",
        HelpName = "DIR",
    };

    private static readonly Option<string?> Templates = new("--templates")
    {
        Description = "A folder of your own page templates; each replaces the built-in template of the same name.",
        HelpName = "DIR",
    };

    private static readonly Option<string?> Today = new("--today")
    {
        Description = "The date waiver expiry is judged against, yyyy-MM-dd (default: today), for reproducible runs.",
        HelpName = "DATE",
    };

    public static Command Create()
    {
        var command = new Command("check", "Check every design and report problems as file(line,col): severity DRnnn: message.")
        {
            Paths, Sarif, Json, PagesFolder, Templates, RuleSet, Root, HelpBase, Levels, Today, WarningsAsErrors,
        };
        PathArgument.RefuseUnknownOptions(Paths, "check");
        command.SetAction(Run);
        return command;
    }

    private static int Run(ParseResult result)
    {
        var files = PathArgument.Find(result, Paths, out var given, out var missing);

        var root = result.GetValue(Root) ?? (given.Length == 1 && Directory.Exists(given[0]) ? given[0] : ".");
        var ruleSet = result.GetValue(RuleSet);
        if (result.GetResult(RuleSet)?.IdentifierToken?.Value == "--rules")
        {
            Console.Error.WriteLine(RenamedRulesNote);
        }

        if (ruleSet is not null && !File.Exists(ruleSet))
        {
            Console.Error.WriteLine($"{ruleSet}: error: no such rule-set file");
            return ExitCodes.Unusable;
        }

        ruleSet ??= File.Exists(Path.Combine(root, RuleSetLoader.DefaultFileName)) ? Path.Combine(root, RuleSetLoader.DefaultFileName) : null;
        var levels = LevelOverrides.Parse(result.GetValue(Levels), out var problem);
        if (levels is null)
        {
            Console.Error.WriteLine($"--levels: error: {problem}");
            return ExitCodes.Unusable;
        }

        if (!TryToday(result.GetValue(Today), out var today))
        {
            Console.Error.WriteLine("--today: error: write the date as yyyy-MM-dd, e.g. 2027-06-30");
            return ExitCodes.Unusable;
        }

        if (missing.Count > 0 || !Directory.Exists(root))
        {
            if (!Directory.Exists(root))
            {
                Console.Error.WriteLine($"{root}: error: no such folder");
            }

            return ExitCodes.Unusable;
        }

        // Report and pages paths that cannot be written are the user's mistake: say so now, before the check runs.
        var outputProblems = new[]
        {
            result.GetValue(Sarif) is { } s && s != "-" ? OutputPaths.FileProblem("--sarif", s) : null,
            result.GetValue(Json) is { } j && j != "-" ? OutputPaths.FileProblem("--json", j) : null,
            result.GetValue(PagesFolder) is { } p ? OutputPaths.FolderProblem("--pages", p) : null,
        }.OfType<string>().ToList();
        foreach (var outputProblem in outputProblems)
        {
            Console.Error.WriteLine("error: " + outputProblem);
        }

        if (outputProblems.Count > 0)
        {
            return ExitCodes.Unusable;
        }

        var sarif = result.GetValue(Sarif);
        var json = result.GetValue(Json);
        if (sarif == StandardOutput && json == StandardOutput)
        {
            Console.Error.WriteLine("--sarif, --json: error: only one report can go to standard output ('-'); give the other a file name");
            return ExitCodes.Unusable;
        }

        // Progress on standard error, one line per design as it finishes, so a long check is never silent and standard
        // output stays the findings (or the report that '-' sends there).
        var displayRoot = Path.GetFullPath(root);
        var search = new DesignSearch(Path.GetFullPath(given[0]), string.Join("; ", given.Select(RepositoryFiles.Searched)));
        var check = DesignCheck.Run(files, new CheckOptions(ruleSet, today) { Search = search }, progress => Console.Error.WriteLine(string.Create(CultureInfo.InvariantCulture,
            $"checked {RepositoryPaths.Display(displayRoot, progress.File)} ({progress.DesignId}): {progress.Errors} error(s), {progress.Warnings} warning(s), {progress.Elapsed.TotalSeconds:0.00} s")));
        var warnings = result.GetValue(WarningsAsErrors) ? WarningLevels.None with { AllAsErrors = true } : WarningLevels.None;
        var report = warnings.Apply(levels.Apply(check));
        var helpBase = result.GetValue(HelpBase);
        var reportRoot = result.GetValue(Root) is { } explicitRoot ? Path.GetFullPath(explicitRoot) : RepositoryPaths.FindRepositoryRoot(root);
        var settings = new ReportSettings(reportRoot, helpBase, ToolVersion);
        try
        {
            if (sarif is not null)
            {
                if (sarif == StandardOutput)
                {
                    WriteToStandardOutput(SarifReport.ToBytes(report, settings));
                }
                else
                {
                    SarifReport.WriteFile(report, settings, sarif);
                }
            }

            if (json is not null)
            {
                if (json == StandardOutput)
                {
                    WriteToStandardOutput(JsonReport.ToBytes(report, settings));
                }
                else
                {
                    JsonReport.WriteFile(report, settings, json);
                }
            }
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
        {
            Console.Error.WriteLine($"error: a report file cannot be written ({DesignRules.Diagnostics.DiagnosticText.Escape(ex.Message.TrimEnd('.'))}).");
            return ExitCodes.Unusable;
        }

        var toStandardOutput = sarif == StandardOutput || json == StandardOutput;
        HumanReport.Write(report, toStandardOutput ? new Terminal(Console.Error, colour: false) : Terminal.ForStandardOutput());
        var templateErrors = 0;
        if (result.GetValue(PagesFolder) is { } pagesFolder)
        {
            var templates = result.GetValue(Templates);
            if (templates is not null && !Directory.Exists(templates))
            {
                Console.Error.WriteLine($"{templates}: error: no such template folder");
                return ExitCodes.Unusable;
            }

            var pages = DatasheetPages.Write(report, new PageOptions(pagesFolder, templates, root) { HelpUriBase = helpBase });
            foreach (var diagnostic in pages.Diagnostics)
            {
                Console.Error.WriteLine(diagnostic.ToString());
            }

            templateErrors = pages.Diagnostics.Count;
            if (pages.Diagnostics.Any(d => d.Id == DatasheetPages.FolderProblemId))
            {
                // A pages folder the tool will not write into is an unusable option, like a missing path.
                return ExitCodes.Unusable;
            }

            (toStandardOutput ? Console.Error : Console.Out).WriteLine(string.Create(CultureInfo.InvariantCulture,
                $"{pages.Written.Count} page and plot file(s) written to {pagesFolder}, {pages.Removed.Count} stale file(s) removed."));
        }

        return report.ErrorCount > 0 || templateErrors > 0 ? ExitCodes.Errors : ExitCodes.Clean;
    }

    /// <summary>The file name that means standard output.</summary>
    private const string StandardOutput = "-";

    private static void WriteToStandardOutput(byte[] bytes)
    {
        using var stdout = Console.OpenStandardOutput();
        stdout.Write(bytes);
        stdout.Flush();
    }

    private static bool TryToday(string? text, out DateOnly today)
    {
        if (text is null)
        {
            today = DateOnly.FromDateTime(DateTime.Today);
            return true;
        }

        return DateOnly.TryParseExact(text, "yyyy-MM-dd", CultureInfo.InvariantCulture, DateTimeStyles.None, out today);
    }

    private static string ToolVersion =>
        typeof(CheckCommand).Assembly.GetCustomAttribute<AssemblyInformationalVersionAttribute>()?.InformationalVersion ?? "0.0.0";
}
