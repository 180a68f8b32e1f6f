using System.Globalization;
using DesignRules.Quantities;

namespace DesignRules.Rules;

/// <summary>What the Monte Carlo samples show about a yield requirement.</summary>
public enum YieldVerdict
{
    /// <summary>The interval's lower bound reaches the requirement: the samples show it.</summary>
    Met,
    /// <summary>The interval straddles the requirement: the samples neither show nor refute it (DR406).</summary>
    NotShown,
    /// <summary>The interval's upper bound stays below the requirement: the samples refute it (DR402).</summary>
    Failed,
}

/// <summary>
/// A stage's Monte Carlo yield with its two-sided Clopper–Pearson interval and the verdict on the required yield.
/// </summary>
/// <param name="StageId">The stage.</param>
/// <param name="Samples">Samples drawn (after any sequential batches).</param>
/// <param name="Passing">Samples whose transfer error is within the accuracy.</param>
/// <param name="Seed">The Monte Carlo seed.</param>
/// <param name="Accuracy">The accuracy the samples were counted against.</param>
/// <param name="Required">The required yield.</param>
/// <param name="Confidence">The two-sided confidence level of the interval (after the sequential adjustment, if any).</param>
/// <param name="Lower">Lower bound of the interval.</param>
/// <param name="Upper">Upper bound of the interval.</param>
/// <param name="Verdict">Met, not shown or failed.</param>
/// <param name="SamplesNeeded">For "not shown": the sample count that would show the requirement if the observed yield held (null when none would).</param>
/// <param name="Sequential">Whether the samples were drawn in batches until the verdict was decided or the cap reached.</param>
public sealed record YieldEstimate(
    string StageId,
    int Samples,
    int Passing,
    int Seed,
    double Accuracy,
    double Required,
    double Confidence,
    double Lower,
    double Upper,
    YieldVerdict Verdict,
    long? SamplesNeeded,
    bool Sequential)
{
    /// <summary>The observed fraction of passing samples.</summary>
    public double Yield => Samples == 0 ? double.NaN : (double)Passing / Samples;

    /// <summary>The verdict as reports write it: <c>met</c>, <c>not shown</c>, <c>failed</c>.</summary>
    public string VerdictText => Verdict switch
    {
        YieldVerdict.Met => "met",
        YieldVerdict.NotShown => "not shown",
        _ => "failed",
    };

    /// <summary>One sentence for the histogram's caption: yield, samples, interval and verdict.</summary>
    public string Caption => string.Create(CultureInfo.InvariantCulture,
        $"Yield {Pct(Yield)} ({Passing:N0} of {Samples:N0} samples{(Sequential ? ", drawn in batches" : string.Empty)}, seed {Seed}); " +
        $"{Pct(Confidence)} confidence interval {Pct(Lower)} to {Pct(Upper)} (Clopper–Pearson); required {Pct(Required)}: {VerdictText}.");

    internal static string Pct(double ratio) => new Quantity(ratio, Dimension.Ratio).FormatPercent(4);
}
