using DesignRules.Blocks;
using DesignRules.Elaboration;
using DesignRules.Model;
using DesignRules.Rules.Evaluation;
using DesignRules.Figures;
using DesignRules.Figures.Filters;

namespace DesignRules.Rules.Catalogue.Filters;

/// <summary>A filter stage of the built chain with its ideal response and the requirements it states.</summary>
internal sealed record FilterStage(StageProbe Probe, FilterResponse Ideal)
{
    public string Id => Probe.StageId;

    public Requirements Requirements => Probe.Stage.Requirements;

    /// <summary>The f0 requirement: cutoff for a low- or high-pass, centre for a band-pass (the other one is DR702's).</summary>
    public FilterTarget? Frequency => Ideal.Shape == FilterShape.BandPass ? Requirements.Centre : Requirements.Cutoff;

    public string FrequencyKey => Ideal.Shape == FilterShape.BandPass ? "centre" : "cutoff";

    /// <summary>The judged figures: key, figure name, requirement, how to read it from a measurement, how to say it.</summary>
    public IEnumerable<(string Key, string Name, FilterTarget Target, Func<MeasuredFilter, double> Of, Func<double, string> Say)> Targets()
    {
        if (Frequency is { } f) yield return (FrequencyKey, Ideal.Shape == FilterShape.BandPass ? "centre frequency" : "f0", f, m => m.F0, Say.Hertz);
        if (Requirements.Q is { } q) yield return ("q", "Q", q, m => m.Q, Number);
        if (Requirements.PassbandGain is { } k) yield return ("passband-gain", "pass-band gain", k, m => m.PassbandGain, Number);
    }

    public static IEnumerable<FilterStage> Of(DesignEvaluation evaluation)
    {
        var chain = evaluation.Analyses.Chain(BandEnd.Top);
        if (!chain.Succeeded)
        {
            yield break;
        }

        foreach (var probe in chain.Stages)
        {
            if (DesignAnalyses.IdealFilter(probe.Stage) is { } ideal && double.IsFinite(ideal.F0) && ideal.F0 > 0)
            {
                yield return new FilterStage(probe, ideal);
            }
        }
    }

    /// <summary>The nominal measurement, computed once by the figures layer.</summary>
    public MeasuredFilter? Measured(DesignEvaluation evaluation) => evaluation.Analyses.Filter(Probe);

    /// <summary>The tolerance analysis (worst case and Monte Carlo), computed once by the figures layer.</summary>
    public FilterTolerance? Tolerance(DesignEvaluation evaluation) => evaluation.Analyses.FilterSpread(Probe);

    /// <summary>The magnitude of a signed target (a pass-band gain may be written negative for an inverting form).</summary>
    public static double Magnitude(FilterTarget target) => Math.Abs(target.Value.Value.Value);

    public static string Number(double x) => x.ToString("0.###", System.Globalization.CultureInfo.InvariantCulture);
}
