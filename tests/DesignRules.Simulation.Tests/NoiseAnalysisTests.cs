namespace DesignRules.Simulation.Tests;

public sealed class NoiseAnalysisTests
{
    private const double K = 1.380649e-23; // Boltzmann constant, exact (SI 2019 definition)
    private const double Q = 1.602176634e-19; // elementary charge, exact (SI 2019 definition)

    [Fact]
    public void A_1_kilohm_resistor_at_300_K_has_the_Johnson_Nyquist_density_of_about_4_07_nV_per_root_hertz()
    {
        // A zero-valued current source is the "input" that the analysis refers the noise to.
        var circuit = new Circuit { Temperature = 300 }
            .AddCurrentSource("iin", Circuit.Ground, "out", 0)
            .AddResistor("r1", "out", Circuit.Ground, 1e3);
        var noise = Simulate.Noise(circuit, new NoiseRequest("out", "iin", 10, 1e3));
        Assert.True(noise.Succeeded, noise.Failure?.ToString());

        // Johnson–Nyquist (Johnson 1928, Nyquist 1928): e = √(4kTR) = √(4 · 1.380649e-23 · 300 · 1000) = 4.0703 nV/√Hz.
        double expected = Math.Sqrt(4 * K * 300 * 1e3);
        Assert.Equal(4.07e-9, expected, 0.005e-9);
        Assert.All(noise.OutputDensity, d => Assert.Equal(expected, d, expected * 1e-9));

        // White noise over a band: e·√(fH − fL).
        Assert.Equal(expected * Math.Sqrt(990), noise.OutputRms, expected * Math.Sqrt(990) * 1e-4);
        var only = Assert.Single(noise.Contributors);
        Assert.Equal(("r1", NoiseKind.Thermal, 1.0), (only.Element, only.Kind, only.Share));
    }

    [Fact]
    public void A_resistor_with_a_capacitor_across_it_integrates_to_kT_over_C_whatever_the_resistance()
    {
        foreach (double r in new[] { 1e3, 100e3 })
        {
            const double c = 1e-9;
            double corner = 1 / (2 * Math.PI * r * c);
            var circuit = new Circuit { Temperature = 300 }
                .AddCurrentSource("iin", Circuit.Ground, "out", 0)
                .AddResistor("r1", "out", Circuit.Ground, r)
                .AddCapacitor("c1", "out", Circuit.Ground, c);
            double bottom = corner * 1e-5, top = corner * 1e5;
            var noise = Simulate.Noise(circuit, new NoiseRequest("out", "iin", bottom, top));
            Assert.True(noise.Succeeded, noise.Failure?.ToString());
            Assert.True(noise.Converged, $"relative change {noise.RelativeChange}");

            // kT/C noise (textbook: ∫4kTR/(1 + (f/fc)²) df over 0..∞ = kT/C, independent of R); over the finite band the
            // closed form is 4kTR·fc·(atan(top/fc) − atan(bottom/fc)), 1 − 1.3e-5 of kT/C here.
            double bandPower = 4 * K * 300 * r * corner * (Math.Atan(top / corner) - Math.Atan(bottom / corner));
            Assert.Equal(K * 300 / c, bandPower, K * 300 / c * 2e-5);
            Assert.Equal(Math.Sqrt(bandPower), noise.OutputRms, Math.Sqrt(bandPower) * 1e-3);
        }
    }

    [Fact]
    public void Flicker_plus_white_voltage_noise_integrates_to_the_closed_form()
    {
        // A follower passes the amplifier's e_n to the output with gain 1 (A0 = 1e7, GBW = 1 GHz: flat to 1e-6 in the band).
        var model = AmplifierModel.SinglePole(1e9, 1e7, 1e9) with { InputVoltageNoise = 10e-9, NoiseCorner = 100 };
        var circuit = new Circuit()
            .AddVoltageSource("vin", "in", Circuit.Ground, 0)
            .AddAmplifier("u1", "in", "out", "out", model, Stages.Rails);
        var noise = Simulate.Noise(circuit, new NoiseRequest("out", "vin", 1, 10e3));
        Assert.True(noise.Succeeded, noise.Failure?.ToString());
        Assert.True(noise.Converged);

        // ∫ e_n²(1 + fc/f) df from fL to fH = e_n²·(fc·ln(fH/fL) + (fH − fL)) (closed form of the 1/f-plus-white model).
        double power = 10e-9 * 10e-9 * ((100 * Math.Log(10e3 / 1)) + (10e3 - 1));
        Assert.Equal(Math.Sqrt(power), noise.OutputRms, Math.Sqrt(power) * 1e-3);

        // e_n(f) = e_n·√(1 + fc/f): at 1 Hz √101 times the white density.
        Assert.Equal(10e-9 * Math.Sqrt(101), noise.OutputDensity[0], 10e-9 * Math.Sqrt(101) * 1e-4);
    }

