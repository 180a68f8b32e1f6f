using System.Numerics;
using MathNet.Numerics.RootFinding;

namespace DesignRules.Simulation.Tests;

/// <summary>The loop gain of an amplifier and its margins, against closed forms and against Middlebrook's two-injection measurement.</summary>
public sealed class LoopGainTests
{
    private static readonly LoopGainRequest Sweep = LoopGainRequest.Decades(1, 1e9, 20);

    // A follower with a tiny output resistance into a large resistor: the loop is the amplifier's own response, T = A(s).
    private static Circuit Follower(AmplifierModel model, double loadCapacitance = 0)
    {
        var circuit = new Circuit()
            .AddVoltageSource("vin", "in", Circuit.Ground, 0)
            .AddAmplifier("u1", "in", "out", "out", model, Stages.Rails)
            .AddResistor("rl", "out", Circuit.Ground, 1e9);
        return loadCapacitance > 0 ? circuit.AddCapacitor("cl", "out", Circuit.Ground, loadCapacitance) : circuit;
    }

    // Crossover and phase margin of T(s) = A0 / ((1 + s/ωp)(1 + s/ω2)): |T| = 1 solves the quadratic in u = f²
    // (1 + u/fp²)(1 + u/f2²) = A0², and PM = 180° − atan(fc/fp) − atan(fc/f2) (Bode; Ogata, Modern Control Engineering,
    // 5th ed., §7-6, phase and gain margins).
    private static (double Fc, double Pm) TwoPoleClosedForm(double a0, double fp, double f2)
    {
        double a = 1 / (fp * fp * f2 * f2), b = (1 / (fp * fp)) + (1 / (f2 * f2)), c = 1 - (a0 * a0);
        double u = (-b + Math.Sqrt((b * b) - (4 * a * c))) / (2 * a);
        double fc = Math.Sqrt(u);
        return (fc, 180 - (Math.Atan(fc / fp) * 180 / Math.PI) - (Math.Atan(fc / f2) * 180 / Math.PI));
    }

    [Fact]
    public void A_two_pole_follower_has_the_crossover_and_phase_margin_of_the_closed_form()
    {
        var model = Stages.GeneralPurpose with { SecondPoleFrequency = 2e6, OutputResistance = 1e-3 };
        var result = Simulate.LoopGain(Follower(model), Sweep);
        Assert.True(result.Succeeded, result.Failure?.ToString());
        var margins = result.Loop("u1")!.Margins;
        var (fc, pm) = TwoPoleClosedForm(1e5, 1e6 / 1e5, 2e6);
        Assert.Equal(LoopState.Closed, margins.State);
        Assert.Equal(fc, margins.Crossover!.Value, fc * 1e-4);
        Assert.Equal(pm, margins.PhaseMargin!.Value, 0.01);
        Assert.Null(margins.GainMargin); // two poles never reach −180°
        Assert.Equal(1e5 / Math.Sqrt(1 + Math.Pow(1.0 / 10, 2)), margins.LowFrequencyGain, 1e5 * 1e-6); // |T| at the first point, 1 Hz
    }

    [Fact]
    public void A_capacitively_loaded_follower_loses_the_margin_the_output_resistance_pole_predicts()
    {
        // The output resistance Ro and the load CL add a pole at 1/(2π·Ro·CL) to the loop of a follower (Franco, Design
        // with Operational Amplifiers and Analog Integrated Circuits, 3rd ed., §8.4, stability with capacitive loads).
        const double ro = 50, cl = 10e-9;
        var model = Stages.GeneralPurpose with { OutputResistance = ro };
        var margins = Simulate.LoopGain(Follower(model, cl), Sweep).Loop("u1")!.Margins;
        var (fc, pm) = TwoPoleClosedForm(1e5, 1e6 / 1e5, 1 / (2 * Math.PI * ro * cl));
        Assert.Equal(fc, margins.Crossover!.Value, fc * 1e-4);
        Assert.Equal(pm, margins.PhaseMargin!.Value, 0.01);
        Assert.True(margins.PhaseMargin < 45);
    }

