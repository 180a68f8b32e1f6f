using System.CommandLine;
using System.Text.RegularExpressions;

namespace DesignRules.Cli;

/// <summary><c>designrules explain DRnnn</c>: prints the rule's help page shipped with the tool.</summary>
internal static partial class ExplainCommand
{
    private static readonly Argument<string> RuleId = new("rule") { Description = "A rule id, DR and three digits (e.g. DR906)." };

    public static Command Create()
    {
        var command = new Command("explain", "Print a rule's help page: why it exists, how it is found, how to fix it.") { RuleId };
        command.SetAction(Run);
        return command;
    }

    /// <summary>The folder of help pages beside the tool.</summary>
    public static string PagesFolder => Path.Combine(AppContext.BaseDirectory, "rules");

    private static int Run(ParseResult result)
    {
        var id = result.GetValue(RuleId)!.Trim().ToUpperInvariant();
        if (!IdForm().IsMatch(id))
        {
            Console.Error.WriteLine($"explain: error: '{result.GetValue(RuleId)}' is not a rule id; write DR and three digits, e.g. DR906");
            return ExitCodes.Unusable;
        }

        var page = Path.Combine(PagesFolder, id + ".md");
        if (!File.Exists(page))
        {
            IEnumerable<string?> known = Directory.Exists(PagesFolder)
                ? Directory.EnumerateFiles(PagesFolder, "DR*.md").Select(Path.GetFileNameWithoutExtension).Order(StringComparer.Ordinal)
                : [];
            Console.Error.WriteLine($"explain: error: no rule {id}. Known rules: {string.Join(", ", known)}");
            return ExitCodes.Unusable;
        }

        Console.Out.Write(File.ReadAllText(page));
        return ExitCodes.Clean;
    }

    [GeneratedRegex("^DR[0-9]{3}$", RegexOptions.CultureInvariant)]
    private static partial Regex IdForm();
}
