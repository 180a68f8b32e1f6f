using System.Globalization;
using DesignRules.Blocks;
using DesignRules.Diagnostics;
using DesignRules.Elaboration;
using DesignRules.Model;

namespace DesignRules.Rules.Evaluation;

/// <summary>
/// One kind of requirement: its key, how it reads on a page, which rules may judge it, and where a stage's requirement
/// of this kind can be judged at all.
/// </summary>
/// <param name="Key">The key in <c>requires:</c>.</param>
/// <param name="Rules">Rule ids that may judge it.</param>
/// <param name="Stated">Where the requirement is written, or null when not stated.</param>
/// <param name="Text">The stated value as a page shows it.</param>
public sealed record RequirementKind(string Key, IReadOnlyList<string> Rules, Func<Requirements, SourceSpan?> Stated, Func<Requirements, string> Text)
{
    /// <summary>
    /// When a stage's requirement of this kind can be judged (null: always), and the reason given (DR702) where it cannot.
    /// </summary>
    internal Func<Design, Stage, StageProbe?, bool>? AppliesTo { get; init; }

    /// <summary>Why a stage's requirement of this kind cannot be judged where <see cref="AppliesTo"/> says no.</summary>
    internal string? NotApplicableReason { get; init; }

    /// <summary>
    /// When a design-level requirement of this kind is judged on the whole chain (null: never; design-level requirements
    /// are otherwise checked per stage).
    /// </summary>
    internal Func<ElaboratedChain, bool>? JudgedOnChain { get; init; }
}

