using DesignRules.Elaboration;
using DesignRules.Model;

namespace DesignRules.Figures.Tolerance;

/// <summary>
/// The transfer a stage is judged against: the required gain when the stage states one, else the ideal transfer computed
/// from its component values (made symmetric for an absolute-value stage, whose intent is equal half-cycles). A difference
/// stage fed from a split source is judged against a transfer with no offset: any common-mode residue is an error.
/// </summary>
internal sealed record TransferTarget(TransferKind Kind, double SlopePositive, double SlopeNegative, double Offset)
{
    public double At(double x) => Offset + ((x >= 0 ? SlopePositive : SlopeNegative) * x);

    /// <summary>True for transfers measured as a straight line through the DC levels (gain, and an average at DC).</summary>
    public bool IsLinear => Kind is TransferKind.Gain or TransferKind.Average;

    public static TransferTarget Of(StageProbe stage)
    {
        var ideal = stage.Transfer;
        double offset = DesignRules.Simulation.Circuits.Circuit.IsReference(stage.ReferenceInputNode) ? ideal.Offset : 0;
        var kind = stage.Stage.Requirements.Transfer?.Value ?? ideal.Kind;
        if (stage.Stage.Requirements.Gain is { } gain && ideal.Kind == TransferKind.Gain)
        {
            return new TransferTarget(TransferKind.Gain, gain.Value.Value, gain.Value.Value, offset);
        }

        if (ideal.Kind == TransferKind.AbsoluteValue)
        {
            double magnitude = (Math.Abs(ideal.SlopePositive) + Math.Abs(ideal.SlopeNegative)) / 2;
            double sign = ideal.SlopePositive >= 0 ? 1 : -1;
            return new TransferTarget(TransferKind.AbsoluteValue, sign * magnitude, -sign * magnitude, offset);
        }

        return new TransferTarget(ideal.Kind == TransferKind.Gain ? kind : ideal.Kind, ideal.SlopePositive, ideal.SlopeNegative, offset);
    }
}

/// <summary>
/// The figures of one DC transfer measurement: the deviation from the target at every level, the small-signal gain
/// between the extreme levels, the half-cycle gain mismatch, and the common-mode figures.
/// </summary>
/// <param name="Deviations">Output minus target at each level, V.</param>
/// <param name="Gain">
/// Δvout/Δvin between the lowest and highest input at which no amplifier clips (else the lowest and highest input; NaN
/// when the inputs do not differ).
/// </param>
/// <param name="Mismatch">|vout(+)|/|vin(+)| − |vout(−)|/|vin(−)| (NaN unless the input takes both signs).</param>
/// <param name="CommonModeShift">Output change for the common-mode step, V.</param>
/// <param name="CommonModeRejection">|Gain| / |common-mode gain| (infinite when the common mode does not move the output).</param>
internal sealed record StageFigures(double[] Deviations, double Gain, double Mismatch, double CommonModeShift, double CommonModeRejection)
{
    public static StageFigures Of(DcTransfer t, TransferTarget target, TransferPlan plan)
    {
        var x = t.Inputs;
        var y = t.Outputs;
        var deviations = x.Select((xi, i) => y[i] - target.At(xi)).ToArray();
        int lo = IndexOfMin(x), hi = IndexOfMax(x);
        // The gain between the extreme levels at which no amplifier clips, when there are two such levels.
        var linear = Enumerable.Range(0, x.Length).Where(i => i >= t.Clipped.Length || !t.Clipped[i]).ToList();
        int glo = lo, ghi = hi;
        if (linear.Count >= 2 && linear.Count < x.Length)
        {
            glo = linear.MinBy(i => x[i]);
            ghi = linear.MaxBy(i => x[i]);
        }

        double gain = Math.Abs(x[ghi] - x[glo]) > 1e-15 ? (y[ghi] - y[glo]) / (x[ghi] - x[glo]) : double.NaN;
        double mismatch = x[hi] > 0 && x[lo] < 0 ? (Math.Abs(y[hi]) / x[hi]) - (Math.Abs(y[lo]) / -x[lo]) : double.NaN;
        double cmrr = double.PositiveInfinity;
        if (plan.CommonMode is { } cm && t.CommonModeShift != 0)
        {
            cmrr = Math.Abs(gain) / Math.Abs(t.CommonModeShift / cm);
        }

        return new StageFigures(deviations, gain, mismatch, t.CommonModeShift, cmrr);
    }

