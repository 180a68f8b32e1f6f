using System.CommandLine;
using System.Text.RegularExpressions;

namespace DesignRules.Cli;

/// <summary>
/// <c>designrules rule DRnnn</c>: prints the rule's help page shipped with the tool. The earlier name of the command,
/// <c>explain</c>, still works for one release and says that it has been renamed.
/// </summary>
internal static partial class RuleCommand
{
    /// <summary>The note printed when the old command name is used.</summary>
    public const string RenamedNote = "note: 'designrules explain' is renamed 'designrules rule'; 'explain' will be removed in the next release.";

    public static Command Create() => Build("rule", "Print a rule's help page: why it exists, how it is found, how to fix it.", renamed: false);

    /// <summary>The old name of <c>rule</c>, kept for one release.</summary>
    public static Command CreateRenamedExplain() => Build("explain", "Renamed 'rule'; this name is kept for one release.", renamed: true);

    /// <summary>The folder of help pages beside the tool.</summary>
    public static string PagesFolder => Path.Combine(AppContext.BaseDirectory, "rules");

    private static Command Build(string name, string description, bool renamed)
    {
        var ruleId = new Argument<string>("rule") { Description = "A rule id, DR and three digits (e.g. DR906)." };
        var command = new Command(name, description) { ruleId };
        command.SetAction(result =>
        {
            if (renamed)
            {
                Console.Error.WriteLine(RenamedNote);
            }

            return Run(name, result.GetValue(ruleId)!);
        });
        return command;
    }

    private static int Run(string name, string given)
    {
        var id = given.Trim().ToUpperInvariant();
        if (!IdForm().IsMatch(id))
        {
            Console.Error.WriteLine($"{name}: error: '{given}' is not a rule id; write DR and three digits, e.g. DR906");
            return ExitCodes.Unusable;
        }

        var page = Path.Combine(PagesFolder, id + ".md");
        if (!File.Exists(page))
        {
            IEnumerable<string?> known = Directory.Exists(PagesFolder)
                ? Directory.EnumerateFiles(PagesFolder, "DR*.md").Select(Path.GetFileNameWithoutExtension).Order(StringComparer.Ordinal)
                : [];
            Console.Error.WriteLine($"{name}: error: no rule {id}. Known rules: {string.Join(", ", known)}");
            return ExitCodes.Unusable;
        }

        Console.Out.Write(File.ReadAllText(page));
        return ExitCodes.Clean;
    }

    [GeneratedRegex("^DR[0-9]{3}$", RegexOptions.CultureInvariant)]
    private static partial Regex IdForm();
}
