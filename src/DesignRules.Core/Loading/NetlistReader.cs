using System.Globalization;
using System.Text.RegularExpressions;
using DesignRules.Diagnostics;
using DesignRules.Model;
using DesignRules.Quantities;
using DesignRules.Yaml;

namespace DesignRules.Loading;

/// <summary>Reads a stage given as an explicit netlist, and checks that every node it names is connected.</summary>
internal static partial class NetlistReader
{
    /// <summary>Nodes every netlist may use without defining them.</summary>
    public static readonly IReadOnlyList<string> GlobalNodes = [NetlistStage.Ground, NetlistStage.PositiveRail, NetlistStage.NegativeRail];

    /// <summary>The hint given for a node named <c>0</c>: the reference node has one name only.</summary>
    public const string ZeroNodeHint = "the reference node is `ground`";

    private static readonly Dictionary<string, ElementKind> Kinds = new(StringComparer.Ordinal)
    {
        ["resistor"] = ElementKind.Resistor, ["capacitor"] = ElementKind.Capacitor, ["inductor"] = ElementKind.Inductor,
        ["diode"] = ElementKind.Diode, ["amplifier"] = ElementKind.Amplifier,
    };

    private static readonly string[] AmplifierPins = ["plus", "minus", "output"];

    public static NetlistStage? Read(MappingReader stage, Located<string>? id, Requirements requirements, PartsCatalog catalog)
    {
        var d = stage.Diagnostics;
        var m = stage.Child("netlist", $"the netlist of {stage.What}", required: true, "input, output and elements");
        if (m is null)
        {
            return null;
        }

        var input = ReadNode(m, "input");
        var output = ReadNode(m, "output");
        var elements = new List<NetlistElement>();
        var ids = new Dictionary<string, SourceSpan>(StringComparer.Ordinal);
        var ok = true;
        var items = m.List("elements", required: true, "element entries with id, type, value or part, and nodes");
        if (items.Count > DesignLimits.MaxNetlistElements)
        {
            d.Add(DesignFileDiagnostics.SizeLimit.At(m.KeySpan("elements"),
                $"A netlist of {items.Count.ToString(CultureInfo.InvariantCulture)} elements",
                $"{DesignLimits.MaxNetlistElements.ToString(CultureInfo.InvariantCulture)} elements"));
            m.Know("input");
            m.Know("output");
            return null;
        }

        foreach (var item in items)
        {
            var e = MappingReader.Of(item, "an element", d);
            if (e is null)
            {
                ok = false;
                continue;
            }

            var element = ReadElement(e, catalog, ids);
            e.Finish();
            if (element is null)
            {
                ok = false;
            }
            else
            {
                elements.Add(element);
            }
        }

        m.Finish();
        if (items.Count == 0 && m.Has("elements"))
        {
            d.Add(DesignFileDiagnostics.MissingKey.At(m.KeySpan("elements"), m.What, "elements", "at least one element"));
            ok = false;
        }

        var nodeCount = elements.SelectMany(e => e.Nodes).Select(n => n.Value).Where(n => !GlobalNodes.Contains(n, StringComparer.Ordinal)).Distinct(StringComparer.Ordinal).Count();
        if (nodeCount > DesignLimits.MaxNetlistNodes)
        {
            d.Add(DesignFileDiagnostics.SizeLimit.At(m.KeySpan("elements"),
                $"A netlist of {nodeCount.ToString(CultureInfo.InvariantCulture)} nodes",
                $"{DesignLimits.MaxNetlistNodes.ToString(CultureInfo.InvariantCulture)} nodes"));
            return null;
        }

        if (ok && input is not null && output is not null && id is not null)
        {
            ok = CheckNodes(id.Value, input, output, elements, d);
        }

        return ok && input is not null && output is not null && id is not null
            ? new NetlistStage(id, input, output, elements, requirements, stage.Span)
            : null;
    }

    private static Located<string>? ReadNode(MappingReader m, string key)
    {
        var s = m.Text(key, required: true, "a node name such as in or out");
        if (s is not null && NodeProblem(s.Value, "a node name such as in, out or n1") is { } problem)
        {
            m.Diagnostics.Add(DesignFileDiagnostics.MalformedValue.At(s.Span, s.Value, key, problem));
            return null;
        }

        return s;
    }

