namespace DesignRules.Rules.Tests.Saturation;

/// <summary>DR205: a single-supply stage whose signal needs a bias point it does not have.</summary>
public sealed class SingleSupplyBiasTests
{
    [Fact]
    public void A_ground_centred_sine_on_a_single_supply_follower_is_an_error_at_the_source() =>
        RuleFixture.Verify("saturation/single-supply-unbiased.yaml");

    [Fact]
    public void The_same_sine_biased_to_mid_supply_is_clean() =>
        RuleFixture.Verify("saturation/single-supply-biased.yaml");
}
