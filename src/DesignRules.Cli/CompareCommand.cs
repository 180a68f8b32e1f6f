using System.CommandLine;
using System.Text;
using DesignRules.Reports.Comparison;

namespace DesignRules.Cli;

/// <summary>
/// <c>designrules compare BASE.json HEAD.json [--out FILE] [--max-rows N]</c>: the Markdown review summary of what a change
/// did (new and resolved findings, changed ones, the margins that shrank most), for a pull-request comment.
/// </summary>
internal static class CompareCommand
{
    private static readonly Argument<string> Base = new("base") { Description = "The JSON report of the base run (check --json)." };

    private static readonly Argument<string> Head = new("head") { Description = "The JSON report of the head run (check --json)." };

    private static readonly Option<string?> Out = new("--out")
    {
        Description = "Write the summary to FILE instead of standard output.",
        HelpName = "FILE",
    };

    private static readonly Option<int> MaxRows = new("--max-rows")
    {
        Description = $"At most N rows per table, then 'and N more' (default {ReviewSummary.DefaultMaxRows}).",
        HelpName = "N",
        DefaultValueFactory = _ => ReviewSummary.DefaultMaxRows,
    };

    public static Command Create()
    {
        var command = new Command("compare", "Compare two JSON reports and write the Markdown review summary: findings new and resolved, margins that shrank.")
        {
            Base, Head, Out, MaxRows,
        };
        command.SetAction(Run);
        return command;
    }

    private static int Run(ParseResult result)
    {
        var maxRows = result.GetValue(MaxRows);
        if (maxRows < 1)
        {
            Console.Error.WriteLine("--max-rows: error: give a whole number of rows, 1 or more");
            return ExitCodes.Unusable;
        }

        var before = ReportSnapshot.Read(result.GetValue(Base)!);
        var after = ReportSnapshot.Read(result.GetValue(Head)!);
        foreach (var problem in new[] { before.Problem, after.Problem }.OfType<string>())
        {
            Console.Error.WriteLine($"error: {problem}");
        }

        if (before.Snapshot is not { } b || after.Snapshot is not { } h)
        {
            return ExitCodes.Unusable;
        }

        var text = ReviewSummary.Write(RunComparison.Compare(b, h), maxRows);
        var bytes = new UTF8Encoding(encoderShouldEmitUTF8Identifier: false).GetBytes(text);
        if (result.GetValue(Out) is { } file)
        {
            try
            {
                var full = Path.GetFullPath(file);
                Directory.CreateDirectory(Path.GetDirectoryName(full)!);
                File.WriteAllBytes(full, bytes);
            }
            catch (Exception ex) when (ex is IOException or UnauthorizedAccessException or ArgumentException or NotSupportedException)
            {
                Console.Error.WriteLine($"{file}: error: the summary cannot be written ({DesignRules.Diagnostics.DiagnosticText.Escape(ex.Message.TrimEnd('.'))})");
                return ExitCodes.Unusable;
            }
        }
        else
        {
            using var stdout = Console.OpenStandardOutput();
            stdout.Write(bytes);
        }

        return ExitCodes.Clean;
    }
}
