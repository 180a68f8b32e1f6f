using System.CommandLine;
using DesignRules.Loading;

namespace DesignRules.Cli;

/// <summary><c>designrules schema design|parts|rule-set</c>: prints the JSON Schema of a file format, for editors.</summary>
internal static class SchemaCommand
{
    private static readonly Argument<string> Kind = new("kind") { Description = "design, parts or rule-set." };

    static SchemaCommand() => Kind.AcceptOnlyFromAmong("design", "parts", "rule-set");

    public static Command Create()
    {
        var command = new Command("schema", "Print the JSON Schema (draft 2020-12) of design files, parts files or the rule-set file.") { Kind };
        command.SetAction(Run);
        return command;
    }

    private static int Run(ParseResult result)
    {
        var name = $"DesignRules.Schemas.{result.GetValue(Kind)}.schema.json";
        using var stream = typeof(DesignLoader).Assembly.GetManifestResourceStream(name);
        if (stream is null)
        {
            Console.Error.WriteLine($"schema: error: the tool lacks its resource {name}");
            return ExitCodes.Unusable;
        }

        using var reader = new StreamReader(stream);
        Console.Out.Write(reader.ReadToEnd());
        return ExitCodes.Clean;
    }
}
