namespace DesignRules.Rules.Tests.Tolerance;

/// <summary>DR401: the extreme-value worst case of a stage's transfer against its accuracy.</summary>
public sealed class WorstCaseTransferTests
{
    [Fact]
    public void An_inverting_stage_with_1pct_resistors_meets_a_5pct_accuracy() => RuleFixture.Verify("tolerance/inverting-within-budget.yaml");

    [Fact]
    public void An_inverting_stage_with_5pct_resistors_misses_a_2pct_accuracy_at_its_feedback_resistor() => RuleFixture.Verify("tolerance/inverting-over-budget.yaml");

    [Fact]
    public void The_worst_case_gain_of_an_inverting_stage_is_G_times_1_plus_t_over_1_minus_t()
    {
        var analysis = ToleranceFixture.WorstCase("gain-corners-inverting.yaml");

        // Textbook extreme-value analysis: |G|max = (Rf/Rin)·(1 + t)/(1 − t), here 2·1.01/0.99 with 1 % resistors.
        // The part's 180 dB open-loop gain leaves a loop-gain error of a few parts per billion.
        double expected = 2 * 1.01 / 0.99;
        double measured = Math.Max(Math.Abs(analysis.Gain.Low), Math.Abs(analysis.Gain.High));
        Assert.Equal(1, measured / expected, 1e-6);
        Assert.Equal(1, Math.Min(Math.Abs(analysis.Gain.Low), Math.Abs(analysis.Gain.High)) / (2 * 0.99 / 1.01), 1e-6);
    }

    [Fact]
    public void Resistor_corners_are_enumerated_for_up_to_ten_resistors()
    {
        var analysis = ToleranceFixture.WorstCase("gain-corners-inverting.yaml");
        Assert.False(analysis.BySensitivity);
        Assert.Equal(4, analysis.Corners);
    }
}
