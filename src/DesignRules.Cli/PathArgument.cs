using System.CommandLine;
using DesignRules.Loading;

namespace DesignRules.Cli;

/// <summary>The paths argument that <c>check</c> and <c>parts</c> share: how it refuses options and finds its files.</summary>
internal static class PathArgument
{
    /// <summary>
    /// An option the command does not know is an error, not a path: System.CommandLine gives every token that is not
    /// an option to the paths argument. A path that starts with '-' can be written ./-name.
    /// </summary>
    public static void RefuseUnknownOptions(Argument<string[]> paths, string command) =>
        paths.Validators.Add(result =>
        {
            foreach (var token in result.Tokens.Where(t => t.Value.Length > 1 && t.Value.StartsWith('-')))
            {
                result.AddError($"Unknown option '{token.Value}' for {command}. Run 'designrules {command} --help' for the options.");
            }
        });

    /// <summary>The paths given (the current folder when none), the files found under them, and each missing path reported on standard error.</summary>
    public static IReadOnlyList<string> Find(ParseResult result, Argument<string[]> paths, out string[] given, out IReadOnlyList<string> missing)
    {
        given = result.GetValue(paths) is { Length: > 0 } named ? named : ["."];
        var files = RepositoryFiles.Find(given, out missing);
        foreach (var path in missing)
        {
            Console.Error.WriteLine($"{path}: error: no such file or folder");
        }

        return files;
    }
}
