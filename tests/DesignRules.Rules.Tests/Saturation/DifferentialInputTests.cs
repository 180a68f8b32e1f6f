namespace DesignRules.Rules.Tests.Saturation;

/// <summary>DR204: the voltage between an amplifier's inputs while its loop is open against the part's limit.</summary>
public sealed class DifferentialInputTests
{
    [Fact]
    public void An_open_loop_rectifier_on_a_part_with_clamped_inputs_exceeds_its_differential_limit() =>
        RuleFixture.Verify("saturation/clamped-inputs-open-loop.yaml");

    [Fact]
    public void An_open_loop_rectifier_on_a_part_rated_for_the_full_supply_is_clean() =>
        RuleFixture.Verify("saturation/open-loop-within-differential-rating.yaml");
}
