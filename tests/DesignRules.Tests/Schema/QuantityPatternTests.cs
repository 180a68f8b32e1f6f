using System.Text.Json.Nodes;
using System.Text.RegularExpressions;
using DesignRules.Quantities;
using Json.Schema;

namespace DesignRules.Tests.Schema;

/// <summary>
/// The schema's quantity patterns accept the forms the loader reads for the key's unit, and reject a unit of another
/// dimension ("5 V" where a resistance is expected), as the loader's <see cref="Quantity.TryParse"/> does.
/// </summary>
public sealed class QuantityPatternsFollowTheUnitOfTheKey
{
    private static readonly Dictionary<string, JsonSchema> DefinitionSchemas = new(StringComparer.Ordinal);

    [Theory]
    [InlineData("resistance", "4k7", true)]
    [InlineData("resistance", "R47", true)]
    [InlineData("resistance", "2M2", true)]
    [InlineData("resistance", "4R7", true)]
    [InlineData("resistance", "10R", true)]
    [InlineData("resistance", "4.7 kΩ", true)]
    [InlineData("resistance", "4.7 k\u2126", true)]
    [InlineData("resistance", "4.7kohm", true)]
    [InlineData("resistance", "4.7megohm", false)]
    [InlineData("resistance", "4.7meg", false)]
    [InlineData("resistance", "4.7 MΩ", true)]
    [InlineData("resistance", "600", true)]
    [InlineData("resistance", "5 V", false)]
    [InlineData("resistance", "1 kHz", false)]
    [InlineData("resistance", "4.7 k Ω", false)]
    [InlineData("resistance", "-10k", false)]
    [InlineData("positive-voltage", "-2 V", false)]
    [InlineData("voltage", "-12V", true)]
    [InlineData("voltage", "\u221212 V", true)]
    [InlineData("voltage", "250 mV", true)]
    [InlineData("voltage", "±5 V", false)]
    [InlineData("voltage", "12 Ω", false)]
    [InlineData("voltage", "--1 V", false)]
    [InlineData("current", "30 pA", true)]
    [InlineData("current", "30 pF", false)]
    [InlineData("capacitance", "1n5", true)]
    [InlineData("capacitance", "10 nF", true)]
    [InlineData("capacitance", "100p", true)]
    [InlineData("capacitance", "10 nH", false)]
    [InlineData("inductance", "10 mH", true)]
    [InlineData("inductance", "2m2", true)]
    [InlineData("inductance", "10 mF", false)]
    [InlineData("frequency", "20Hz", true)]
    [InlineData("frequency", "3 MHz", true)]
    [InlineData("frequency", "3 MV", false)]
    [InlineData("time", "1 us", true)]
    [InlineData("time", "2.5 ms", true)]
    [InlineData("time", "1 Hz", false)]
    [InlineData("power", "125 mW", true)]
    [InlineData("power", "125 mA", false)]
    [InlineData("slew-rate", "8 V/us", true)]
    [InlineData("slew-rate", "13 V/µs", true)]
    [InlineData("slew-rate", "500 V/ms", true)]
    [InlineData("slew-rate", "8 V", false)]
    [InlineData("noise-density", "18 nV/rtHz", true)]
    [InlineData("noise-density", "4 nV/√Hz", true)]
    [InlineData("noise-density", "4 nV/sqrt(Hz)", true)]
    [InlineData("noise-density", "4 nA/rtHz", false)]
    [InlineData("current-noise-density", "0.5 pA/rtHz", true)]
    [InlineData("current-noise-density", "4 fA/√Hz", true)]
    [InlineData("current-noise-density", "1 pA/sqrt(Hz)", true)]
    [InlineData("current-noise-density", "4 nV/rtHz", false)]
    [InlineData("ratio", "1%", true)]
    [InlineData("ratio", "±0.5%", true)]
    [InlineData("ratio", "106 dB", true)]
    [InlineData("ratio", "-2", true)]
    [InlineData("ratio", "200k", true)]
    [InlineData("ratio", "5 V", false)]
    [InlineData("ratio", "1k5 dB", false)]
    [InlineData("tempco", "50ppm/°C", true)]
    [InlineData("tempco", "-200 ppm/K", true)]
    [InlineData("tempco", "±30 ppm/°C", true)]
    [InlineData("tempco", "50 ppm/V", false)]
    [InlineData("tolerance", "0.1%", true)]
    [InlineData("tolerance", "±5%", true)]
    [InlineData("tolerance", "100%", false)]
    [InlineData("fraction", "99%", true)]
    [InlineData("fraction", "100%", true)]
    [InlineData("fraction", "120%", false)]
    [InlineData("frequency-band", "20Hz..20kHz", true)]
    [InlineData("frequency-band", "20 Hz .. 20 kHz", true)]
    [InlineData("frequency-band", "20 Hz-20 kHz", false)]
    [InlineData("frequency-band", "20 Hz..20 kV", false)]
    [InlineData("date", "2027-06-30", true)]
    [InlineData("date", "2027-06-31", false)]
    [InlineData("date", "30/06/2027", false)]
    public void A_text_value_is_accepted_only_in_a_form_of_its_dimension(string definition, string text, bool accepted)
    {
        var results = SchemaCheck.Evaluate(Definition(definition), JsonValue.Create(text));
        Assert.True(accepted == results.IsValid, $"{definition} '{text}': {SchemaCheck.Describe(results)}");
    }