    [Fact]
    public void A_three_pole_loop_has_the_gain_margin_where_its_phase_reaches_minus_180_degrees()
    {
        // T = A0/((1 + s/ωp)(1 + s/ω2)(1 + s·Ro·CL)): the phase crossover solves Σ atan(f/fi) = 180°, found here with
        // MathNet's Brent root finder (reference library); GM = 1/|T| there.
        const double ro = 50, cl = 1e-9, f2 = 4e6;
        double f3 = 1 / (2 * Math.PI * ro * cl), fp = 10;
        var model = Stages.GeneralPurpose with { SecondPoleFrequency = f2, OutputResistance = ro };
        var margins = Simulate.LoopGain(Follower(model, cl), Sweep).Loop("u1")!.Margins;
        double Phase(double f) => (Math.Atan(f / fp) + Math.Atan(f / f2) + Math.Atan(f / f3)) * 180 / Math.PI;
        double f180 = Brent.FindRoot(f => Phase(f) - 180, 1e5, 1e9, 1e-3);
        double magnitude = 1e5 / Math.Sqrt((1 + Math.Pow(f180 / fp, 2)) * (1 + Math.Pow(f180 / f2, 2)) * (1 + Math.Pow(f180 / f3, 2)));
        Assert.Equal(f180, margins.PhaseCrossover!.Value, f180 * 1e-4);
        Assert.Equal(1 / magnitude, margins.GainMargin!.Value, (1 / magnitude) * 1e-3);
    }

    [Fact]
    public void A_loop_whose_two_poles_lie_below_the_sweep_is_judged_by_its_crossover_not_called_regenerative()
    {
        // A0 = 1e7 with GBW 1 MHz puts the amplifier's pole at 0.1 Hz; Ro·CL = 1 kΩ · 318 µF another at 0.5 Hz (a diode's
        // small-signal resistance into a hold capacitor does the same). At the sweep's first point, 1 Hz, T has turned by
        // about 148°: negative in its real part, yet the loop is a negative-feedback one whose crossover and (small) phase
        // margin follow the two-pole closed form (Ogata, §7-6).
        const double ro = 1e3, cl = 318e-6;
        var model = AmplifierModel.SinglePole(1e6, 1e7, 8e6) with { OutputResistance = ro };
        var margins = Simulate.LoopGain(Follower(model, cl), Sweep).Loop("u1")!.Margins;
        var (fc, pm) = TwoPoleClosedForm(1e7, 1e6 / 1e7, 1 / (2 * Math.PI * ro * cl));
        Assert.Equal(LoopState.Closed, margins.State);
        Assert.Equal(fc, margins.Crossover!.Value, fc * 1e-4);
        Assert.Equal(pm, margins.PhaseMargin!.Value, 0.01);
        Assert.InRange(margins.StartPhase, -150, -145); // −atan(1/0.1) − atan(1/0.5) = −147.7° at 1 Hz, continued from 0° at DC
    }

    [Fact]
    public void A_comparator_with_hysteresis_held_at_its_threshold_regenerates()
    {
        // Positive feedback: the output returns to the non-inverting input through the divider r2/(r1 + r2) = 1/11, so at
        // DC T = −A0/11 (negative real, |T| ≫ 1): the loop latches and has no phase margin to read (the Schmitt
        // trigger: Franco, Design with Operational Amplifiers and Analog Integrated Circuits, 3rd ed., ch. 9). Held at its threshold, the DC solution is the balanced one, with the output at 0 V.
        var circuit = new Circuit()
            .AddVoltageSource("vin", "in", Circuit.Ground, 0)
            .AddResistor("r1", "in", "p", 10e3)
            .AddResistor("r2", "p", "out", 100e3)
            .AddAmplifier("u1", "p", Circuit.Ground, "out", Stages.GeneralPurpose, Stages.Rails)
            .AddResistor("rl", "out", Circuit.Ground, 10e3);
        var margins = Simulate.LoopGain(circuit, Sweep).Loop("u1")!.Margins;
        Assert.Equal(LoopState.Regenerative, margins.State);
        Assert.Null(margins.PhaseMargin);
        Assert.Equal(1e5 / 11, margins.LowFrequencyGain, 1e5 / 11 * 0.02); // |T| at 1 Hz, a tenth of the 10 Hz pole away from DC
    }

