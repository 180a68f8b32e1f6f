namespace DesignRules.Rules.Tests.Tolerance;

/// <summary>DR404: the half-cycle symmetry of an absolute-value stage.</summary>
public sealed class HalfCycleSymmetryTests
{
    [Fact]
    public void An_absolute_value_stage_with_0p1pct_resistors_is_symmetric_within_5pct() => RuleFixture.Verify("tolerance/absolute-value-symmetric.yaml");

    [Fact]
    public void An_absolute_value_stage_with_a_wrong_summing_ratio_is_reported_at_the_resistor_the_symmetry_is_most_sensitive_to() => RuleFixture.Verify("tolerance/absolute-value-lopsided.yaml");
}