    [Theory]
    [InlineData("resistance", 600.0, true)]
    [InlineData("resistance", -600.0, false)]
    [InlineData("voltage", -15.0, true)]
    [InlineData("tolerance", 0.01, true)]
    [InlineData("tolerance", 1.0, false)]
    [InlineData("fraction", 1.0, true)]
    [InlineData("fraction", 0.0, false)]
    public void A_bare_number_takes_the_unit_of_the_key_within_its_range(string definition, double number, bool accepted)
    {
        var results = SchemaCheck.Evaluate(Definition(definition), JsonValue.Create(number));
        Assert.True(accepted == results.IsValid, $"{definition} {number}: {SchemaCheck.Describe(results)}");
    }

    public static TheoryData<string, Dimension, bool> PatternDimensions() => new()
    {
        { "resistance", Dimension.Resistance, false },
        { "voltage", Dimension.Voltage, true },
        { "positive-voltage", Dimension.Voltage, false },
        { "current", Dimension.Current, false },
        { "capacitance", Dimension.Capacitance, false },
        { "inductance", Dimension.Inductance, false },
        { "frequency", Dimension.Frequency, false },
        { "time", Dimension.Time, false },
        { "power", Dimension.Power, false },
        { "slew-rate", Dimension.SlewRate, false },
        { "noise-density", Dimension.VoltageNoiseDensity, false },
        { "current-noise-density", Dimension.CurrentNoiseDensity, false },
        { "ratio", Dimension.Ratio, true },
        { "tempco", Dimension.TemperatureCoefficient, true },
    };

    /// <summary>
    /// Builds every combination of sign, number or RKM code, spacing, prefix and unit (of every dimension, plus some
    /// wrong spellings) and checks that the pattern accepts exactly what the loader's parser accepts. Patterns of
    /// quantities that cannot be negative also reject a leading minus, which the loader rejects by a range check.
    /// </summary>
    [Theory]
    [MemberData(nameof(PatternDimensions))]
    public void The_pattern_accepts_exactly_what_the_loader_parses(string definition, Dimension dimension, bool mayBeNegative)
    {
        var pattern = new Regex(Definition(definition, asJson: true)["pattern"]!.GetValue<string>(), RegexOptions.CultureInvariant);
        string[] signs = ["", "+", "-", "\u2212", "±", "- "];
        string[] numbers = ["4", "4.7", ".5", "5.", "10", "1e3", "2E-3", "4k7", "R47", "4R7", "1n5", "2M2", "k7", "1f5", ".", "e3", "4.7.1"];
        string[] gaps = ["", " "];
        string[] prefixes = ["", "p", "n", "u", "µ", "μ", "m", "k", "K", "M", "G", "T", "f", "meg", "x"];
        string[] units =
        [
            "", "V", "A", "Ω", "\u2126", "R", "ohm", "Ohms", "F", "H", "Hz", "s", "sec", "W", "V/s", "V/ms", "V/us", "V/µs", "V/ns",
            "V/√Hz", "V/rtHz", "V/sqrt(Hz)", "A/√Hz", "A/rtHz", "A/sqrt(Hz)", "%", "ppm", "dB", "°C", "C", "ppm/°C", "ppm/K", "/K", "/°C", "hz", "v", "Hz ", "V/Hz", " V",
        ];
        var disagreements = new List<string>();
        foreach (var sign in signs)
        {
            foreach (var number in numbers)
            {
                foreach (var gap in gaps)
                {
                    foreach (var prefix in prefixes)
                    {
                        foreach (var unit in units)
                        {
                            var text = sign + number + gap + prefix + unit;
                            var parsed = Quantity.TryParse(text, dimension, out _, out _)
                                && (mayBeNegative || !(text.StartsWith('-') || text.StartsWith('\u2212')));
                            if (parsed != pattern.IsMatch(text))
                            {
                                disagreements.Add($"'{text}' loader {(parsed ? "accepts" : "rejects")}");
                            }
                        }
                    }
                }
            }
        }

        Assert.True(disagreements.Count == 0, $"{disagreements.Count} disagreements, e.g. {string.Join("; ", disagreements.Take(20))}");
    }

    private static JsonSchema Definition(string name)
    {
        lock (DefinitionSchemas)
        {
            if (!DefinitionSchemas.TryGetValue(name, out var schema))
            {
                // Each definition is self-contained (type, pattern, bounds), so it can stand alone as a schema.
                var node = Definition(name, asJson: true);
                node["$schema"] = "https://json-schema.org/draft/2020-12/schema";
                // The editors' message keywords carry no validation; a definition standing alone as a root would need a
                // vocabulary for them, so they are left out here.
                node.Remove("patternErrorMessage");
                node.Remove("errorMessage");
                schema = JsonSchema.FromText(node.ToJsonString(), new BuildOptions { SchemaRegistry = new SchemaRegistry() });
                DefinitionSchemas[name] = schema;
            }

            return schema;
        }
    }

    private static JsonObject Definition(string name, bool asJson)
    {
        _ = asJson;
        var schema = JsonNode.Parse(SchemaCheck.EmbeddedText("design.schema.json"))!;
        return schema["$defs"]![name]!.AsObject().DeepClone().AsObject();
    }
}
