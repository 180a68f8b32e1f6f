using DesignRules.Diagnostics;
using DesignRules.Rules;

namespace DesignRules.Rules.Tests.Stability;

/// <summary>Stability rules: phase margin, loop peaking, capacitive load with its isolation hint, step overshoot.</summary>
public sealed class StabilityRuleTests
{
    [Theory]
    [InlineData("stability/follower-driving-cable.yaml")]
    [InlineData("stability/follower-cable-isolated.yaml")]
    [InlineData("stability/line-driver-beyond-stated-load.yaml")]
    public void Each_fixture_yields_exactly_its_stated_stability_findings(string fixture) => RuleFixture.Verify(fixture);

    [Fact]
    public void The_isolation_resistor_the_capacitive_load_rule_hints_is_the_one_the_passing_fixture_fits()
    {
        var failing = RuleFixture.Verify("stability/follower-driving-cable.yaml");
        var hint = failing.Findings.Single(f => f.RuleId == RuleIds.CapacitiveLoad.Value).Figures.Single(f => f.Key.Kind == FigureKinds.IsolationResistor).Value;
        var fitted = File.ReadAllText(RuleFixture.Path("stability/follower-cable-isolated.yaml"));
        Assert.Equal(20, hint, 1e-9);
        Assert.Contains("{ id: riso, type: resistor, value: 20,", fitted, StringComparison.Ordinal);
    }

    [Fact]
    public void The_cable_costs_the_follower_the_margin_the_output_resistance_pole_predicts()
    {
        // Loop of the follower: T = A(s)/(1 + s·Ro·CL) with A(s) = A0/((1 + s/ωp)(1 + s/ω2)) (Franco, Design with Operational
        // Amplifiers and Analog Integrated Circuits, 3rd ed., §8.4); built-in jfet-input-15v class: GBW 4 MHz, A0 100 dB,
        // second pole 16 MHz, Ro 60 Ω; cable 2 nF; the load's 100 kΩ is neglected. Crossover by bisection on |T| = 1.
        double a0 = 1e5, fp = 4e6 / a0, f2 = 16e6, f3 = 1 / (2 * Math.PI * 60 * 2e-9);
        double Magnitude(double f) => a0 / Math.Sqrt((1 + Math.Pow(f / fp, 2)) * (1 + Math.Pow(f / f2, 2)) * (1 + Math.Pow(f / f3, 2)));
        double lo = 1e5, hi = 1e8;
        for (int i = 0; i < 100; i++)
        {
            double mid = Math.Sqrt(lo * hi);
            if (Magnitude(mid) > 1) lo = mid; else hi = mid;
        }

        double expected = 180 - ((Math.Atan(lo / fp) + Math.Atan(lo / f2) + Math.Atan(lo / f3)) * 180 / Math.PI);
        var report = RuleFixture.Verify("stability/follower-driving-cable.yaml");
        var margin = report.Findings.Single(f => f.RuleId == RuleIds.PhaseMargin.Value).Figures.Single(f => f.Key.Kind == FigureKinds.PhaseMargin).Value;
        Assert.Equal(expected, margin, 0.2);
    }
}
