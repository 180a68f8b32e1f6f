namespace DesignRules.Rules.Tests.Tolerance;

/// <summary>DR405: the output offset with offset voltages and bias currents at their maxima.</summary>
public sealed class OutputOffsetTests
{
    [Fact]
    public void An_offset_within_its_budget_passes() => RuleFixture.Verify("tolerance/inverting-within-budget.yaml");

    [Fact]
    public void An_offset_over_its_budget_points_at_the_amplifier_part() => RuleFixture.Verify("tolerance/inverting-over-budget.yaml");

    [Fact]
    public void The_output_offset_of_an_inverting_stage_is_Vos_times_1_plus_Rf_over_Rin()
    {
        var analysis = ToleranceFixture.WorstCase("offset-exact-inverting.yaml");

        // Textbook: Vout,os = Vos·(1 + Rf/Rin) = 1 mV·(1 + 100k/10k) = 11 mV (exact resistors, 1 fA bias, 180 dB open-loop gain).
        Assert.Equal(11e-3, analysis.OutputOffset, 11e-3 * 1e-5);
    }
}
