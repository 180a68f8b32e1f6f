using System.Text;
using System.Text.Json.Nodes;
using DesignRules.Quantities;

namespace DesignRules.Tests.Schema;

/// <summary>The example hardware repository and the built-in parts library are valid files of their kinds.</summary>
public sealed class ShippedFilesMatchTheSchemas
{
    public static TheoryData<string> ExampleFiles() => new(ExampleFilePaths());

    private static List<string> ExampleFilePaths() =>
        DesignRules.Loading.RepositoryFiles.Find([SchemaTestFiles.InRepository("example-design")], out _)
            .Select(f => Path.GetRelativePath(SchemaTestFiles.RepositoryRoot(), f).Replace('\\', '/'))
            .Order(StringComparer.Ordinal)
            .ToList();

    [Theory]
    [MemberData(nameof(ExampleFiles))]
    public void Every_example_design_file_matches_its_schema(string relativePath)
    {
        var text = File.ReadAllText(SchemaTestFiles.InRepository(relativePath.Split('/')));
        var results = SchemaCheck.Evaluate(text, out var kind);
        Assert.True(results.IsValid, $"{relativePath} ({kind}):{Environment.NewLine}{SchemaCheck.Describe(results)}");
    }

    [Fact]
    public void The_example_repository_holds_three_designs_and_a_parts_file_they_use()
    {
        var files = ExampleFilePaths();
        var kinds = files.ToLookup(f => SchemaCheck.KindOf(YamlAsJson.Convert(File.ReadAllText(SchemaTestFiles.InRepository(f.Split('/'))))));
        Assert.True(kinds[FileKind.Design].Count() >= 3, "three designs");
        Assert.NotEmpty(kinds[FileKind.Parts]);
        var libraries = kinds[FileKind.Design]
            .SelectMany(f => YamlAsJson.Convert(File.ReadAllText(SchemaTestFiles.InRepository(f.Split('/'))))?["libraries"]?.AsArray() ?? [])
            .Select(n => n!.GetValue<string>());
        Assert.Contains("../parts/cold-store-parts.yaml", libraries);
    }

    [Fact]
    public void The_builtin_library_matches_the_parts_schema()
    {
        var results = SchemaCheck.Evaluate(BuiltinLibraryText(), out var kind);
        Assert.Equal(FileKind.Parts, kind);
        Assert.True(results.IsValid, SchemaCheck.Describe(results));
    }

    [Fact]
    public void The_builtin_library_offers_the_documented_part_classes()
    {
        var library = YamlAsJson.Convert(BuiltinLibraryText())!;
        Assert.Equal("builtin", library["library"]!["id"]!.GetValue<string>());
        string[] expected =
        [
            "jfet-input-15v", "jfet-fast-15v", "bipolar-general-15v", "precision-bipolar-15v", "cmos-rail-to-rail-5v",
            "decompensated-wideband-15v", "silicon-small-signal", "schottky-small-signal", "silicon-low-leakage",
            "thin-film-1pct", "thin-film-0p1pct", "thick-film-5pct", "metal-film-1pct-axial", "c0g-5pct", "x7r-10pct", "film-5pct",
        ];
        var ids = new[] { "amplifiers", "diodes", "resistors", "capacitors" }
            .SelectMany(list => library[list]!.AsArray())
            .Select(part => part!["id"]!.GetValue<string>())
            .ToList();
        Assert.Equal(ids.Count, ids.Distinct(StringComparer.Ordinal).Count());
        Assert.All(expected, id => Assert.Contains(id, ids));
    }

    [Fact]
    public void Every_builtin_part_is_described_and_amplifiers_and_diodes_are_marked_typical()
    {
        var library = YamlAsJson.Convert(BuiltinLibraryText())!;
        foreach (var list in new[] { "amplifiers", "diodes", "resistors", "capacitors" })
        {
            foreach (var part in library[list]!.AsArray())
            {
                var id = part!["id"]!.GetValue<string>();
                Assert.Contains("typical values", part["description"]!.GetValue<string>(), StringComparison.Ordinal);
                if (list is "amplifiers" or "diodes")
                {
                    Assert.True(part["typical"]?.GetValue<bool>() == true, $"{id} should be marked typical: true");
                }
            }
        }
    }

