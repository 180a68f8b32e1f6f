using DesignRules.Diagnostics;
using DesignRules.Elaboration;
using DesignRules.Rules.Evaluation;

namespace DesignRules.Rules.Catalogue.Noise;

/// <summary>How the noise rules (DR420-DR422) word a stage's noise: its band, its largest contributor, what would lower it, where to point.</summary>
internal static class NoiseFindings
{
    /// <summary>The band as people read it: "10 Hz to 2 kHz".</summary>
    public static string Band(StageNoiseFigures figures) => $"{Say.Hertz(figures.Low)} to {Say.Hertz(figures.High)}";

    /// <summary>A contributor in words with its share: "the thermal noise of `rect.rf` (40 % of the noise power)".</summary>
    public static string Cause(NoiseContribution? c) => c is null ? "not known (the analysis found no noise source)" : c.Kind switch
    {
        NoiseKind.Thermal => $"the thermal noise of `{c.Element}`",
        NoiseKind.AmplifierVoltage => $"the voltage noise of `{c.Element}`",
        NoiseKind.AmplifierCurrentNonInverting => $"the current noise of `{c.Element}` at its + input",
        NoiseKind.AmplifierCurrentInverting => $"the current noise of `{c.Element}` at its − input",
        _ => $"the shot noise of `{c.Element}`",
    } + $" ({Say.Percent(c.Share)} of the noise power)";

    /// <summary>What would lower a contributor.</summary>
    public static string Fix(NoiseContribution? c) => c?.Kind switch
    {
        NoiseKind.Thermal => "lower that resistance (noise voltage grows as √R) or narrow the noise band",
        NoiseKind.AmplifierVoltage => "choose an amplifier with a lower noise density, or lower the noise gain",
        NoiseKind.AmplifierCurrentNonInverting or NoiseKind.AmplifierCurrentInverting => "choose an amplifier with lower current noise (a JFET or CMOS input), or lower the resistance its input sees",
        NoiseKind.Shot => "change the diode's operating current, or filter after it",
        _ => "narrow the noise band",
    };

    /// <summary>Where to point a noise finding: the element of the largest contributor, else the stage.</summary>
    public static SourceSpan Target(DesignEvaluation evaluation, StageNoiseFigures figures) =>
        figures.Largest is { } top ? evaluation.Analyses.Chain(BandEnd.Top).Locate(top.Element) : figures.Stage.Stage.Span;
}
