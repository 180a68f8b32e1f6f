using System.CommandLine;
using DesignRules.Loading;
using DesignRules.Model;

namespace DesignRules.Cli;

/// <summary>
/// <c>designrules parts [paths…]</c>: lists the built-in parts and the parts files of a repository with their key
/// figures, so that part ids can be found without the source.
/// </summary>
internal static class PartsCommand
{
    private static readonly Argument<string[]> Paths = new("paths")
    {
        Description = "Parts or design files, or folders holding parts/ (default: the current folder). Only the built-in library when none has parts.",
        Arity = ArgumentArity.ZeroOrMore,
    };

    public static Command Create()
    {
        var command = new Command("parts", "List the built-in parts and the repository's parts files with their key figures.") { Paths };
        PathArgument.RefuseUnknownOptions(Paths, "parts");
        command.SetAction(Run);
        return command;
    }

    private static int Run(ParseResult result)
    {
        var files = PathArgument.Find(result, Paths, out var given, out var missing);

        if (missing.Count > 0)
        {
            return ExitCodes.Unusable;
        }

        var loaded = DesignLoader.LoadFiles(files);
        foreach (var problem in loaded.Diagnostics.Where(d => d.Span.File != DesignLoader.BuiltinLibraryFile && loaded.Libraries.Any(l => l.File == d.Span.File)))
        {
            Console.Error.WriteLine(problem.ToString());
        }

        var output = Console.Out;
        foreach (var library in loaded.Libraries.OrderBy(l => l.File == DesignLoader.BuiltinLibraryFile ? 0 : 1).ThenBy(l => l.File, StringComparer.Ordinal))
        {
            var where = library.File == DesignLoader.BuiltinLibraryFile ? "built in" : library.File.Replace('\\', '/');
            output.WriteLine($"{library.Id.Value} ({where}){(library.Title.Length > 0 ? ": " + library.Title : string.Empty)}");
            Section(output, "amplifiers", library.Amplifiers.Select(a => (a.Id.Value,
                $"GBW {a.GainBandwidth.Value}, slew {a.SlewRising.Value}{(a.SlewFalling.Value.Value != a.SlewRising.Value.Value ? " / " + a.SlewFalling.Value : string.Empty)}, " +
                $"supply span {a.SupplySpanMinimum.Value} to {a.SupplySpanMaximum.Value}, output {a.OutputCurrent.Value}, offset ≤ {a.OffsetVoltage.Maximum.Value}{Typical(a.Typical)}", a.Description)));
            Section(output, "diodes", library.Diodes.Select(d => (d.Id.Value,
                $"reverse {d.ReverseVoltageRating.Value}, forward {d.ForwardCurrentRating.Value}" +
                (d.ForwardVoltage is { } vf ? $", Vf {vf.Value}" + (d.ForwardVoltageCurrent is { } at ? $" at {at.Value}" : string.Empty) : string.Empty) + Typical(d.Typical), d.Description)));
            Section(output, "resistor families", library.Resistors.Select(r => (r.Id.Value,
                $"±{r.Tolerance.Value.FormatPercent()}, {r.Tempco.Value}, {r.PowerRating.Value}", r.Description)));
            Section(output, "capacitor families", library.Capacitors.Select(c => (c.Id.Value,
                $"±{c.Tolerance.Value.FormatPercent()}" + (c.VoltageRating is { } v ? $", {v.Value}" : string.Empty), c.Description)));
            output.WriteLine();
        }

        return loaded.Diagnostics.Any(d => d.Severity == Diagnostics.Severity.Error && loaded.Libraries.Any(l => l.File == d.Span.File))
            ? ExitCodes.Errors : ExitCodes.Clean;
    }

    private static string Typical(bool typical) => typical ? " (typical)" : string.Empty;

    private static void Section(TextWriter output, string title, IEnumerable<(string Id, string Figures, string Description)> parts)
    {
        var list = parts.ToList();
        if (list.Count == 0)
        {
            return;
        }

        output.WriteLine($"  {title}:");
        var width = list.Max(p => p.Id.Length);
        foreach (var (id, figures, description) in list)
        {
            output.WriteLine($"    {id.PadRight(width)}  {figures}");
            if (description.Length > 0)
            {
                output.WriteLine($"    {new string(' ', width)}  {description}");
            }
        }
    }
}
