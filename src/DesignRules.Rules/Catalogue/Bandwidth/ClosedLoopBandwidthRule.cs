using System.Numerics;
using DesignRules.Diagnostics;
using DesignRules.Elaboration;
using DesignRules.Model;
using DesignRules.Rules.Evaluation;
using DesignRules.Rules.Evaluation.LoadingBandwidthStress;
using DesignRules.Rules.Evaluation.Tolerance;
using DesignRules.Simulation;

namespace DesignRules.Rules.Catalogue.Bandwidth;

/// <summary>
/// DR501: each linear stage's closed-loop response from the AC analysis, v(stage out) / v(stage in): the −3 dB bandwidth
/// (recorded, and compared with a stated <c>bandwidth</c> requirement) and the gain at the top of the band against the
/// gain at 1 Hz (the DC gain of a DC-coupled stage), compared with the stage's accuracy. A chain-level <c>bandwidth</c>
/// requirement is checked on the whole chain (source emf to chain output) when every stage is linear.
/// </summary>
internal sealed class ClosedLoopBandwidthRule : Rule
{
    public override RuleId Id => RuleIds.ClosedLoopBandwidth;

    public override void Evaluate(DesignEvaluation evaluation)
    {
        var top = SourceSignal.TopFrequency(evaluation.Design.Source.Waveform);
        var small = SmallSignal.Of(evaluation.Analyses);
        if (small is null)
        {
            return;
        }

        var sweep = evaluation.Analyses.Ac();
        if (!sweep.Succeeded)
        {
            evaluation.ReportFailure("AC", sweep.Failure!, small.Chain);
            return;
        }

        // With a gbw-derating and a range, the stage is judged where its bandwidth is least: at 25 °C or at an end of the
        // range where some GBW falls (DESIGN.md: closed-loop bandwidth ≈ GBW / noise gain, so the lowest GBW is worst).
        var variants = new List<(double? At, AcResult Sweep, SmallSignal Small)> { (null, sweep, small) };
        foreach (var end in evaluation.Analyses.GbwEnds.Where(e => e.Lowers))
        {
            var (derated, list) = evaluation.Analyses.AcAt(end);
            if (derated.Succeeded && list is not null)
            {
                variants.Add((end.Celsius, derated, list));
            }
        }

        foreach (var stage in small.Chain.Stages.Where(s => s.Transfer.Kind == TransferKind.Gain))
        {
            var judged = variants
                .Select(v => (v.At, v.Sweep, Response: Response(v.Sweep, i => SmallSignal.InputVoltage(v.Sweep, stage, i), stage.OutputNode),
                    AtTop: top is { } f ? Response(v.Small.Result, i => SmallSignal.InputVoltage(v.Small.Result, stage, i), stage.OutputNode)[v.Small.IndexOf(f)] : (Complex?)null))
                .Select(v => (v.At, v.Sweep, v.Response, v.AtTop, Bandwidth: Bandwidth(v.Sweep, v.Response) ?? double.PositiveInfinity))
                .MinBy(v => v.Bandwidth);
            Check(evaluation, stage.StageId, stage.Stage.Requirements, StageFacts.Accuracy(evaluation, Id, stage.Stage), judged.Sweep, judged.Response, judged.AtTop, top,
                Location(stage), judged.At, stage.Amplifiers.Count > 0 ? stage.Amplifiers[0].Part : null);
        }

        var chainBandwidth = evaluation.Design.Requirements.Bandwidth;
        if (chainBandwidth is not null && small.Chain.Stages.All(s => s.Transfer.Kind == TransferKind.Gain))
        {
            var emf = small.Chain.SourceEmfNode;
            var response = Response(sweep, i => sweep.Voltage(emf)[i], small.Chain.OutputNode);
            var bandwidth = Bandwidth(sweep, response);
            var required = chainBandwidth.Value.Value;
            if (bandwidth is { } bw)
            {
                evaluation.Record(null, FigureKinds.ChainBandwidth.Of(bw).AtLeast(required));
            }

            if (bandwidth is { } found && found < required)
            {
                evaluation.Report(Id, null, chainBandwidth.Span, new Dictionary<string, string>
                {
                    ["target"] = $"Design `{evaluation.Design.Id.Value}` (whole chain)",
                    ["bandwidth"] = Say.Hertz(found),
                    ["required"] = $"at least {Say.Hertz(required)} required, {Say.Hertz(required - found)} short",
                    ["gain-error"] = string.Empty,
                }, FigureKinds.ClosedLoopBandwidth.Of(found), FigureKinds.RequiredBandwidth.Of(required));
            }
        }
    }