    private static NetlistElement? ReadElement(MappingReader e, PartsCatalog catalog, Dictionary<string, SourceSpan> ids)
    {
        var d = e.Diagnostics;
        var id = e.Id("id", required: true);
        if (id is not null)
        {
            e.What = $"element '{id.Value}'";
            if (ids.TryGetValue(id.Value, out var first))
            {
                d.Add(DesignFileDiagnostics.DuplicateId.At(id.Span, "element", id.Value, MappingReader.Position(first)));
                id = null;
            }
            else
            {
                ids[id.Value] = id.Span;
            }
        }

        var kind = e.Choice("type", Kinds, required: true);
        if (kind is null)
        {
            foreach (var key in new[] { "value", "between", "pins", "part", "family" })
            {
                e.Know(key);
            }

            return null;
        }

        Located<Quantity>? value = null;
        AmplifierPart? amplifier = null;
        DiodePart? diode = null;
        ResistorFamily? resistors = null;
        CapacitorFamily? capacitors = null;
        var ok = true;
        List<Located<string>> nodes;
        switch (kind.Value)
        {
            case ElementKind.Resistor:
                value = e.Quantity("value", Dimension.Resistance, required: true, ValueChecks.PositiveWithin(1e-3, 1e12, "a resistance lies between 1 mΩ and 1 TΩ"));
                var rf = e.Text("family", required: false, "a resistor family id");
                resistors = rf is null ? null : catalog.Resistors(rf, d);
                ok &= value is not null && (rf is null || resistors is not null);
                nodes = ReadBetween(e, "two nodes, e.g. [in, out]");
                break;
            case ElementKind.Capacitor:
                value = e.Quantity("value", Dimension.Capacitance, required: true, ValueChecks.PositiveWithin(1e-15, 10, "a capacitance lies between 1 fF and 10 F"));
                var cf = e.Text("family", required: false, "a capacitor family id");
                capacitors = cf is null ? null : catalog.Capacitors(cf, d);
                ok &= value is not null && (cf is null || capacitors is not null);
                nodes = ReadBetween(e, "two nodes, e.g. [out, ground]");
                break;
            case ElementKind.Inductor:
                value = e.Quantity("value", Dimension.Inductance, required: true, ValueChecks.PositiveWithin(1e-12, 1e3, "an inductance lies between 1 pH and 1 kH"));
                ok &= value is not null;
                nodes = ReadBetween(e, "two nodes, e.g. [a, b]");
                break;
            case ElementKind.Diode:
                var dp = e.Text("part", required: true, "a diode part id");
                diode = dp is null ? null : catalog.Diode(dp, d);
                ok &= diode is not null;
                nodes = ReadBetween(e, "anode then cathode, e.g. [in, out]");
                break;
            default:
                var ap = e.Text("part", required: true, "an amplifier part id");
                amplifier = ap is null ? null : catalog.Amplifier(ap, d);
                ok &= amplifier is not null;
                nodes = ReadPins(e);
                break;
        }

        var expected = kind.Value == ElementKind.Amplifier ? 3 : 2;
        ok &= nodes.Count == expected;
        return ok && id is not null
            ? new NetlistElement(id, kind.Value, value, nodes, amplifier, diode, resistors, capacitors, e.Span)
            : null;
    }

    private static List<Located<string>> ReadBetween(MappingReader e, string hint)
    {
        var items = e.List("between", required: true, hint);
        var nodes = new List<Located<string>>();
        foreach (var item in items)
        {
            var problem = item is YamlScalar { IsNull: false } s ? NodeProblem(s.Value, hint) : NodeProblem(string.Empty, hint);
            if (problem is null)
            {
                var scalar = (YamlScalar)item;
                nodes.Add(new Located<string>(scalar.Value, scalar.Span));
            }
            else
            {
                e.Diagnostics.Add(DesignFileDiagnostics.MalformedValue.At(item.Span, (item as YamlScalar)?.Value ?? item.ShapeName, "between", problem));
            }
        }

        if (items.Count != 2 && e.Has("between"))
        {
            e.Diagnostics.Add(DesignFileDiagnostics.WrongShape.At(e.KeySpan("between"), "between", "a list of two nodes (" + hint + ")",
                $"a list of {items.Count}"));
        }

        return nodes;
    }

    private static List<Located<string>> ReadPins(MappingReader e)
    {
        var pins = e.Child("pins", $"the pins of {e.What}", required: true, "plus, minus and output nodes");
        var nodes = new List<Located<string>>();
        if (pins is null)
        {
            return nodes;
        }

        foreach (var pin in AmplifierPins)
        {
            var s = pins.Text(pin, required: true, "a node name");
            if (s is not null && NodeProblem(s.Value, "a node name such as n1") is { } problem)
            {
                e.Diagnostics.Add(DesignFileDiagnostics.MalformedValue.At(s.Span, s.Value, pin, problem));
            }
            else if (s is not null)
            {
                nodes.Add(s);
            }
        }

        pins.Finish();
        return nodes;
    }

    /// <summary>
    /// A node touched by a single terminal goes nowhere: usually a misspelling of another node. The stage's input and
    /// output must be touched by some element.
    /// </summary>
    private static bool CheckNodes(string stage, Located<string> input, Located<string> output, List<NetlistElement> elements, List<Diagnostic> d)
    {
        var uses = new Dictionary<string, List<Located<string>>>(StringComparer.Ordinal);
        foreach (var node in elements.SelectMany(e => e.Nodes))
        {
            if (!uses.TryGetValue(node.Value, out var list))
            {
                uses[node.Value] = list = [];
            }

            list.Add(node);
        }

        var names = uses.Keys.Order(StringComparer.Ordinal).ToList();
        var ok = true;
        foreach (var end in new[] { input, output })
        {
            if (!uses.ContainsKey(end.Value))
            {
                d.Add(DesignFileDiagnostics.UnknownNode.At(end.Span, end.Value, stage, "is used by no element", SpellingSuggestion.Hint(end.Value, names), string.Join(", ", names)));
                ok = false;
            }
        }

        foreach (var (name, list) in uses.OrderBy(u => u.Key, StringComparer.Ordinal))
        {
            if (list.Count == 1 && name != input.Value && name != output.Value && !GlobalNodes.Contains(name))
            {
                var others = names.Where(n => n != name).Concat(GlobalNodes);
                d.Add(DesignFileDiagnostics.UnknownNode.At(list[0].Span, name, stage, "connects to a single terminal, so it goes nowhere", SpellingSuggestion.Hint(name, others), string.Join(", ", names)));
                ok = false;
            }
        }

        return ok;
    }

    /// <summary>Why a text is not a usable node name, or null when it is one.</summary>
    private static string? NodeProblem(string name, string expected) =>
        name == "0" ? ZeroNodeHint
        : NodePattern().IsMatch(name) ? null
        : "a node name is letters, digits, '-' and '_'; expected " + expected;

    [GeneratedRegex("^[A-Za-z0-9_-]{1,64}$", RegexOptions.CultureInvariant)]
    private static partial Regex NodePattern();
}