/// <summary>
/// The one table of which rules judge which requirement. A requirement's verdict comes only from the rules that judged
/// it (<see cref="DesignEvaluation.Judged"/>): "not met" when one of them reported it, "met" when one judged it and none
/// reported it, and "not checked" when none judged it. The check's verdicts, the pages and the unchecked-requirement rule
/// (DR702) all read this table.
/// </summary>
public static class RequirementTable
{
    /// <summary>Every requirement kind, in the order pages list them.</summary>
    public static IReadOnlyList<RequirementKind> All { get; } =
    [
        // A gain implies transfer: gain, so a transfer stated beside a gain is not a requirement of its own.
        new("transfer", [RuleIds.WorstCaseTransfer, RuleIds.HalfCycleSymmetry, RuleIds.AverageTransfer], r => r.Gain is null ? r.Transfer?.Span : null, r => Words(r.Transfer!.Value.ToString())),
        new("gain", [RuleIds.WorstCaseTransfer, RuleIds.MonteCarloYield, RuleIds.ClosedLoopBandwidth], r => r.Gain?.Span, r => r.Gain!.Value.Format()),
        new("accuracy", [RuleIds.SourceImpedance, RuleIds.HighImpedanceOutput, RuleIds.InterstageLoading, RuleIds.WorstCaseTransfer, RuleIds.MonteCarloYield, RuleIds.CommonModeRejection, RuleIds.HalfCycleSymmetry, RuleIds.AverageTransfer, RuleIds.ClosedLoopBandwidth, RuleIds.RectifierLoopGain], r => r.Accuracy?.Span,
            r => "±" + r.Accuracy!.Value.FormatPercent()),
        new("glitch", [RuleIds.SlewDemand, RuleIds.ZeroCrossingGlitch], r => r.Glitch?.Span, r => r.Glitch!.Value.Format())
        {
            AppliesTo = (_, _, probe) => probe is not null && StageProperties.IsRectifying(probe),
            NotApplicableReason = "only rectifying stages have zero-crossing glitches",
        },
        new("yield", [RuleIds.MonteCarloYield, RuleIds.YieldNotShown], r => r.Yield?.Span, r => r.Yield!.Value.FormatPercent())
        {
            AppliesTo = (_, stage, _) => stage.Requirements.Accuracy is not null,
            NotApplicableReason = "a yield needs an accuracy to count samples against",
        },
        new("bandwidth", [RuleIds.ClosedLoopBandwidth], r => r.Bandwidth?.Span, r => r.Bandwidth!.Value.Format())
        {
            // DR501 checks a chain-level bandwidth when every stage is a linear gain stage.
            JudgedOnChain = chain => chain.Stages.All(s => s.Transfer.Kind == TransferKind.Gain),
        },
        new("output-offset", [RuleIds.OutputOffset], r => r.OutputOffset?.Span, r => r.OutputOffset!.Value.Format()),
        new("min-signal", [RuleIds.RectifierLoopGain, RuleIds.SmallestSignal], r => r.MinSignal?.Span, r => r.MinSignal!.Value.Format())
        {
            AppliesTo = (_, _, probe) => probe is not null && StageProperties.IsRectifying(probe),
            NotApplicableReason = "the smallest-signal check applies to precision rectifiers",
        },
        new("cmrr", [RuleIds.CommonModeRejection], r => r.CommonModeRejection?.Span, r => r.CommonModeRejection!.Value.Format())
        {
            // DR403 measures common-mode rejection only where the chain feeds a differential stage from a split source.
            AppliesTo = (design, stage, _) => design.Source.CommonMode is not null && design.Stages[0] == stage
                && stage is BlockStage { Block.TakesDifferentialInput: true },
            NotApplicableReason = "common-mode rejection is measured on a difference stage that is the first stage, fed from a source with a `common-mode` level",
        },
        Noise("snr", [RuleIds.SignalToNoise], r => r.SignalToNoise?.Span, r => $"at least {(20 * Math.Log10(r.SignalToNoise!.Value.Value)).ToString("0.#", CultureInfo.InvariantCulture)} dB"),
        Noise("noise", [RuleIds.NoiseLevel], r => r.Noise?.Span,
            r => $"at most {r.Noise!.Rms.Value.Format()} RMS {(r.Noise.At.Value == NoiseReference.Input ? "referred to the input" : "at the output")}"),
        Filter("cutoff", r => r.Cutoff, s => s is FilterShape.LowPass or FilterShape.HighPass, "a cutoff belongs to a low- or high-pass filter block (a band-pass states its `centre`)"),
        Filter("centre", r => r.Centre, s => s is FilterShape.BandPass, "a centre frequency belongs to a band-pass filter block (a low- or high-pass states its `cutoff`)"),
        Filter("q", r => r.Q, _ => true, "Q is measured on the filter blocks"),
        Filter("passband-gain", r => r.PassbandGain, _ => true, "the pass-band gain is measured on the filter blocks"),
        new("stopband", [RuleIds.StopbandAttenuation], r => r.Stopband?.Span,
            r => $"at least {(20 * Math.Log10(r.Stopband!.Attenuation.Value.Value)).ToString("0.#", CultureInfo.InvariantCulture)} dB at {r.Stopband.Frequency.Value.Format()}")
        {
            AppliesTo = (_, stage, _) => FilterOf(stage) is not null,
            NotApplicableReason = "stop-band attenuation is measured on the filter blocks",
        },
    ];

    // Noise is integrated over a band: the stage's noise-band, else the source's band.
    private static RequirementKind Noise(string key, IReadOnlyList<string> rules, Func<Requirements, SourceSpan?> stated, Func<Requirements, string> text) =>
        new(key, rules, stated, text)
        {
            AppliesTo = (design, stage, _) => stage.Requirements.NoiseBand is not null || design.Source.Waveform.Band is not null,
            NotApplicableReason = "noise is integrated over a band: give the source a `band` or state `noise-band` beside the requirement",
        };

    /// <summary>The ideal response of a filter block stage; null for any other stage.</summary>
    internal static FilterResponse? FilterOf(Stage stage) => Figures.DesignAnalyses.IdealFilter(stage);

    private static RequirementKind Filter(string key, Func<Requirements, FilterTarget?> target, Func<FilterShape, bool> shapes, string reason) =>
        new(key, [RuleIds.FilterResponse, RuleIds.FilterTolerance], r => target(r)?.Span,
            r => $"{Format(target(r)!.Value.Value)} ± {target(r)!.Within.Value.FormatPercent()}")
        {
            AppliesTo = (_, stage, _) => FilterOf(stage) is { } f && shapes(f.Shape),
            NotApplicableReason = reason,
        };

    // A Q or a gain is a plain number on the page, a frequency carries its unit.
    private static string Format(Quantities.Quantity q) =>
        q.Dimension == Quantities.Dimension.Ratio ? q.Value.ToString("0.###", CultureInfo.InvariantCulture) : q.Format();

    /// <summary>Rule ids that may judge each requirement key.</summary>
    public static IReadOnlyDictionary<string, IReadOnlyList<string>> Rules { get; } =
        All.ToDictionary(k => k.Key, k => k.Rules, StringComparer.Ordinal);

    /// <summary>The requirements stated in <paramref name="requirements"/>, in table order, with where each is written.</summary>
    public static IEnumerable<(RequirementKind Kind, SourceSpan Span)> Stated(Requirements requirements) =>
        All.Select(k => (Kind: k, Span: k.Stated(requirements))).Where(x => x.Span is not null).Select(x => (x.Kind, x.Span!));

    private static string Words(string pascal) =>
        string.Concat(pascal.Select((c, i) => i > 0 && char.IsUpper(c) ? "-" + char.ToLower(c, CultureInfo.InvariantCulture) : char.ToLower(c, CultureInfo.InvariantCulture).ToString()));
}