    internal static int IndexOfMax(double[] values)
    {
        int best = 0;
        for (int i = 1; i < values.Length; i++) if (values[i] > values[best]) best = i;
        return best;
    }

    internal static int IndexOfMin(double[] values)
    {
        int best = 0;
        for (int i = 1; i < values.Length; i++) if (values[i] < values[best]) best = i;
        return best;
    }
}

/// <summary>A closed range of a figure.</summary>
internal readonly record struct Interval(double Low, double High)
{
    public static Interval Point(double v) => new(v, v);

    /// <summary>The largest magnitude in the range.</summary>
    public double Magnitude => Math.Max(Math.Abs(Low), Math.Abs(High));

    public Interval Include(double v) => double.IsNaN(v) ? this : new(Math.Min(Low, v), Math.Max(High, v));

    /// <summary>Widens by the change of a superposed error source (either sign of it may occur).</summary>
    public Interval Widen(double deltaPlus, double deltaMinus) =>
        new(Low + Math.Min(0, Math.Min(Nz(deltaPlus), Nz(deltaMinus))), High + Math.Max(0, Math.Max(Nz(deltaPlus), Nz(deltaMinus))));

    public Interval Shift(double d) => new(Low + d, High + d);

    private static double Nz(double v) => double.IsNaN(v) ? 0 : v;
}

/// <summary>
/// How far a transfer is from its target, relative to the full-scale output: the largest |vout − target(vin)| over the
/// counted levels divided by the largest |target(vin)|. A peak stage counts only its highest level (a peak detector holds
/// the positive peak) and adds the nominal transient's deviation of the held output from the input peak.
/// </summary>
internal sealed record AccuracyMetric(int[] Counted, double FullScale, Interval? Dynamic, int TopIndex)
{
    public static AccuracyMetric Of(TransferTarget target, DcTransfer nominal, Interval? dynamic)
    {
        var x = nominal.Inputs;
        int top = StageFigures.IndexOfMax(x);
        int[] counted = target.Kind == TransferKind.Peak ? [top] : [.. Enumerable.Range(0, x.Length)];
        double fullScale = counted.Max(i => Math.Abs(target.At(x[i])));
        return new AccuracyMetric(counted, fullScale, target.Kind == TransferKind.Peak ? dynamic : null, top);
    }

    /// <summary>The relative error of one measurement (Monte Carlo sample); <paramref name="nominal"/> anchors the transient part.</summary>
    public double ErrorOf(StageFigures sample, StageFigures nominal)
    {
        if (!(FullScale > 0)) return double.NaN;
        if (Dynamic is { } dyn)
        {
            double shift = sample.Deviations[TopIndex] - nominal.Deviations[TopIndex];
            return dyn.Shift(shift).Magnitude / FullScale;
        }

        return Counted.Max(i => Math.Abs(sample.Deviations[i])) / FullScale;
    }

    /// <summary>The worst relative error given each level's deviation range and the nominal deviations.</summary>
    public (double Error, int Index) WorstOf(Interval[] deviations, StageFigures nominal)
    {
        if (!(FullScale > 0)) return (double.NaN, TopIndex);
        if (Dynamic is { } dyn)
        {
            var d = deviations[TopIndex];
            double n = nominal.Deviations[TopIndex];
            var range = new Interval(dyn.Low + (d.Low - n), dyn.High + (d.High - n));
            return (range.Magnitude / FullScale, TopIndex);
        }

        int worst = Counted.MaxBy(i => deviations[i].Magnitude);
        return (deviations[worst].Magnitude / FullScale, worst);
    }
}
