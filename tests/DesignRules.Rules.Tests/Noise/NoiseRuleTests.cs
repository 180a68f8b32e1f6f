using DesignRules.Diagnostics;
using DesignRules.Loading;
using DesignRules.Model;
using DesignRules.Rules.Catalogue.Noise;
using DesignRules.Rules.Evaluation;

namespace DesignRules.Rules.Tests.Noise;

/// <summary>DR420-DR422: signal-to-noise ratio, noise level, and a rectifier's smallest signal against its dead zone and noise floor.</summary>
public sealed class NoiseRuleTests
{
    private const double K = 1.380649e-23; // Boltzmann constant, exact (SI 2019 definition)
    private const double T = 298.15;       // 25 °C, the temperature the analyses run at

    [Fact]
    public void A_signal_to_noise_ratio_above_its_requirement_passes() => RuleFixture.Verify("noise/inverting-snr-met.yaml");

    [Fact]
    public void A_signal_to_noise_ratio_below_its_requirement_points_at_the_largest_contributor() =>
        Assert.Contains("voltage noise of `amp.u1`", RuleFixture.Verify("noise/inverting-snr-short.yaml").Findings.Single(f => f.RuleId == RuleIds.SignalToNoise).Message, StringComparison.Ordinal);

    [Fact]
    public void Output_noise_within_its_requirement_passes() => RuleFixture.Verify("noise/inverting-noise-within.yaml");

    [Fact]
    public void Input_referred_noise_over_its_requirement_is_reported() => RuleFixture.Verify("noise/inverting-noise-over-at-input.yaml");

    [Fact]
    public void A_rectifier_whose_smallest_signal_sits_in_its_noise_floor_fails() => RuleFixture.Verify("noise/rectifier-min-signal-below-noise-floor.yaml");

    [Fact]
    public void The_same_rectifier_with_smaller_resistors_clears_its_noise_floor() => RuleFixture.Verify("noise/rectifier-min-signal-above-noise-floor.yaml");

    [Fact]
    public void A_rectifier_clear_at_25_C_fails_its_smallest_signal_at_the_cold_end_where_its_dead_zone_is_widest()
    {
        var report = RuleFixture.Verify("noise/rectifier-min-signal-cold-end.yaml");
        var finding = Assert.Single(report.Findings, f => f.RuleId == Diagnostics.RuleIds.SmallestSignal.Value);
        Assert.Contains("at -40 °C", finding.Message, StringComparison.Ordinal);
        var deadZone = report.Designs.Single().StageFigures.Single(s => s.Key == "rect").Value.Single(f => f.Key == FigureKinds.RectifierDeadZone.Key);

        // By hand at -40 °C: the diode drop at 1 mA by Shockley's law, n·Vt·ln(1 + I/Is) + I·Rs with the built-in
        // small-signal class (n 1.9, Is 4 nA, Rs 0.8 Ω) at 25 °C, moved by its -2 mV/°C over -65 °C; the open-loop gain of
        // a single-pole amplifier at the band top, A0/√(1 + (f·A0/GBW)²) with A0 126 dB, GBW 0.8 MHz, f 200 Hz; the offset
        // 120 µV plus its 0.6 µV/°C drift over 65 °C (drift × ΔT). Referred to the stage input through the fraction of
        // the input that reaches the amplifier with both diodes off: rin against rf in series with the 100 kΩ load
        // (Kirchhoff's voltage divider), (rf + RL)/(rin + rf + RL) = 110k/120k.
        double vt = K * T / 1.602176634e-19; // thermal voltage kT/q, SI 2019 exact constants
        double vf = (1.9 * vt * Math.Log(1 + (1e-3 / 4e-9))) + (1e-3 * 0.8) + (-2e-3 * -65);
        double a0 = Math.Pow(10, 126.0 / 20);
        double openLoop = a0 / Math.Sqrt(1 + Math.Pow(200 * a0 / 0.8e6, 2));
        double expected = (120e-6 + (0.6e-6 * 65) + (vf / openLoop)) / (110e3 / 120e3);
        Assert.Equal(expected, deadZone.Value, expected * 0.01);
        Assert.Equal(-40, deadZone.Temperature);
    }

    [Fact]
    public void The_inverting_stage_noise_figure_matches_the_textbook_noise_model()
    {
        var report = RuleFixture.Verify("noise/inverting-snr-met.yaml");
        var figures = Assert.Single(report.Designs).StageFigures.Single(s => s.Key == "amp").Value;

        // Textbook inverting-stage noise (standard op-amp noise model): e_n times the noise gain 1 + rf/rin = 11, with its
        // 1/f part integrated in closed form e_n²·(fc·ln(fH/fL) + fH − fL); rin's 4kT·rin times the signal gain² 100; rf's
        // 4kT·rf and i_n·rf directly; all in quadrature. Built-in jfet-input-15v class: e_n 20 nV/√Hz, fc 100 Hz, i_n 4 fA/√Hz.
        const double en = 20e-9, fc = 100, inoise = 4e-15, rin = 10e3, rf = 100e3, fl = 20, fh = 20e3;
        double power = (121 * en * en * ((fc * Math.Log(fh / fl)) + (fh - fl)))
            + ((4 * K * T * rin * 100) + (4 * K * T * rf) + (inoise * inoise * rf * rf)) * (fh - fl);
        double expected = Math.Sqrt(power);
        var output = figures.Single(f => f.Key == FigureKinds.OutputNoise.Key);
        // 1 %: the amplifier's closed-loop roll-off (GBW 4 MHz / 11 = 364 kHz) and the 10 kΩ load are not in the textbook sum.
        Assert.Equal(expected, output.Value, expected * 0.01);
        Assert.Equal(expected / 10, figures.Single(f => f.Key == FigureKinds.InputReferredNoise.Key).Value, expected / 10 * 0.01);

        // SNR = 20·log10((10 mV · 10 / √2) / noise).
        double snr = 20 * Math.Log10(10e-3 * 10 / Math.Sqrt(2) / expected);
        Assert.Equal(snr, figures.Single(f => f.Key == FigureKinds.SignalToNoise.Key).Value, 0.1);
    }

    [Fact]
    public void The_noise_of_every_stage_is_analysed_once_on_one_compiled_chain_and_shared_by_the_noise_rules()
    {
        var file = Path.Combine(RuleFixture.RepositoryRoot(), "example-design", "designs", "compressor-vibration-envelope.yaml");
        var design = Assert.Single(DesignLoader.LoadFiles([file]).Designs);
        var evaluation = new DesignEvaluation(design, RuleSet.Default);
        foreach (var rule in new Rule[] { new SignalToNoiseRule(), new NoiseLevelRule(), new SmallestSignalRule() })
        {
            rule.Evaluate(evaluation);
        }

        var noise = evaluation.Analyses.Noise;
        Assert.Same(noise, evaluation.Analyses.Noise);
        Assert.Equal(["preamp", "rectifier"], noise.Select(n => n.Stage.StageId));

        // One compilation for both stages; two operating points: the preamp's quiescent one and the rectifier's at the
        // level it passes.
        Assert.Same(noise[0].Circuit, noise[1].Circuit);
        Assert.Equal(2, noise[0].Circuit.OperatingPointsSolved);
    }
}