    [Fact]
    public void Non_inverting_stage_noise_matches_the_standard_op_amp_noise_model()
    {
        const double rs = 1e3, rf = 9e3, rg = 1e3, en = 10e-9, inoise = 1e-12, t = 300;
        var circuit = NonInvertingWithSource(rs, rf, rg, en, inoise, t);
        var noise = Simulate.Noise(circuit, new NoiseRequest("out", "vin", 100, 1e3));
        Assert.True(noise.Succeeded, noise.Failure?.ToString());

        // Standard op-amp noise model (textbook, e.g. any analog-design text; noise gain G = 1 + Rf/Rg):
        // e_out² = G²·(e_n² + (i_n·Rs)² + 4kT·Rs) + (i_n·Rf)² + 4kT·Rf + 4kT·Rg·(Rf/Rg)².
        double g = 1 + (rf / rg);
        double fourKT = 4 * K * t;
        double output = Math.Sqrt((g * g * ((en * en) + Math.Pow(inoise * rs, 2) + (fourKT * rs))) + Math.Pow(inoise * rf, 2) + (fourKT * rf) + (fourKT * rg * Math.Pow(rf / rg, 2)));
        Assert.All(noise.OutputDensity, d => Assert.Equal(output, d, output * 1e-4));

        // Referred to the input: divided by the signal gain G; e_in = √(e_n² + (i_n·Rs)² + 4kT·Rs + feedback-network terms / G²).
        Assert.Equal(g, noise.PassbandGain, g * 1e-4);
        Assert.Equal(output * Math.Sqrt(900) / g, noise.InputReferredRms, output * Math.Sqrt(900) / g * 1e-4);

        // The largest contributor is the amplifier's e_n (G·e_n = 100 nV/√Hz against G·√(4kT·1 kΩ) = 40.7 nV/√Hz).
        Assert.Equal(("u1", NoiseKind.AmplifierVoltage), (noise.Contributors[0].Element, noise.Contributors[0].Kind));
        Assert.Equal(1.0, noise.Contributors.Sum(c => c.Share), 1e-12);
    }

    [Fact]
    public void Inverting_stage_noise_is_noise_gain_times_the_input_noise_with_resistor_terms_in_quadrature()
    {
        const double rin = 1e3, rf = 10e3, en = 10e-9, inoise = 2e-12, t = 300;
        var model = AmplifierModel.SinglePole(1e9, 1e7, 1e9) with { InputVoltageNoise = en, InputCurrentNoise = inoise };
        var circuit = new Circuit { Temperature = t }
            .AddVoltageSource("vin", "in", Circuit.Ground, 0)
            .AddResistor("rin", "in", "sum", rin)
            .AddResistor("rf", "sum", "out", rf)
            .AddAmplifier("u1", Circuit.Ground, "sum", "out", model, Stages.Rails);
        var noise = Simulate.Noise(circuit, new NoiseRequest("out", "vin", 100, 1e3));
        Assert.True(noise.Succeeded, noise.Failure?.ToString());

        // Worked by hand with the op-amp noise model of the textbooks (S. Franco, Design with Operational Amplifiers and
        // Analog Integrated Circuits, chapter "Noise": e_n times the noise gain 1 + Rf/Rin, each resistor's 4kTR through
        // its own gain, i_n·Rf, added in quadrature), 4kT at 300 K = 1.6568e-20 J with the SI 2019 Boltzmann constant:
        //   e_n · 11              = 110.00 nV/√Hz
        //   √(4kT·1 kΩ) · Rf/Rin   =  40.70 nV/√Hz
        //   √(4kT·10 kΩ)           =  12.87 nV/√Hz
        //   i_n · Rf              =  20.00 nV/√Hz
        //   total √(Σ²)           = 119.68 nV/√Hz; over 100 Hz..1 kHz × √900 = 3.590 µV RMS; referred to the input
        //   (signal gain 10) 0.3590 µV RMS.
        Assert.All(noise.OutputDensity, d => Assert.Equal(119.68e-9, d, 0.01e-9));
        Assert.Equal(3.590e-6, noise.OutputRms, 0.001e-6);
        Assert.Equal(10, noise.PassbandGain, 10 * 1e-4);
        Assert.Equal(0.3590e-6, noise.InputReferredRms, 0.0001e-6);
        Assert.Equal(("u1", NoiseKind.AmplifierVoltage), (noise.Contributors[0].Element, noise.Contributors[0].Kind));
    }

