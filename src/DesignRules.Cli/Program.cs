using System.CommandLine;
using DesignRules.Diagnostics;
using DesignRules.Loading;

// The command line is a thin shell over the library: it finds the files, calls the loader and prints diagnostics.
var paths = new Argument<string[]>("paths")
{
    Description = "Design or parts files, or folders holding designs/ and parts/ (default: the current folder).",
    Arity = ArgumentArity.ZeroOrMore,
};
var check = new Command("check", "Load every design and report problems as file(line,col): severity DRnnn: message.") { paths };
check.SetAction(result =>
{
    var files = RepositoryFiles.Find(result.GetValue(paths) is { Length: > 0 } given ? given : ["."], out var missing);
    foreach (var path in missing)
    {
        Console.Error.WriteLine($"{path}: error: no such file or folder");
    }

    if (missing.Count > 0)
    {
        return 2;
    }

    var loaded = DesignLoader.LoadFiles(files);
    foreach (var diagnostic in loaded.Diagnostics)
    {
        (diagnostic.Severity == Severity.Error ? Console.Error : Console.Out).WriteLine(diagnostic.ToString());
    }

    var errors = loaded.Diagnostics.Count(d => d.Severity == Severity.Error);
    var warnings = loaded.Diagnostics.Count(d => d.Severity == Severity.Warning);
    Console.Out.WriteLine(FormattableString.Invariant(
        $"{loaded.Designs.Count} design(s) loaded from {files.Count} file(s): {errors} error(s), {warnings} warning(s)."));
    return errors > 0 ? 1 : 0;
});

var root = new RootCommand("DesignRules: design-rule checks for op-amp signal chains kept as YAML.") { check };
return root.Parse(args).Invoke();
