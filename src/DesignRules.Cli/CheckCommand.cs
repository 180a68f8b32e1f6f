using System.CommandLine;
using DesignRules.Rules;
using DesignRules.Run;

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
        Description = $"The rule-set file (default: {RepositoryConventions.RuleSetFileName} in the repository root, if present); '--rules' is its earlier name, kept for one release.",
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

    private static readonly Option<string?> Cache = new("--cache")
    {
        Description = "Keep each design's result in DIR and re-evaluate only designs whose files, parts, rule-set sections or tool changed (opt-in).",
        HelpName = "DIR",
    };

    private static readonly Option<string?> Baseline = new("--baseline")
    {
        Description = "A JSON report of an earlier run (the base branch's --json): every SARIF result then says whether it is new, unchanged or updated against it.",
        HelpName = "FILE",
    };

    private static readonly Option<bool> NewOnly = new("--new-only")
    {
        Description = "Fail only on findings new against --baseline; findings the baseline already has are shown as notes (waivers still apply).",
    };

    public static Command Create()
    {
        var command = new Command("check", "Check every design and report problems as file(line,col): severity DRnnn: message.")
        {
            Paths, Sarif, Json, PagesFolder, Templates, RuleSet, Root, HelpBase, Levels, Today, WarningsAsErrors, Cache, Baseline, NewOnly,
        };
        PathArgument.RefuseUnknownOptions(Paths, "check");
        command.SetAction(Run);
        return command;
    }

    private static int Run(ParseResult result)
    {
        if (result.GetResult(RuleSet)?.IdentifierToken?.Value == "--rules")
        {
            Console.Error.WriteLine(RenamedRulesNote);
        }

        var parse = RunRequest.FromCommandLine(new CommandLineInputs(result.GetValue(Paths) ?? [])
        {
            Sarif = result.GetValue(Sarif),
            Json = result.GetValue(Json),
            Pages = result.GetValue(PagesFolder),
            Templates = result.GetValue(Templates),
            RuleSet = result.GetValue(RuleSet),
            Root = result.GetValue(Root),
            HelpUriBase = result.GetValue(HelpBase),
            Levels = result.GetValue(Levels),
            Today = result.GetValue(Today),
            WarningsAsErrors = result.GetValue(WarningsAsErrors),
            Cache = result.GetValue(Cache),
            Baseline = result.GetValue(Baseline),
            NewOnly = result.GetValue(NewOnly),
        });
        foreach (var problem in parse.Problems)
        {
            Console.Error.WriteLine(problem.ToString());
        }

        if (parse.Request is not { } request)
        {
            return ExitCodes.Unusable;
        }

        // Progress on standard error, one line per design as it finishes (and a line now and then while a long run goes
        // on), so a long check is never silent and standard output stays the findings (or the report '-' sends there).
        var outcome = DesignRun.Execute(request, new ConsoleProgress(request.Root));
        if (outcome.Fault is not null)
        {
            Console.Error.WriteLine($"error {RunText.FaultId}: {outcome.Fault}");
            return ExitCodes.Unusable;
        }

        foreach (var problem in outcome.Problems)
        {
            Console.Error.WriteLine(problem.ToString());
        }

        if (outcome.Problems.Count > 0)
        {
            return ExitCodes.Unusable;
        }

        if (outcome.StandardOutput is { } bytes)
        {
            WriteToStandardOutput(bytes);
        }

        var toStandardOutput = outcome.StandardOutput is not null;
        HumanReport.Write(outcome.Shown, outcome.Summary, toStandardOutput ? new Terminal(Console.Error, colour: false) : Terminal.ForStandardOutput());
        if (outcome.BaselineLine is { } baselineLine)
        {
            (toStandardOutput ? Console.Error : Console.Out).WriteLine(baselineLine);
        }

        var templateErrors = 0;
        if (outcome.Pages is { } pages)
        {
            foreach (var diagnostic in pages.Diagnostics)
            {
                Console.Error.WriteLine(diagnostic.ToString());
            }

            templateErrors = pages.Diagnostics.Count;
            if (outcome.PagesRefused)
            {
                // A pages folder the tool will not write into is an unusable option, like a missing path.
                return ExitCodes.Unusable;
            }

            if (outcome.PagesLine is { } line)
            {
                (toStandardOutput ? Console.Error : Console.Out).WriteLine(line);
            }
        }

        return outcome.ErrorCount > 0 || templateErrors > 0 ? ExitCodes.Errors : ExitCodes.Clean;
    }

    /// <summary>Progress lines on standard error.</summary>
    private sealed class ConsoleProgress(string root) : IRunProgress
    {
        public void DesignChecked(DesignProgress progress) => Console.Error.WriteLine(RunText.Progress(progress, root));

        public void StillRunning(int completed, int total, TimeSpan elapsed) => Console.Error.WriteLine(RunText.StillRunning(completed, total, elapsed));
    }

    private static void WriteToStandardOutput(byte[] bytes)
    {
        using var stdout = Console.OpenStandardOutput();
        stdout.Write(bytes);
        stdout.Flush();
    }
}