    [Fact]
    public void The_return_ratio_equals_Middlebrooks_two_injection_loop_gain_at_the_output_pin()
    {
        // Middlebrook, "Measurement of loop gain in feedback systems", Int. J. Electronics 38 (1975): with a voltage
        // injection Tv = −v(a)/v(b) and a current injection Ti = −i(a)/i(b) at the same point, T = (Tv·Ti − 1)/(Tv + Ti + 2),
        // whatever the impedances on either side of the point. The network: a gain-of-2 stage with a feedback capacitor
        // driving an RC load, so both sides of the break are far from ideal.
        var model = Stages.GeneralPurpose with { SecondPoleFrequency = 3e6, OutputResistance = 80 };
        Circuit Network(Circuit c) => c
            .AddVoltageSource("vin", "in", Circuit.Ground, 0)
            .AddAmplifier("u1", "in", "fb", "a", model, Stages.Rails)
            .AddResistor("rf", "b", "fb", 10e3)
            .AddCapacitor("cf", "b", "fb", 10e-12)
            .AddResistor("rg", "fb", Circuit.Ground, 10e3)
            .AddResistor("rs", "b", "load", 20)
            .AddCapacitor("cl", "load", Circuit.Ground, 4.7e-9)
            .AddResistor("rl", "load", Circuit.Ground, 2e3);
        var frequencies = new[] { 1e3, 1e5, 3e5, 1e6, 3e6 };
        var voltage = Simulate.AcSweep(Network(new Circuit().AddVoltageSource("vz", "b", "a", 0)), new AcSweep("vz", frequencies));
        var current = Simulate.AcSweep(
            Network(new Circuit().AddVoltageSource("vz", "b", "a", 0).AddCurrentSource("iz", Circuit.Ground, "b", 0)), new AcSweep("iz", frequencies));
        var direct = Simulate.LoopGain(Network(new Circuit().AddVoltageSource("vz", "b", "a", 0)), new LoopGainRequest(frequencies)).Loop("u1")!;
        for (int i = 0; i < frequencies.Length; i++)
        {
            Complex tv = -voltage.Voltage("a")[i] / voltage.Voltage("b")[i];
            Complex ia = current.Current("u1")[i], ib = ia + 1; // KCL at b: the network takes the amplifier's current plus the injected one
            Complex ti = -ia / ib;
            Complex t = ((tv * ti) - 1) / (tv + ti + 2);
            Assert.Equal(t.Real, direct.Gain[i].Real, Math.Abs(t.Magnitude) * 1e-6);
            Assert.Equal(t.Imaginary, direct.Gain[i].Imaginary, Math.Abs(t.Magnitude) * 1e-6);
        }
    }

    [Fact]
    public void An_amplifier_with_its_loop_opened_by_a_reverse_biased_diode_is_reported_open_not_judged()
    {
        var circuit = new Circuit()
            .AddVoltageSource("vin", "in", Circuit.Ground, -1)
            .AddAmplifier("u1", "in", "out", "a", Stages.GeneralPurpose, Stages.Rails)
            .AddDiode("d1", "a", "out")
            .AddResistor("rl", "out", Circuit.Ground, 10e3);
        var closed = Simulate.LoopGain(circuit, Sweep with { BiasSource = "vin", BiasValue = 1 }).Loop("u1")!.Margins;
        var open = Simulate.LoopGain(circuit, Sweep).Loop("u1")!.Margins;
        Assert.Equal(LoopState.Open, open.State);
        Assert.Null(open.PhaseMargin);
        Assert.Equal(LoopState.Closed, closed.State);
        Assert.InRange(closed.PhaseMargin!.Value, 80, 91); // a single-pole follower through a conducting diode
    }

    [Fact]
    public void An_unknown_amplifier_or_an_unordered_sweep_is_a_failure_not_an_exception()
    {
        var circuit = Follower(Stages.GeneralPurpose);
        Assert.Equal(FailureKind.UnusableRequest, Simulate.LoopGain(circuit, Sweep with { Amplifiers = ["u9"] }).Failure!.Kind);
        Assert.Equal(FailureKind.UnusableRequest, Simulate.LoopGain(circuit, new LoopGainRequest([10, 1])).Failure!.Kind);
    }
}
