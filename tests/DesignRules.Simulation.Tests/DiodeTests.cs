using MathNet.Numerics;
using MathNet.Numerics.RootFinding;

namespace DesignRules.Simulation.Tests;

public sealed class DiodeTests
{
    private static readonly DiodeModel Model = new() { SaturationCurrent = 1e-14, EmissionCoefficient = 1.0, SeriesResistance = 0, JunctionCapacitance = 0 };

    [Fact]
    public void Thermal_voltage_comes_from_the_exact_SI_constants()
    {
        // SI brochure (2019): k = 1.380649e-23 J/K and e = 1.602176634e-19 C exactly; V_T = kT/e = 25.8520 mV at 300 K.
        Assert.Equal(1.380649e-23 * 298.15 / 1.602176634e-19, PhysicalConstants.ThermalVoltage(298.15), 15);
        Assert.Equal(0.0258520, PhysicalConstants.ThermalVoltage(300), 6);
    }

    [Theory]
    [InlineData(5.0, 1e3)]
    [InlineData(1.0, 10e3)]
    [InlineData(12.0, 100.0)]
    [InlineData(0.3, 1e3)]
    public void Forward_current_through_a_series_resistor_matches_the_Lambert_W_closed_form(double supply, double resistance)
    {
        var circuit = new Circuit()
            .AddVoltageSource("v1", "in", Circuit.Ground, supply)
            .AddResistor("r1", "in", "a", resistance)
            .AddDiode("d1", "a", Circuit.Ground, Model);
        var op = Simulate.OperatingPoint(circuit);
        Assert.True(op.Succeeded, op.Failure?.ToString());
        double current = -op.Current("v1");

        // Banwell & Jayakumar, Electronics Letters 36 (2000): I = (n·VT/R)·W((Is·R/(n·VT))·exp((V + Is·R)/(n·VT))) − Is.
        double nvt = PhysicalConstants.ThermalVoltage(PhysicalConstants.DefaultTemperature);
        double exact = (nvt / resistance * LambertW((Model.SaturationCurrent * resistance / nvt) * Math.Exp((supply + (Model.SaturationCurrent * resistance)) / nvt))) - Model.SaturationCurrent;
        Assert.True(Math.Abs(current - exact) < 1e-3 * exact, $"{current} vs {exact}");

        // MathNet.Numerics Brent root finder on the same KCL: (V − v)/R = Is·(exp(v/VT) − 1).
        double vd = Brent.FindRoot(v => ((supply - v) / resistance) - (Model.SaturationCurrent * (Math.Exp(v / nvt) - 1)), -1, Math.Min(supply, 1.2), 1e-14, 200);
        Assert.True(Math.Abs(op.Voltage("a") - vd) < 1e-3 * vd, $"{op.Voltage("a")} vs {vd}");
    }

    [Fact]
    public void Series_resistance_and_emission_coefficient_enter_the_junction_equation()
    {
        var model = new DiodeModel { SaturationCurrent = 2.5e-9, EmissionCoefficient = 1.75, SeriesResistance = 5, JunctionCapacitance = 0 };
        var circuit = new Circuit()
            .AddVoltageSource("v1", "in", Circuit.Ground, 10)
            .AddResistor("r1", "in", "a", 100)
            .AddDiode("d1", "a", Circuit.Ground, model);
        var op = Simulate.OperatingPoint(circuit);
        Assert.True(op.Succeeded, op.Failure?.ToString());
        double nvt = 1.75 * PhysicalConstants.ThermalVoltage(PhysicalConstants.DefaultTemperature);

        // MathNet.Numerics Brent on the textbook series-resistance diode: I = Is·(exp((V − I·(R + Rs))/(n·VT)) − 1) with V = 10 V.
        double current = Brent.FindRoot(i => (model.SaturationCurrent * (Math.Exp((10 - (i * 105)) / nvt) - 1)) - i, 1e-12, 10.0 / 105, 1e-16, 500);
        Assert.True(Math.Abs(-op.Current("v1") - current) < 1e-3 * current, $"{-op.Current("v1")} vs {current}");
    }

    [Fact]
    public void Reverse_breakdown_conducts_the_breakdown_current_at_the_breakdown_voltage()
    {
        var model = new DiodeModel { SaturationCurrent = 1e-14, EmissionCoefficient = 1, SeriesResistance = 0, JunctionCapacitance = 0, BreakdownVoltage = 5.1, BreakdownCurrent = 1e-3 };
        var circuit = new Circuit()
            .AddVoltageSource("v1", "in", Circuit.Ground, 12)
            .AddResistor("r1", "in", "k", 1e3)
            .AddDiode("z1", Circuit.Ground, "k", model);
        var op = Simulate.OperatingPoint(circuit);
        Assert.True(op.Succeeded, op.Failure?.ToString());

        // model equation: reverse current 1 mA at 5.1 V, rising e-fold per VT; the node must sit a little above 5.1 V.
        double v = op.Voltage("k");
        Assert.InRange(v, 5.1, 5.1 + (10 * PhysicalConstants.ThermalVoltage(298.15)));
    }

    /// <summary>Principal branch of the Lambert W function by Halley iteration (starting from ln x for large x).</summary>
    private static double LambertW(double x)
    {
        double w = x < 1 ? x : Math.Log(x) - Math.Log(Math.Log(x) + 1);
        for (int i = 0; i < 100; i++)
        {
            double e = Math.Exp(w);
            double f = (w * e) - x;
            double next = w - (f / ((e * (w + 1)) - ((w + 2) * f / ((2 * w) + 2))));
            if (Math.Abs(next - w) < 1e-15 * Math.Max(1, Math.Abs(w))) return next;
            w = next;
        }

        return w;
    }
}