    [Fact]
    public void A_circuit_compiled_once_for_noise_serves_every_output_from_one_operating_point_per_input_level()
    {
        var circuit = NonInvertingWithSource(1e3, 9e3, 1e3, 10e-9, 1e-12, 300);
        var compiled = NoiseCircuit.Compile(circuit);
        var atOut = compiled.Analyse(new NoiseRequest("out", "vin", 100, 1e3));
        var atFeedback = compiled.Analyse(new NoiseRequest("fb", "vin", 100, 1e3));
        Assert.Equal(1, compiled.OperatingPointsSolved);

        // The same figures as a circuit compiled afresh for each request.
        foreach (var (reused, node) in new[] { (atOut, "out"), (atFeedback, "fb") })
        {
            var fresh = Simulate.Noise(circuit, new NoiseRequest(node, "vin", 100, 1e3));
            Assert.Equal(fresh.OutputDensity, reused.OutputDensity);
            Assert.Equal(fresh.OutputRms, reused.OutputRms);
        }

        // Another input level is another operating point; asking again at it solves nothing more.
        compiled.Analyse(new NoiseRequest("out", "vin", 100, 1e3) { InputLevel = 0.1 });
        compiled.Analyse(new NoiseRequest("fb", "vin", 100, 1e3) { InputLevel = 0.1 });
        Assert.Equal(2, compiled.OperatingPointsSolved);
    }

    [Fact]
    public void A_forward_biased_diode_adds_the_shot_noise_2qI_through_its_small_signal_resistance()
    {
        var model = DiodeModel.SmallSignal with { SeriesResistance = 0, JunctionCapacitance = 0 };
        var circuit = new Circuit { Temperature = 300 }
            .AddCurrentSource("ibias", Circuit.Ground, "a", 1e-3)
            .AddDiode("d1", "a", Circuit.Ground, model);
        var noise = Simulate.Noise(circuit, new NoiseRequest("a", "ibias", 10, 1e3));
        Assert.True(noise.Succeeded, noise.Failure?.ToString());

        // Schottky's shot noise i² = 2qI per hertz (Schottky 1918), through the Shockley small-signal resistance
        // r_d = n·kT/(q·I): e = √(2qI)·n·kT/(q·I).
        double rd = 1.75 * K * 300 / (Q * 1e-3);
        double expected = Math.Sqrt(2 * Q * 1e-3) * rd;
        Assert.Equal(expected, noise.OutputDensity[0], expected * 1e-4);
        Assert.Equal(NoiseKind.Shot, Assert.Single(noise.Contributors).Kind);
    }

    [Fact]
    public void Adjoint_and_per_source_transfers_give_the_same_densities()
    {
        var circuit = NonInvertingWithSource(4.7e3, 22e3, 2.2e3, 8e-9, 0.5e-12, 310).AddCapacitor("cf", "out", "fb", 1e-9);
        var request = new NoiseRequest("out", "vin", 10, 100e3);
        var adjoint = Simulate.Noise(circuit, request);
        var direct = Simulate.Noise(circuit, request with { Method = NoiseTransferMethod.PerSource });
        Assert.True(adjoint.Succeeded && direct.Succeeded);
        Assert.Equal(direct.Frequencies, adjoint.Frequencies);
        for (int i = 0; i < adjoint.OutputDensity.Count; i++) Assert.Equal(direct.OutputDensity[i], adjoint.OutputDensity[i], direct.OutputDensity[i] * 1e-9);
        Assert.Equal(direct.OutputRms, adjoint.OutputRms, direct.OutputRms * 1e-9);
    }

