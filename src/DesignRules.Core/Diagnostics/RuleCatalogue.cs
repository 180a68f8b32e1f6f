using DesignRules.Loading;
using DesignRules.Quantities;
using DesignRules.Yaml;

namespace DesignRules.Diagnostics;

/// <summary>
/// The rule catalogue, read from <c>rules/catalogue.yaml</c> (embedded in this assembly): every rule id with its
/// title, category, default severity, message format, thresholds and help page.
/// </summary>
public sealed class RuleCatalogue
{
    private static readonly Lazy<RuleCatalogue> Shipped = new(LoadShipped);
    private readonly Dictionary<string, DiagnosticDescriptor> byId;

    private RuleCatalogue(IReadOnlyList<DiagnosticDescriptor> rules)
    {
        Rules = rules;
        byId = rules.ToDictionary(r => r.Id, StringComparer.Ordinal);
    }

    /// <summary>The catalogue shipped with the tool.</summary>
    public static RuleCatalogue Default => Shipped.Value;

    /// <summary>Every rule, in id order.</summary>
    public IReadOnlyList<DiagnosticDescriptor> Rules { get; }

    /// <summary>The rule with this id; throws for an id the catalogue lacks (a programming error).</summary>
    public DiagnosticDescriptor this[string id] =>
        byId.TryGetValue(id, out var rule) ? rule : throw new KeyNotFoundException($"The rule catalogue has no {id}.");

    /// <summary>The rule with this id; throws for an id the catalogue lacks (a programming error).</summary>
    public DiagnosticDescriptor this[RuleId id] => this[id.Value];

    /// <summary>Looks a rule up by id.</summary>
    public bool TryGet(string id, out DiagnosticDescriptor? rule) => byId.TryGetValue(id, out rule);

    private static RuleCatalogue LoadShipped()
    {
        using var stream = typeof(RuleCatalogue).Assembly.GetManifestResourceStream("DesignRules.Rules.catalogue.yaml")
            ?? throw new InvalidOperationException("The rule catalogue is missing from the assembly.");
        using var reader = new StreamReader(stream);
        var diagnostics = new List<Diagnostic>();
        var tree = YamlTreeReader.Read("rules/catalogue.yaml", reader.ReadToEnd(), LoaderLimits.Default, diagnostics);
        var rules = new List<DiagnosticDescriptor>();
        var root = tree as YamlMapping ?? throw Broken("no top-level mapping", diagnostics);
        var list = root.Entries.Single(e => e.Key.Value == "rules").Value as YamlSequence ?? throw Broken("no rules list", diagnostics);
        foreach (var item in list.Items.OfType<YamlMapping>())
        {
            string Text(string key) => (item.Entries.Single(e => e.Key.Value == key).Value as YamlScalar)?.Value
                ?? throw Broken($"rule entry without {key}", diagnostics);
            var id = Text("id");
            var severity = Text("severity") switch
            {
                "error" => Severity.Error,
                "warning" => Severity.Warning,
                "note" => Severity.Note,
                var other => throw Broken($"{id}: unknown severity {other}", diagnostics),
            };
            var thresholds = new List<ThresholdDefinition>();
            var thresholdList = item.Entries.FirstOrDefault(e => e.Key.Value == "thresholds").Value as YamlSequence;
            foreach (var t in thresholdList?.Items.OfType<YamlMapping>() ?? [])
            {
                string Field(string key) => ((YamlScalar)t.Entries.Single(e => e.Key.Value == key).Value).Value;
                var dimension = Enum.Parse<Dimension>(Field("dimension").Replace("-", string.Empty, StringComparison.Ordinal), ignoreCase: true);
                if (!Quantity.TryParse(Field("default"), dimension, out var value, out var error))
                {
                    throw Broken($"{id}: threshold {Field("name")}: {error.Message}", diagnostics);
                }

                thresholds.Add(new ThresholdDefinition(Field("name"), value, Field("description")));
            }

            rules.Add(new DiagnosticDescriptor(id, Text("title"), Text("category"), severity, Text("message"), $"rules/{id}.md")
            {
                Thresholds = thresholds,
            });
        }

        return new RuleCatalogue(rules.OrderBy(r => r.Id, StringComparer.Ordinal).ToList());
    }

    // The shipped catalogue is covered by tests; a broken one is a packaging fault, not a user error.
    private static InvalidOperationException Broken(string why, List<Diagnostic> diagnostics) =>
        new($"The rule catalogue is malformed: {why}. {string.Join("; ", diagnostics)}");
}