    private void Check(DesignEvaluation evaluation, string stageId, Requirements requirements, double accuracy, AcResult sweep, Complex[] response,
        Complex? atTop, double? top, SourceSpan span, double? at, AmplifierPart? part)
    {
        var bandwidth = Bandwidth(sweep, response);
        var required = requirements.Bandwidth?.Value.Value;
        if (bandwidth is { } bw)
        {
            var figure = FigureKinds.ClosedLoopBandwidth.Of(bw).AtTemperature(at);
            evaluation.Record(stageId, required is { } atLeast ? figure.AtLeast(atLeast) : figure);
            evaluation.Judged(stageId, "bandwidth", Id);
        }

        double reference = Reference(sweep, response, top);
        double error = atTop is { } h && reference > 0 ? Math.Abs((h.Magnitude / reference) - 1) : 0;
        if (top is not null)
        {
            evaluation.Record(stageId, FigureKinds.BandTopGainError.Of(error).AtMost(accuracy).AtTemperature(at));
        }

        bool short_ = required is { } r && (bandwidth ?? double.PositiveInfinity) < r;
        if (error <= accuracy && !short_)
        {
            return;
        }

        var bandwidthText = (bandwidth is { } b ? Say.Hertz(b) : $"above {Say.Hertz(sweep.Frequencies[^1])}") + ToleranceAnalyses.AtTemperature(at);
        evaluation.Report(Id, stageId, short_ && error <= accuracy ? requirements.Bandwidth!.Span : span, new Dictionary<string, string>
        {
            ["target"] = $"Stage `{stageId}`",
            ["bandwidth"] = bandwidthText,
            ["required"] = required is { } req
                ? short_ ? $"at least {Say.Hertz(req)} required, {Say.Hertz(req - bandwidth!.Value)} short{DeratedFix(part, at, req / bandwidth!.Value)}" : $"at least {Say.Hertz(req)} required"
                : "no bandwidth stated",
            ["gain-error"] = top is { } f
                ? $"; gain at {Say.Hertz(f)} is off by {Say.Percent(error)} ({Say.Percent(accuracy)} allowed{(error > accuracy ? $", {Say.Percent(error - accuracy)} over" : string.Empty)})"
                : string.Empty,
        }, FigureKinds.ClosedLoopBandwidth.Of(bandwidth ?? sweep.Frequencies[^1]).AtTemperature(at), FigureKinds.BandTopGainError.Of(error).AtTemperature(at), FigureKinds.Accuracy.Of(accuracy));
    }

    /// <summary>
    /// Where the shortfall is judged at a derated end: the GBW the part needs there, as a factor of its derated figure
    /// (bandwidth scales with GBW at a fixed noise gain), so the fix names the temperature it must hold at.
    /// </summary>
    private static string DeratedFix(AmplifierPart? part, double? at, double factor)
    {
        if (at is not { } t || part is null)
        {
            return string.Empty;
        }

        double derated = part.GainBandwidth.Value.Value * TemperatureBehaviour.GbwFactor(part, t);
        return $"; the part's GBW falls to {Say.Hertz(derated)}{ToleranceAnalyses.AtTemperature(t)} (its gbw-derating): choose one with at least {Say.Hertz(derated * factor)} there, or less gain in this stage";
    }

    private static Complex[] Response(AcResult result, Func<int, Complex> input, string output)
    {
        var vout = result.Voltage(output);
        var h = new Complex[vout.Length];
        for (int i = 0; i < h.Length; i++)
        {
            var vin = input(i);
            h[i] = vin == Complex.Zero ? Complex.Zero : vout[i] / vin;
        }

        return h;
    }

    /// <summary>The reference gain: at the lowest swept frequency, or the largest below the band top where that is much lower (a coupling capacitor).</summary>
    private static double Reference(AcResult sweep, Complex[] h, double? top)
    {
        double first = h[0].Magnitude;
        double largest = Enumerable.Range(0, h.Length).Where(i => sweep.Frequencies[i] <= (top ?? sweep.Frequencies[^1])).Select(i => h[i].Magnitude).DefaultIfEmpty(first).Max();
        return first < 0.5 * largest ? largest : first;
    }

    /// <summary>The frequency above the reference where |H| first falls 3 dB below it, interpolated in dB against log-frequency.</summary>
    internal static double? Bandwidth(AcResult sweep, Complex[] h)
    {
        if (h.Length < 2)
        {
            return null;
        }

        double reference = Reference(sweep, h, null);
        int start = Array.FindIndex(h, x => x.Magnitude >= reference * (1 - 1e-12));
        double level = 20 * Math.Log10(reference / Math.Sqrt(2));
        for (int i = Math.Max(start, 0) + 1; i < h.Length; i++)
        {
            double db = 20 * Math.Log10(h[i].Magnitude);
            if (db > level)
            {
                continue;
            }

            double previous = 20 * Math.Log10(h[i - 1].Magnitude);
            double f0 = Math.Log10(sweep.Frequencies[i - 1]), f1 = Math.Log10(sweep.Frequencies[i]);
            double fraction = previous == db ? 0 : (previous - level) / (previous - db);
            return Math.Pow(10, f0 + ((f1 - f0) * fraction));
        }

        return null;
    }

    private static SourceSpan Location(StageProbe stage) =>
        stage.Amplifiers.Count > 0 ? StageFacts.PartSpan(stage.Stage, stage.Amplifiers[0].Slot) : stage.Stage.Span;
}