    [Fact]
    public void The_slow_bipolar_class_cannot_follow_a_20_kHz_rectifier()
    {
        // DESIGN.md primer: a precision rectifier's amplifier must jump about two diode drops (≈ 1.2 V) at every zero
        // crossing; at 20 kHz a half period is 25 µs. Common practice: the jump should take a small fraction of it.
        var library = YamlAsJson.Convert(BuiltinLibraryText())!;
        double SlewOf(string id)
        {
            var part = library["amplifiers"]!.AsArray().Single(p => p!["id"]!.GetValue<string>() == id)!;
            Assert.True(Quantity.TryParse(part["slew-rate"]!.ToString(), Dimension.SlewRate, out var q, out var error), error?.Message);
            return q.Value;
        }

        var jumpTimeSlow = 1.2 / SlewOf("bipolar-general-15v");
        var jumpTimeJfet = 1.2 / SlewOf("jfet-input-15v");
        Assert.True(jumpTimeSlow > 0.05 * 25e-6, "the slow class spends more than 5 % of a 20 kHz half period crossing the dead zone");
        Assert.True(jumpTimeJfet < 0.05 * 25e-6, "the JFET class crosses it in well under 5 %");
    }

    [Fact]
    public void Every_figure_in_the_builtin_library_reads_as_a_quantity_of_its_key()
    {
        var library = YamlAsJson.Convert(BuiltinLibraryText())!;
        var dimensions = new Dictionary<string, Dimension>(StringComparer.Ordinal)
        {
            ["gbw"] = Dimension.Frequency, ["second-pole"] = Dimension.Frequency, ["open-loop-gain"] = Dimension.Ratio,
            ["output-resistance"] = Dimension.Resistance, ["output-current"] = Dimension.Current, ["min-stable-gain"] = Dimension.Ratio,
            ["max-differential-input"] = Dimension.Voltage, ["noise-density"] = Dimension.VoltageNoiseDensity,
            ["current-noise"] = Dimension.CurrentNoiseDensity, ["noise-corner"] = Dimension.Frequency,
            ["overload-recovery"] = Dimension.Time, ["slew-rate"] = Dimension.SlewRate, ["saturation-current"] = Dimension.Current,
            ["emission"] = Dimension.Ratio, ["series-resistance"] = Dimension.Resistance, ["reverse-voltage"] = Dimension.Voltage,
            ["forward-current"] = Dimension.Current, ["capacitance"] = Dimension.Capacitance, ["breakdown-voltage"] = Dimension.Voltage,
            ["tolerance"] = Dimension.Ratio, ["tempco"] = Dimension.TemperatureCoefficient, ["power"] = Dimension.Power,
            ["voltage"] = Dimension.Voltage,
        };
        var checkedCount = 0;
        foreach (var list in new[] { "amplifiers", "diodes", "resistors", "capacitors" })
        {
            foreach (var part in library[list]!.AsArray())
            {
                foreach (var (key, value) in part!.AsObject())
                {
                    if (dimensions.TryGetValue(key, out var dimension) && value is JsonValue)
                    {
                        Assert.True(Quantity.TryParse(value.ToString(), dimension, out _, out var error), $"{part["id"]}.{key}: {error?.Message}");
                        checkedCount++;
                    }
                }
            }
        }

        Assert.True(checkedCount > 100, $"only {checkedCount} figures checked");
    }

    private static string BuiltinLibraryText()
    {
        using var stream = typeof(Quantity).Assembly.GetManifestResourceStream("DesignRules.Library.builtin-parts.yaml")
            ?? throw new InvalidOperationException("builtin-parts.yaml is not embedded in the Core assembly");
        using var reader = new StreamReader(stream, Encoding.UTF8);
        return reader.ReadToEnd();
    }
}
