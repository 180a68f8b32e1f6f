using System.Text.Json;
using DesignRules.Reports;
using DesignRules.Rules;

namespace DesignRules.Build.Tests;

/// <summary>
/// A finding whose fix is one YAML value replacement carries a SARIF 2.1.0 <c>fix</c> (OASIS SARIF 2.1.0 §3.55:
/// <c>artifactChanges</c> with <c>replacements</c>, each a <c>deletedRegion</c> and <c>insertedContent</c>); applied to the
/// file exactly as SARIF defines the region (end column exclusive), it clears the finding.
/// </summary>
public sealed class SarifFixTests : IDisposable
{
    private readonly string root = Directory.CreateTempSubdirectory("designrules-sariffix-").FullName;

    public void Dispose() => Directory.Delete(root, recursive: true);

    [Fact]
    public void The_sarif_fix_of_an_off_series_value_replaces_it_by_the_nearest_preferred_value_and_the_finding_disappears()
    {
        var design = Path.Combine(root, "amp.yaml");
        File.WriteAllText(design, """
            design:
              id: off-series
              title: An off-series resistor
            e-series: E24
            supplies:
              positive: 15 V
              negative: -15 V
            source:
              waveform: sine
              amplitude: 1 V
              frequency: 1 kHz
            load:
              resistance: 10k
            stages:
              - id: amp
                block: inverting
                amplifier: jfet-input-15v
                resistors: thin-film-1pct
                values:
                  rin: 10k
                  rf: 20.5k

            """);
        var report = Check(design);
        var sarif = SarifReport.ToBytes(report, new ReportSettings(root, "https://example.invalid/rules/", "1.2.3"));
        Assert.Empty(SarifSchema.Problems(System.Text.Encoding.UTF8.GetString(sarif)));

        var result = JsonDocument.Parse(sarif).RootElement.GetProperty("runs")[0].GetProperty("results").EnumerateArray().Single(r => r.GetProperty("ruleId").GetString() == "DR701");
        var change = Assert.Single(Assert.Single(result.GetProperty("fixes").EnumerateArray()).GetProperty("artifactChanges").EnumerateArray());
        Assert.Equal("amp.yaml", change.GetProperty("artifactLocation").GetProperty("uri").GetString());
        var replacement = Assert.Single(change.GetProperty("replacements").EnumerateArray());
        var region = replacement.GetProperty("deletedRegion");
        var text = replacement.GetProperty("insertedContent").GetProperty("text").GetString()!;

        // IEC 60063 E24: the neighbours of 20.5k are 20k and 22k; 20k is nearer.
        Assert.Equal("20k", text);
        var lines = File.ReadAllLines(design);
        int line = region.GetProperty("startLine").GetInt32() - 1;
        Assert.Equal(line + 1, region.GetProperty("endLine").GetInt32());
        lines[line] = lines[line][..(region.GetProperty("startColumn").GetInt32() - 1)] + text + lines[line][(region.GetProperty("endColumn").GetInt32() - 1)..];
        File.WriteAllLines(design, lines);

        Assert.EndsWith("rf: 20k", lines[line], StringComparison.Ordinal);
        Assert.DoesNotContain(Check(design).Findings, f => f.RuleId == "DR701");
    }

    [Fact]
    public void The_sarif_fix_of_a_clipping_stage_writes_the_searched_E24_feedback_resistor_and_the_finding_disappears()
    {
        var design = Path.Combine(root, "clip.yaml");
        File.WriteAllText(design, ClippingStage);
        var report = Check(design);
        var sarif = SarifReport.ToBytes(report, new ReportSettings(root, "https://example.invalid/rules/", "1.2.3"));
        Assert.Empty(SarifSchema.Problems(System.Text.Encoding.UTF8.GetString(sarif)));

        var result = JsonDocument.Parse(sarif).RootElement.GetProperty("runs")[0].GetProperty("results").EnumerateArray().Single(r => r.GetProperty("ruleId").GetString() == "DR201");
        // One value replacement only: the largest amplitude beside it changes the signal, not the design, so it has no SARIF fix.
        var change = Assert.Single(Assert.Single(result.GetProperty("fixes").EnumerateArray()).GetProperty("artifactChanges").EnumerateArray());
        var replacement = Assert.Single(change.GetProperty("replacements").EnumerateArray());
        var region = replacement.GetProperty("deletedRegion");
        var text = replacement.GetProperty("insertedContent").GetProperty("text").GetString()!;

        // Textbook inverting gain rf/rin may be at most (15 V − 1.5 V headroom − 0.1 V margin)/2 V = 6.7, so rf ≤ 67 kΩ; the
        // E24 values around it (IEC 60063) are 62k and 68k.
        Assert.Equal("62k", text);
        var lines = File.ReadAllLines(design);
        int line = region.GetProperty("startLine").GetInt32() - 1;
        lines[line] = lines[line][..(region.GetProperty("startColumn").GetInt32() - 1)] + text + lines[line][(region.GetProperty("endColumn").GetInt32() - 1)..];
        File.WriteAllLines(design, lines);

        Assert.EndsWith("rf: 62k", lines[line], StringComparison.Ordinal);
        Assert.DoesNotContain(Check(design).Findings, f => f.RuleId == "DR201");
    }

    /// <summary>An inverting gain-of-10 stage asked for 20 V peak from ±15 V rails: its output clips (DR201).</summary>
    internal const string ClippingStage = """
        design:
          id: clipping
          title: A clipping inverting stage
        e-series: E24
        supplies:
          positive: 15 V
          negative: -15 V
        source:
          waveform: sine
          amplitude: 2 V
          frequency: 1 kHz
        load:
          resistance: 10k
        stages:
          - id: amp
            block: inverting
            amplifier: jfet-input-15v
            resistors: thin-film-1pct
            values:
              rin: 10k
              rf: 100k

        """;

    [Fact]
    public void A_fix_that_needs_another_part_has_no_sarif_fix_but_its_text_in_the_message()
    {
        var design = Path.Combine(root, "power.yaml");
        File.WriteAllText(design, """
            design:
              id: hot-resistor
              title: Resistor power at DC
            supplies:
              positive: 15 V
              negative: -15 V
            source:
              waveform: dc
              offset: 10 V
            load:
              resistance: 10k
            stages:
              - id: invert
                block: inverting
                amplifier: jfet-input-15v
                resistors: thin-film-1pct
                values:
                  rin: 1k
                  rf: 1k

            """);
        var sarif = SarifReport.ToBytes(Check(design), new ReportSettings(root, "https://example.invalid/rules/", "1.2.3"));
        var result = JsonDocument.Parse(sarif).RootElement.GetProperty("runs")[0].GetProperty("results").EnumerateArray().First(r => r.GetProperty("ruleId").GetString() == "DR601");

        Assert.False(result.TryGetProperty("fixes", out _));
        Assert.Contains("Fix: ", result.GetProperty("message").GetProperty("text").GetString(), StringComparison.Ordinal);
    }

    private static CheckReport Check(string design) => DesignCheck.Run([design], new CheckOptions(null, new DateOnly(2026, 12, 1)));
}
