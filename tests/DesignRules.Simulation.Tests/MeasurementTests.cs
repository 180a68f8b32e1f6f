namespace DesignRules.Simulation.Tests;

public sealed class MeasurementTests
{
    private const double F = 1e3;

    private static (double[] Time, double[] Values) Sample(Func<double, double> f, int periods = 4, int perPeriod = 2000)
    {
        var time = Enumerable.Range(0, (periods * perPeriod) + 1).Select(i => (double)i / (perPeriod * F)).ToArray();
        return (time, time.Select(f).ToArray());
    }

    [Fact]
    public void Average_and_RMS_over_whole_periods_match_the_sine_formulas()
    {
        var (t, v) = Sample(x => 0.5 + (2 * Math.Sin(2 * Math.PI * F * x)));
        var stats = PeriodStatistics.Measure(t, v, 1 / F);

        // textbook: mean of B + A·sin = B; RMS = √(B² + A²/2).
        Assert.Equal(4, stats.Periods);
        Assert.Equal(0.5, stats.Average, 1e-6);
        Assert.Equal(Math.Sqrt(0.25 + 2), stats.Rms, 1e-5);
    }

    [Fact]
    public void Extremes_report_value_and_time()
    {
        var (t, v) = Sample(x => Math.Sin(2 * Math.PI * F * x));
        var extremes = SignalExtremes.Of(t, v, from: 1 / F);
        Assert.Equal(1, extremes.Maximum, 1e-6);
        Assert.Equal(1.25e-3, extremes.TimeOfMaximum, 1e-6);
        Assert.Equal(-1, extremes.Minimum, 1e-6);
    }

    [Fact]
    public void THD_of_a_fundamental_with_a_tenth_third_harmonic_is_ten_percent()
    {
        var waveform = new SumWaveform([new SineWaveform(1, F), new SineWaveform(0.1, 3 * F)]);
        var (t, v) = Sample(waveform.ValueAt);
        var distortion = Distortion.Measure(t, v, F);

        // definition: THD = √(ΣA_k²)/A_1 = 0.1/1.
        Assert.Equal(0.1, distortion.TotalHarmonicDistortion, 1e-4);
        Assert.Equal(1, distortion.FundamentalAmplitude, 1e-4);
        Assert.Equal(0.1, distortion.HarmonicAmplitudes[2], 1e-4);
    }

    [Fact]
    public void THD_of_a_triangle_is_twelve_percent()
    {
        var (t, v) = Sample(new TriangleWaveform(1, F).ValueAt);

        // textbook Fourier series of a triangle: harmonics 1/k² (odd k) → THD = √(π⁴/96 − 1) ≈ 12.1 %.
        double expected = Math.Sqrt((Math.Pow(Math.PI, 4) / 96) - 1);
        Assert.Equal(expected, Distortion.Measure(t, v, F, harmonics: 200, samplesPerPeriod: 1024).TotalHarmonicDistortion, 2e-3);
    }

    [Fact]
    public void Zero_crossing_glitch_width_is_the_time_the_output_is_out_of_band()
    {
        // An absolute-value output that sticks at 0.2 V while |vin| < 0.1 V.
        var (t, vin) = Sample(x => Math.Sin(2 * Math.PI * F * x), perPeriod: 20000);
        var vout = vin.Select(v => Math.Abs(v) < 0.1 ? 0.2 : Math.Abs(v)).ToArray();
        var error = TransferError.Measure(t, vin, vout, Math.Abs, tolerance: 0.05, from: 0.1 / F);

        // geometry of a sine: |sin θ| < 0.1 for 2·asin(0.1) rad around each zero crossing.
        double width = 2 * Math.Asin(0.1) / (2 * Math.PI * F);
        Assert.Equal(width, error.WorstGlitchWidth, width * 0.01);
        Assert.Equal(7, error.Glitches);
        Assert.Equal(0.2, error.PeakError, 1e-3);

        // ∫(0.2 − |sin|) dt over the glitch = 0.2·w − 2(1 − cos(asin 0.1))/ω.
        double area = (0.2 * width) - (2 * (1 - Math.Cos(Math.Asin(0.1))) / (2 * Math.PI * F));
        Assert.Equal(area, error.GlitchErrorArea, area * 0.02);
    }

    [Fact]
    public void Half_cycle_mismatch_compares_positive_and_negative_peaks()
    {
        var (t, vin) = Sample(x => Math.Sin(2 * Math.PI * F * x));
        var vout = vin.Select(v => v > 0 ? v : -0.98 * v).ToArray();
        var symmetry = HalfCycleSymmetry.Measure(t, vin, vout);
        Assert.Equal(0.02, symmetry.Mismatch, 1e-4);
        Assert.Equal(6, symmetry.HalfCycles);
    }

    [Fact]
    public void Input_impedance_of_an_inverting_stage_is_its_input_resistor()
    {
        var circuit = Stages.Inverting(new DcWaveform(0), Stages.GeneralPurpose, 100e3, 10e3);
        var ac = Simulate.AcSweep(circuit, AcSweep.List("vin", 100, 1e3));

        // textbook: the summing node is a virtual ground, so Zin = Rin = 10 kΩ (plus Rf/(1 + A) ≈ 1 Ω).
        Assert.Equal(10e3, FrequencyResponse.ImpedanceAtSource(ac, "in", "vin", 100).Magnitude, 10e3 * 1e-3);
    }

    [Fact]
    public void Output_impedance_of_a_follower_is_Rout_divided_by_the_loop_gain()
    {
        var circuit = new Circuit()
            .AddAmplifier("u1", Circuit.Ground, "out", "out", Stages.GeneralPurpose, Stages.Rails)
            .AddCurrentSource("itest", Circuit.Ground, "out", new DcWaveform(0));
        var ac = Simulate.AcSweep(circuit, AcSweep.List("itest", 1e3, 1e4) with { Amplitude = 1e-3 });

        // textbook: closed-loop Zout = Rout/(1 + A·β); at 1 kHz |A| ≈ GBW/f = 1000, so |Zout| ≈ 50 Ω/1000 = 0.05 Ω.
        // Z = V(out)/I with the 1 mA test current injected into the node and every other source quiet.
        int at1k = ac.Frequencies.ToList().IndexOf(1e3);
        Assert.Equal(0.05, (ac.Voltage("out")[at1k] / 1e-3).Magnitude, 0.05 * 0.01);
    }
}
