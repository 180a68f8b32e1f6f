using DesignRules.Elaboration;
using DesignRules.Loading;
using DesignRules.Simulation;

namespace DesignRules.Rules.Tests.Loading;

/// <summary>A source impedance in series with an inverting stage's input resistor divides the signal as the textbook says.</summary>
public sealed class SourceImpedanceTests
{
    private const double Rs = 600, Rin = 10e3, Rf = 20e3;

    [Fact]
    public void The_inverting_stage_gain_from_the_source_emf_is_minus_rf_over_rin_plus_rs()
    {
        var design = Assert.Single(DesignLoader.LoadFiles([RuleFixture.Path("loading/source-impedance-inverting.yaml")]).Designs);
        var chain = ChainElaborator.Elaborate(design);
        var ac = Simulate.AcSweep(chain.Circuit, AcSweep.List(chain.SourceId, 1e3));
        var gain = ac.Voltage(chain.OutputNode)[0] / ac.Voltage(chain.SourceEmfNode)[0];

        // Textbook divider: G = -Rf / (Rin + Rs) = -20k / 10.6k.
        const double expected = -Rf / (Rin + Rs);
        Assert.InRange(gain.Real, expected * 1.001, expected * 0.999);
    }

    [Fact]
    public void DR302_reports_the_divider_loss_rs_over_rs_plus_rin()
    {
        var report = RuleFixture.Verify("loading/source-impedance-inverting.yaml");
        var loss = Assert.Single(report.Designs).StageFigures.Single(s => s.Key == "gain").Value.Single(f => f.Name == "source loading loss").Value;

        // Textbook divider: Rs / (Rs + Rin) = 600 / 10.6k = 5.66 %.
        const double expected = Rs / (Rs + Rin);
        Assert.InRange(loss, expected * 0.99, expected * 1.01);
    }
}
