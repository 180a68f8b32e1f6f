using System.CommandLine;
using System.Globalization;
using System.Reflection;
using DesignRules.Loading;
using DesignRules.Pages;
using DesignRules.Reports;
using DesignRules.Rules;

namespace DesignRules.Cli;

/// <summary><c>designrules check [paths] [--sarif FILE] [--json FILE] [--rules FILE] …</c>: the main job.</summary>
internal static class CheckCommand
{
    private static readonly Argument<string[]> Paths = new("paths")
    {
        Description = "Design or parts files, or folders holding designs/ and parts/ (default: the current folder).",
        Arity = ArgumentArity.ZeroOrMore,
    };

    private static readonly Option<string?> Sarif = new("--sarif") { Description = "Also write the findings as SARIF 2.1.0 to FILE.", HelpName = "FILE" };

    private static readonly Option<string?> Json = new("--json") { Description = "Also write the findings with their figures as JSON to FILE.", HelpName = "FILE" };

    private static readonly Option<string?> RuleSet = new("--rules")
    {
        Description = $"The rule-set file (default: {RuleSetLoader.DefaultFileName} in the repository root, if present).",
        HelpName = "FILE",
    };

    private static readonly Option<string?> Root = new("--root")
    {
        Description = "The repository root that report paths are relative to (default: the one folder given, else the current folder).",
        HelpName = "DIR",
    };

    private static readonly Option<string?> HelpBase = new("--help-uri-base")
    {
        Description = "The address rule help links start with; DRnnn.md is appended (default: the pages shipped with the tool).",
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
            Paths, Sarif, Json, PagesFolder, Templates, RuleSet, Root, HelpBase, Levels, Today,
        };
        command.SetAction(Run);
        return command;
    }

    private static int Run(ParseResult result)
    {
        var given = result.GetValue(Paths) is { Length: > 0 } paths ? paths : ["."];
        var files = RepositoryFiles.Find(given, out var missing);
        foreach (var path in missing)
        {
            Console.Error.WriteLine($"{path}: error: no such file or folder");
        }

        var root = result.GetValue(Root) ?? (given.Length == 1 && Directory.Exists(given[0]) ? given[0] : ".");
        var ruleSet = result.GetValue(RuleSet);
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

        Terminal.Status(string.Create(CultureInfo.InvariantCulture, $"Checking {files.Count} file(s)…"));
        var report = levels.Apply(DesignCheck.Run(files, new CheckOptions(ruleSet, today)));
        Terminal.ClearStatus();
        var helpBase = result.GetValue(HelpBase) ?? HelpLinks.FolderUri(Path.Combine(AppContext.BaseDirectory, "rules"));
        var settings = new ReportSettings(root, helpBase, ToolVersion);
        try
        {
            if (result.GetValue(Sarif) is { } sarif)
            {
                SarifReport.WriteFile(report, settings, sarif);
            }

            if (result.GetValue(Json) is { } json)
            {
                JsonReport.WriteFile(report, settings, json);
            }
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
        {
            Console.Error.WriteLine($"error: a report file cannot be written ({DesignRules.Diagnostics.DiagnosticText.Escape(ex.Message.TrimEnd('.'))}).");
            return ExitCodes.Unusable;
        }

        HumanReport.Write(report, Terminal.ForStandardOutput());
        var templateErrors = 0;
        if (result.GetValue(PagesFolder) is { } pagesFolder)
        {
            var templates = result.GetValue(Templates);
            if (templates is not null && !Directory.Exists(templates))
            {
                Console.Error.WriteLine($"{templates}: error: no such template folder");
                return ExitCodes.Unusable;
            }

            var pages = DatasheetPages.Write(report, new PageOptions(pagesFolder, templates, root));
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

            Console.Out.WriteLine(string.Create(CultureInfo.InvariantCulture,
                $"{pages.Written.Count} page and plot file(s) written to {pagesFolder}, {pages.Removed.Count} stale file(s) removed."));
        }

        return report.ErrorCount > 0 || templateErrors > 0 ? ExitCodes.Errors : ExitCodes.Clean;
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