    [Fact]
    public void A_grid_that_cannot_reach_the_tolerance_says_it_did_not_converge()
    {
        var circuit = new Circuit()
            .AddCurrentSource("iin", Circuit.Ground, "out", 0)
            .AddResistor("r1", "out", Circuit.Ground, 1e3)
            .AddCapacitor("c1", "out", Circuit.Ground, 1e-9);
        var noise = Simulate.Noise(circuit, new NoiseRequest("out", "iin", 1, 1e9) { Tolerance = 1e-12, MaxRefinements = 1 });
        Assert.True(noise.Succeeded);
        Assert.False(noise.Converged);
        Assert.True(noise.RelativeChange > 1e-12);
    }

    [Fact]
    public void A_precision_rectifier_is_linearised_at_the_level_it_passes()
    {
        // Half-wave follower: the diode inside the loop conducts for a positive input, so the stage is a follower there
        // (textbook precision rectifier: output = input while the diode conducts), and blocks a negative one.
        var model = AmplifierModel.SinglePole(1e6, 1e5, 1e6) with { InputVoltageNoise = 20e-9 };
        var circuit = new Circuit()
            .AddVoltageSource("vin", "in", Circuit.Ground, 0)
            .AddAmplifier("u1", "in", "out", "drive", model, Stages.Rails)
            .AddDiode("d1", "drive", "out")
            .AddResistor("rload", "out", Circuit.Ground, 10e3);
        var passing = Simulate.Noise(circuit, new NoiseRequest("out", "vin", 10, 1e3) { InputLevel = 1 });
        var blocking = Simulate.Noise(circuit, new NoiseRequest("out", "vin", 10, 1e3) { InputLevel = -1 });
        Assert.True(passing.Succeeded && blocking.Succeeded, passing.Failure?.ToString() ?? blocking.Failure?.ToString());
        Assert.Equal(1, passing.PassbandGain, 1e-3);
        Assert.True(blocking.PassbandGain < 0.01, $"gain while blocking {blocking.PassbandGain}");

        // The follower passes e_n with gain 1; the load's 4kT·R is shorted by the loop's low output impedance.
        Assert.Equal(20e-9, passing.OutputDensity[0], 20e-9 * 1e-2);
    }

    [Theory]
    [InlineData("nowhere", "iin", 10, 1e3)]
    [InlineData("out", "r1", 10, 1e3)]
    [InlineData("out", "iin", 1e3, 10)]
    [InlineData("out", "iin", 0, 10)]
    public void An_unusable_request_is_a_failure_not_an_exception(string output, string input, double start, double stop)
    {
        var circuit = new Circuit()
            .AddCurrentSource("iin", Circuit.Ground, "out", 0)
            .AddResistor("r1", "out", Circuit.Ground, 1e3);
        var noise = Simulate.Noise(circuit, new NoiseRequest(output, input, start, stop));
        Assert.False(noise.Succeeded);
        Assert.Equal(FailureKind.UnusableRequest, noise.Failure!.Kind);
    }

    private static Circuit NonInvertingWithSource(double rs, double rf, double rg, double en, double inoise, double temperature)
    {
        var model = AmplifierModel.SinglePole(1e9, 1e7, 1e9) with { InputVoltageNoise = en, InputCurrentNoise = inoise };
        return new Circuit { Temperature = temperature }
            .AddVoltageSource("vin", "src", Circuit.Ground, 0)
            .AddResistor("rs", "src", "in", rs)
            .AddAmplifier("u1", "in", "fb", "out", model, Stages.Rails)
            .AddResistor("rf", "out", "fb", rf)
            .AddResistor("rg", "fb", Circuit.Ground, rg);
    }
}
