using System.CommandLine;
using DesignRules.Cli;

// The command line is a thin shell over the library: parse, call DesignCheck.Run, print and write reports.
var root = new RootCommand("DesignRules: design-rule checks for op-amp signal chains kept as YAML.")
{
    CheckCommand.Create(), CompareCommand.Create(), RuleCommand.Create(), SchemaCommand.Create(), PartsCommand.Create(), RuleCommand.CreateRenamedExplain(),
};

// No arguments at all: say what the tool does and how to call it, rather than fail on a missing command.
if (args.Length == 0)
{
    return root.Parse(["--help"]).Invoke();
}

var parsed = root.Parse(args);
if (parsed.Errors.Count > 0)
{
    foreach (var error in parsed.Errors)
    {
        Console.Error.WriteLine($"error: {error.Message}");
    }

    Console.Error.WriteLine("Run 'designrules --help' for the commands and options.");
    return ExitCodes.Unusable;
}

try
{
    return parsed.Invoke(new InvocationConfiguration { EnableDefaultExceptionHandler = false });
}
catch (Exception ex) when (ex is not OutOfMemoryException)
{
    Console.Error.WriteLine($"error {DesignRules.Run.RunText.FaultId}: {DesignRules.Run.RunText.Fault(ex)}");
    return ExitCodes.Unusable;
}
