using DesignRules.Diagnostics;
using DesignRules.Model;

namespace DesignRules.Loading;

/// <summary>The parts visible to one design: the built-in library and every library it uses, transitively.</summary>
internal sealed class PartsCatalog
{
    private readonly Dictionary<string, AmplifierPart> amplifiers = new(StringComparer.Ordinal);
    private readonly Dictionary<string, DiodePart> diodes = new(StringComparer.Ordinal);
    private readonly Dictionary<string, ResistorFamily> resistors = new(StringComparer.Ordinal);
    private readonly Dictionary<string, CapacitorFamily> capacitors = new(StringComparer.Ordinal);
    private readonly Dictionary<string, (string Kind, SourceSpan Span)> all = new(StringComparer.Ordinal);

    public PartsCatalog(IEnumerable<PartsLibrary> libraries, List<Diagnostic> diagnostics, string designFile)
    {
        foreach (var library in libraries)
        {
            foreach (var a in library.Amplifiers)
            {
                Add(amplifiers, a.Id, a, "amplifier", diagnostics, designFile);
            }

            foreach (var d in library.Diodes)
            {
                Add(diodes, d.Id, d, "diode", diagnostics, designFile);
            }

            foreach (var r in library.Resistors)
            {
                Add(resistors, r.Id, r, "resistor family", diagnostics, designFile);
            }

            foreach (var c in library.Capacitors)
            {
                Add(capacitors, c.Id, c, "capacitor family", diagnostics, designFile);
            }
        }
    }

    public AmplifierPart? Amplifier(Located<string> id, List<Diagnostic> diagnostics) => Find(amplifiers, id, "amplifier", diagnostics);

    public DiodePart? Diode(Located<string> id, List<Diagnostic> diagnostics) => Find(diodes, id, "diode", diagnostics);

    public ResistorFamily? Resistors(Located<string> id, List<Diagnostic> diagnostics) => Find(resistors, id, "resistor family", diagnostics);

    public CapacitorFamily? Capacitors(Located<string> id, List<Diagnostic> diagnostics) => Find(capacitors, id, "capacitor family", diagnostics);

    private void Add<T>(Dictionary<string, T> table, Located<string> id, T part, string kind, List<Diagnostic> diagnostics, string designFile)
    {
        if (all.TryGetValue(id.Value, out var first))
        {
            // Reported once, where the design file that sees both libraries can be told about it.
            if (first.Span != id.Span)
            {
                diagnostics.Add(DesignFileDiagnostics.DuplicateId.At(
                    id.Span, "part", id.Value, $"{first.Span.File} {MappingReader.Position(first.Span)} (both libraries are used by {designFile})"));
            }

            return;
        }

        all[id.Value] = (kind, id.Span);
        table[id.Value] = part;
    }

    private T? Find<T>(Dictionary<string, T> table, Located<string> id, string kind, List<Diagnostic> diagnostics)
        where T : class
    {
        if (table.TryGetValue(id.Value, out var part))
        {
            return part;
        }

        var hint = all.TryGetValue(id.Value, out var other)
            ? $" '{id.Value}' is a {other.Kind}, not a{(kind[0] is 'a' ? "n" : string.Empty)} {kind}."
            : SpellingSuggestion.Hint(id.Value, table.Keys);
        var known = table.Count == 0 ? "none" : string.Join(", ", table.Keys.Order(StringComparer.Ordinal));
        diagnostics.Add(DesignFileDiagnostics.UnknownPart.At(id.Span, kind, id.Value, hint, known));
        return null;
    }
}
