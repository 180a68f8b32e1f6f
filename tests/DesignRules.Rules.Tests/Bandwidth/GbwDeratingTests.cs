using DesignRules.Loading;

namespace DesignRules.Rules.Tests.Bandwidth;

/// <summary>
/// A part's <c>gbw-derating</c> moves its GBW over the design's temperature range: DR501 judges the closed-loop bandwidth
/// at the end where GBW is lowest and names it.
/// </summary>
public sealed class GbwDeratingTests
{
    [Fact]
    public void A_stage_above_its_required_bandwidth_at_25_C_is_clean()
    {
        var report = RuleFixture.Verify("bandwidth/gbw-derated-at-25-only.yaml");
        var bandwidth = Figure(report, FigureKinds.ClosedLoopBandwidth.Key);

        // Textbook single-pole amplifier: f(-3 dB) = GBW / noise gain (Franco, Design with Operational Amplifiers, §6.1)
        // = 1 MHz (the fixture part's gbw) / (1 + 90k/10k) = 100 kHz, at 25 °C.
        Assert.InRange(bandwidth.Value, 100e3 * 0.97, 100e3 * 1.03);
        Assert.Null(bandwidth.Temperature);
    }

    [Fact]
    public void The_same_stage_over_0_to_85_C_falls_short_at_the_hot_end_where_its_derated_GBW_is_lowest()
    {
        var report = RuleFixture.Verify("bandwidth/gbw-derated-hot-end-fails.yaml");
        var finding = Assert.Single(report.Findings, f => f.RuleId == Diagnostics.RuleIds.ClosedLoopBandwidth);
        Assert.Contains("at 85 °C", finding.Message, StringComparison.Ordinal);
        Assert.Contains("90 kHz required", finding.Message, StringComparison.Ordinal);
        Assert.Contains("820 kHz", finding.Message, StringComparison.Ordinal);

        // GBW / noise gain (Franco, §6.1) with the derating applied by hand: 1 MHz × (1 − 0.003 × (85 − 25)) = 820 kHz,
        // over a noise gain of 10 = 82 kHz, at 85 °C.
        var bandwidth = Figure(report, FigureKinds.ClosedLoopBandwidth.Key);
        const double expected = 1e6 * 0.82 / 10;
        Assert.InRange(bandwidth.Value, expected * 0.97, expected * 1.03);
        Assert.Equal(85, bandwidth.Temperature);
    }

    [Fact]
    public void The_derating_reads_as_a_fraction_per_degree_and_reaches_the_part()
    {
        var loaded = DesignLoader.LoadFiles([RuleFixture.Path("bandwidth/gbw-derated-hot-end-fails.yaml")]);
        var part = loaded.Designs.Single().Libraries.SelectMany(l => l.Amplifiers).Single(a => a.Id.Value == "derated-gbw-15v");
        Assert.Equal(-0.003, part.GbwDerating!.Value.Value, 12);
    }

    [Fact]
    public void A_rectifier_keeps_its_loop_gain_at_25_C_and_loses_it_at_the_hot_end_in_proportion_to_its_GBW()
    {
        var at25 = RuleFixture.Verify("bandwidth/rectifier-gbw-derated-at-25-only.yaml");
        var hot = RuleFixture.Verify("bandwidth/rectifier-gbw-derated-hot-end-fails.yaml");
        var finding = Assert.Single(hot.Findings, f => f.RuleId == Diagnostics.RuleIds.RectifierLoopGain);
        Assert.Contains("at 85 °C", finding.Message, StringComparison.Ordinal);

        // Textbook single-pole open-loop gain A(f) = A0 / √(1 + (f·A0/GBW)²) ≈ GBW/f: at 7 kHz with A0 = 100 dB it is
        // GBW/f to 1 part in 10⁵, so the loop gain GBW/(f·noise gain) = 1 MHz / (7 kHz × 2) = 71.4 at 25 °C scales with
        // the derated GBW, 1 − 0.003 × (85 − 25) = 0.82 times at 85 °C.
        var gain25 = Figure(at25, FigureKinds.LoopGain.At("u1"), "rect");
        var gainHot = Figure(hot, FigureKinds.LoopGain.At("u1"), "rect");
        Assert.Equal(1e6 / (7e3 * 2), gain25.Value, 1e6 / (7e3 * 2) * 1e-3);
        Assert.Equal(0.82, gainHot.Value / gain25.Value, 1e-6);
        Assert.Equal(85, gainHot.Temperature);
        Assert.Null(gain25.Temperature);
    }

    private static Figure Figure(CheckReport report, FigureKey key, string stage = "gain") =>
        report.Designs.Single().StageFigures.Single(s => s.Key == stage).Value.Single(f => f.Key == key);
}
