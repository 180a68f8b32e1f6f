using DesignRules.Diagnostics;
using DesignRules.Loading;
using DesignRules.Model;

namespace DesignRules.Tests.Loading;

/// <summary>
/// A design declares the hazardous energy it connects to (<c>hazards:</c>); the caution follows from that declaration
/// and from the written voltages against the extra-low-voltage band, never from names.
/// </summary>
public sealed class HazardDeclarationTests
{
    private static string Design(string hazards, string positive = "15 V", string negative = "-15 V", string amplitude = "1 V", string id = "hazard-probe") => $"""
        design:
          id: {id}
        {hazards}
        supplies:
          positive: {positive}
          negative: {negative}
        source:
          waveform: sine
          amplitude: {amplitude}
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
              rf: 20k
        """;

    private static LoadResult Load(string text) => new DesignLoader().LoadText("hazard-probe.yaml", text);

    [Fact]
    public void The_short_form_is_a_list_of_kinds()
    {
        var result = Load(Design("hazards: [mains, high-energy-battery]"));

        Assert.Empty(result.Diagnostics);
        var hazards = Assert.Single(result.Designs).Hazards!;
        Assert.Equal([HazardKind.Mains, HazardKind.HighEnergyBattery], hazards.Kinds.Select(k => k.Value));
        Assert.Null(hazards.Note);
        Assert.Equal((3, 11), (hazards.Kinds[0].Span.Line, hazards.Kinds[0].Span.Column));
    }

    [Fact]
    public void The_long_form_carries_a_note_and_a_kind_named_twice_counts_once()
    {
        var result = Load(Design("hazards:\n  kinds: [high-voltage-dc, high-voltage-dc]\n  note: Sensing resistor on the 400 V DC link."));

        Assert.Empty(result.Diagnostics);
        var hazards = Assert.Single(result.Designs).Hazards!;
        Assert.Equal([HazardKind.HighVoltageDc], hazards.Kinds.Select(k => k.Value));
        Assert.Equal("Sensing resistor on the 400 V DC link.", hazards.Note!.Value);
    }

    [Fact]
    public void An_unknown_kind_is_a_located_error_with_a_did_you_mean_and_the_known_kinds()
    {
        var result = Load(Design("hazards: [mians]"));

        Assert.Empty(result.Designs);
        var d = Assert.Single(result.Diagnostics);
        Assert.Equal("DR914", d.Id);
        Assert.Equal((3, 11), (d.Span.Line, d.Span.Column));
        Assert.Contains("'mains'", d.Message, StringComparison.Ordinal);
        Assert.Contains("high-voltage-dc", d.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void A_single_word_instead_of_a_list_is_a_wrong_shape()
    {
        var result = Load(Design("hazards: mains"));

        Assert.Empty(result.Designs);
        Assert.Contains(result.Diagnostics, d => d.Id == "DR913" && d.Severity == Severity.Error && d.Span.Line == 3);
    }

    [Fact]
    public void A_declared_hazard_gives_a_caution_even_when_every_voltage_is_low()
    {
        var design = Assert.Single(Load(Design("hazards:\n  kinds: [mains]\n  note: CT on a motor lead.")).Designs);

        var caution = SafetyCaution.For(design)!;

        Assert.Equal([HazardKind.Mains], caution.Hazards);
        Assert.False(caution.AboveExtraLowVoltage);
        Assert.StartsWith("This design connects to mains: CT on a motor lead.", caution.Text, StringComparison.Ordinal);
        Assert.Contains("isolation, creepage and clearance, protective earthing and installation follow local codes and licensed practice", caution.Text, StringComparison.Ordinal);
    }

    [Fact]
    public void A_design_without_the_key_and_with_low_voltages_gets_no_caution()
    {
        var design = Assert.Single(Load(Design(string.Empty)).Designs);

        Assert.Null(design.Hazards);
        Assert.Null(SafetyCaution.For(design));
    }

    // The extra-low-voltage band of IEC 61140:2016: not above 120 V ripple-free DC, not above 50 V AC rms (IEC
    // Electropedia, "extra-low voltage"; IEC 61347-2-2 note 1 cites the same band). 50 V rms of a sine is 70.71 V peak.
    [Theory]
    [InlineData("60 V", "-60 V", "1 V", false)]   // 120 V between the rails: at the DC limit, not above it
    [InlineData("61 V", "-61 V", "1 V", true)]    // 122 V between the rails
    [InlineData("121 V", "0 V", "1 V", true)]     // one rail above 120 V
    [InlineData("15 V", "-15 V", "70.7 V", false)] // 49.99 V rms
    [InlineData("15 V", "-15 V", "70.8 V", true)]  // 50.06 V rms
    public void Without_a_declaration_the_voltages_decide_against_the_extra_low_voltage_band(string positive, string negative, string amplitude, bool caution)
    {
        var design = Assert.Single(Load(Design(string.Empty, positive, negative, amplitude)).Designs);

        var found = SafetyCaution.For(design);

        Assert.Equal(caution, found is not null);
        if (found is not null)
        {
            Assert.True(found.AboveExtraLowVoltage);
            Assert.Contains("120 V ripple-free DC or 50 V AC rms", found.Text, StringComparison.Ordinal);
        }
    }

    [Fact]
    public void Names_never_imply_a_hazard()
    {
        // "mains" in the id, the title or a stage name declares nothing: only the hazards key does.
        var design = Assert.Single(Load(Design(string.Empty, id: "mains-current-sense")).Designs);

        Assert.Null(SafetyCaution.For(design));
    }
}
