using System.Numerics;
using DesignRules.Elaboration;
using DesignRules.Rules.Evaluation.Stability;

namespace DesignRules.Rules.Evaluation;

/// <summary>
/// Gathers plot data from the analyses the rules already ran (band-top transient, AC sweep) and the Monte Carlo
/// samples the tolerance rules recorded. Runs no analysis a rule has not asked for, except the AC sweep when no
/// rule needed it.
/// </summary>
internal static class PlotCollector
{
    /// <summary>Points per transient trace: enough for a smooth two-period plot, small enough for a diff-able SVG.</summary>
    private const int TracePoints = 400;

    public static IReadOnlyList<StagePlots> Collect(DesignEvaluation evaluation)
    {
        var analyses = evaluation.Analyses;
        var chain = analyses.Chain(BandEnd.Top);
        if (!chain.Succeeded)
        {
            return [];
        }

        // Only settled periods are plotted: an unsettled transient is reported (DR925), not drawn as if it were the signal.
        var transient = chain.Period is null || !analyses.Steady(BandEnd.Top).Settled ? null : analyses.Transient(BandEnd.Top);
        var ac = analyses.Ac();
        var noise = analyses.Noise.ToDictionary(n => n.Stage.StageId, NoisePlotOf, StringComparer.Ordinal);
        var plots = new List<StagePlots>();
        foreach (var stage in chain.Stages)
        {
            TransientPlot? t = null;
            if (transient is { Succeeded: true } && chain.Period is { } period)
            {
                var stop = transient.Time[^1];
                var start = Math.Max(chain.Window.MeasureFrom, stop - (2 * period));
                var grid = Enumerable.Range(0, TracePoints).Select(i => start + ((stop - start) * i / (TracePoints - 1))).ToArray();
                var traces = new List<Trace>
                {
                    new(stage.InputNode, TraceRole.Input, MeasurementWindow.Resample(transient.Time, transient.Voltage(stage.InputNode), grid)),
                    new(stage.OutputNode, TraceRole.StageOutput, MeasurementWindow.Resample(transient.Time, transient.Voltage(stage.OutputNode), grid)),
                };
                foreach (var amp in stage.Amplifiers.Where(a => a.OutputNode != stage.OutputNode))
                {
                    traces.Add(new Trace(amp.OutputNode, TraceRole.AmplifierOutput, MeasurementWindow.Resample(transient.Time, transient.Voltage(amp.OutputNode), grid)));
                }

                var swing = stage.Amplifiers.Select(a => new SwingBand(a.ElementId,
                    a.Rails.Negative + a.Model.SwingHeadroomNegative, a.Rails.Positive - a.Model.SwingHeadroomPositive)).ToList();
                t = new TransientPlot(chain.TestFrequency ?? 0, grid.Select(x => x - start).ToArray(), traces, swing);
            }

            // A small-signal response means something only for a linear stage: a rectifier or peak detector has no
            // single operating point to linearise at.
            BodePlot? bode = null;
            if (ac.Succeeded && stage.Transfer.Kind is Model.TransferKind.Gain or Model.TransferKind.Average)
            {
                var vin = ac.Voltage(stage.InputNode);
                var vout = ac.Voltage(stage.OutputNode);
                var magnitude = new double[vin.Length];
                var phase = new double[vin.Length];
                var previous = 0.0;
                for (var i = 0; i < vin.Length; i++)
                {
                    var h = vin[i] == Complex.Zero ? Complex.Zero : vout[i] / vin[i];
                    magnitude[i] = 20 * Math.Log10(Math.Max(h.Magnitude, 1e-12));
                    var p = h.Phase * 180 / Math.PI;
                    while (i > 0 && p - previous > 180)
                    {
                        p -= 360;
                    }

                    while (i > 0 && p - previous < -180)
                    {
                        p += 360;
                    }

                    phase[i] = previous = p;
                }

                bode = new BodePlot(ac.Frequencies.ToArray(), magnitude, phase);
                if (FilterMarks(evaluation, stage) is { } marks)
                {
                    bode = bode with { Marks = marks.Marks, StopbandLimitDb = marks.StopbandDb };
                }
            }

            plots.Add(StabilityPlotData.With(evaluation, new StagePlots(stage.StageId, t, bode, evaluation.Distributions.GetValueOrDefault(stage.StageId))
            {
                Noise = noise.GetValueOrDefault(stage.StageId),
            }));
        }

        return plots;
    }

    /// <summary>Most points of a noise plot's traces: enough for a smooth curve, small enough for a diff-able SVG.</summary>
    private const int NoisePlotPoints = 161;

    /// <summary>The plot data of a stage's noise: the analysis' final grid thinned to at most <see cref="NoisePlotPoints"/> points.</summary>
    private static NoisePlot NoisePlotOf(StageNoiseFigures figures)
    {
        var r = figures.Result;
        int count = r.Frequencies.Count;
        int stride = Math.Max(1, (int)Math.Ceiling((count - 1) / (double)(NoisePlotPoints - 1)));
        var index = Enumerable.Range(0, count).Where(i => i % stride == 0 || i == count - 1).ToArray();
        double[] Pick(IReadOnlyList<double> values) => index.Select(i => values[i]).ToArray();
        var contributors = r.Contributors.Select(c => new NoiseContributor(c.Element, NoiseWords(c.Kind), c.Rms, c.Share, Pick(c.Density))).ToList();
        return new NoisePlot(Pick(r.Frequencies), Pick(r.OutputDensity), contributors, r.OutputRms);
    }

    /// <summary>A kind of noise as a page names it.</summary>
    private static string NoiseWords(NoiseKind kind) => kind switch
    {
        NoiseKind.Thermal => "thermal 4kTR",
        NoiseKind.AmplifierVoltage => "voltage noise e_n",
        NoiseKind.AmplifierCurrentNonInverting => "current noise i_n at +",
        NoiseKind.AmplifierCurrentInverting => "current noise i_n at −",
        _ => "shot noise 2qI",
    };

    /// <summary>A filter stage's marks: the signal band, the measured −3 dB points and the stop-band requirement.</summary>
    private static (IReadOnlyList<ResponseMark> Marks, double? StopbandDb)? FilterMarks(DesignEvaluation evaluation, StageProbe stage)
    {
        var filter = Catalogue.Filters.FilterStage.Of(evaluation).FirstOrDefault(f => f.Id == stage.StageId);
        if (filter?.Measured(evaluation) is not { } measured)
        {
            return null;
        }

        var marks = new List<ResponseMark>();
        var source = evaluation.Design.Source.Waveform;
        if (source.Band is { } band)
        {
            marks.Add(new ResponseMark(band.Value.Low.Value, "band low"));
            marks.Add(new ResponseMark(band.Value.High.Value, "band high"));
        }
        else if (source.Frequency is { } frequency)
        {
            marks.Add(new ResponseMark(frequency.Value.Value, "signal"));
        }

        if (double.IsFinite(measured.LowerMinus3Db)) marks.Add(new ResponseMark(measured.LowerMinus3Db, "−3 dB"));
        if (double.IsFinite(measured.UpperMinus3Db)) marks.Add(new ResponseMark(measured.UpperMinus3Db, "−3 dB"));
        double? stopbandDb = null;
        if (filter.Requirements.Stopband is { } stopband)
        {
            marks.Add(new ResponseMark(stopband.Frequency.Value.Value, "stop band"));
            stopbandDb = 20 * Math.Log10(measured.PassbandGain / stopband.Attenuation.Value.Value);
        }

        return (marks, stopbandDb);
    }
}
