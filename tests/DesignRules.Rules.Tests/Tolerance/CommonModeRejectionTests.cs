namespace DesignRules.Rules.Tests.Tolerance;

/// <summary>DR403: the common-mode rejection of a difference stage from resistor mismatch.</summary>
public sealed class CommonModeRejectionTests
{
    [Fact]
    public void A_unity_difference_stage_with_0p1pct_resistors_keeps_a_5V_common_mode_within_5pct() => RuleFixture.Verify("tolerance/difference-matched.yaml");

    [Fact]
    public void A_unity_difference_stage_with_1pct_resistors_lets_a_5V_common_mode_through_and_points_at_a_resistor() => RuleFixture.Verify("tolerance/difference-mismatched.yaml");

    [Theory]
    [InlineData("cmrr-unity-1pct.yaml", 0.01)]
    [InlineData("cmrr-unity-0p1pct.yaml", 0.001)]
    public void The_worst_case_rejection_is_1_plus_G_over_4t(string fixture, double tolerance)
    {
        var analysis = ToleranceFixture.WorstCase(fixture);

        // Sedra & Smith, Microelectronic Circuits: worst-case CMRR ≈ (1 + G)/(4·t); G = 1 gives about 50 (34 dB) with 1 %
        // resistors and about 500 (54 dB) with 0.1 %.
        double expected = (1 + 1) / (4 * tolerance);
        Assert.InRange(analysis.WorstCommonModeRejection, expected * 0.9, expected * 1.1);
    }
}
