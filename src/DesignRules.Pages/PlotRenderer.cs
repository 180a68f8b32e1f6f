using DesignRules.Rules;
using OxyPlot;
using OxyPlot.Annotations;
using OxyPlot.Axes;
using OxyPlot.Legends;
using OxyPlot.Series;

namespace DesignRules.Pages;

/// <summary>Draws the stage plots with OxyPlot and exports them as SVG, readable on a light wiki page.</summary>
internal static class PlotRenderer
{
    private const double Width = 960;
    private const double Height = 500;

    public static string Transient(string stageId, TransientPlot plot)
    {
        var (scale, unit) = plot.Time.Count > 0 && plot.Time[^1] < 2e-3 ? (1e6, "µs") : (1e3, "ms");
        var model = Model($"{stageId}: transient at {EngineeringFunctions.Engineering(plot.Frequency, "Hz")}");
        model.Axes.Add(new LinearAxis { Position = AxisPosition.Bottom, Title = $"Time ({unit})", MajorGridlineStyle = LineStyle.Dot });
        // The swing limits are part of the picture: the axis spans them as well as the waveforms.
        var values = plot.Traces.SelectMany(t => t.Values).Concat(plot.SwingLimits.SelectMany(l => new[] { l.Low, l.High })).ToList();
        var (low, high) = values.Count == 0 ? (-1.0, 1.0) : (values.Min(), values.Max());
        var pad = Math.Max((high - low) * 0.05, 1e-3);
        model.Axes.Add(new LinearAxis
        {
            Position = AxisPosition.Left, Title = "Voltage (V)", MajorGridlineStyle = LineStyle.Dot, AxisTitleDistance = 12,
            Minimum = low - pad, Maximum = high + pad,
        });
        foreach (var trace in plot.Traces)
        {
            model.Series.Add(TraceSeries(trace, plot.Time, scale));
        }

        // One line per distinct limit, naming every amplifier that shares it.
        foreach (var limit in plot.SwingLimits.SelectMany(l => new[] { (l.Amplifier, Value: l.High), (l.Amplifier, Value: l.Low) })
                     .GroupBy(l => Math.Round(l.Value, 6)).OrderBy(g => g.Key))
        {
            model.Annotations.Add(Limit(limit.Key, string.Join(", ", limit.Select(l => l.Amplifier).Distinct()) + " swing limit", horizontal: true));
        }

        return Export(model);
    }

    public static string Response(string stageId, BodePlot plot)
    {
        var model = Model($"{stageId}: closed-loop response");
        model.Axes.Add(new LogarithmicAxis
        {
            Position = AxisPosition.Bottom, Title = "Frequency (Hz)", MajorGridlineStyle = LineStyle.Dot,
            LabelFormatter = f => new DesignRules.Quantities.Quantity(f, DesignRules.Quantities.Dimension.Frequency).Format(),
        });
        model.Axes.Add(new LinearAxis { Position = AxisPosition.Left, Title = "Magnitude (dB)", Key = "magnitude", MajorGridlineStyle = LineStyle.Dot, AxisTitleDistance = 12 });
        model.Axes.Add(new LinearAxis { Position = AxisPosition.Right, Title = "Phase (°)", Key = "phase", AxisTitleDistance = 12 });
        var magnitude = new LineSeries { Title = "magnitude", YAxisKey = "magnitude", StrokeThickness = 2 };
        var phase = new LineSeries { Title = "phase", YAxisKey = "phase", StrokeThickness = 1.5, LineStyle = LineStyle.Dash };
        for (var i = 0; i < plot.Frequency.Count; i++)
        {
            magnitude.Points.Add(new DataPoint(plot.Frequency[i], plot.MagnitudeDb[i]));
            phase.Points.Add(new DataPoint(plot.Frequency[i], plot.PhaseDegrees[i]));
        }

        model.Series.Add(magnitude);
        model.Series.Add(phase);
        foreach (var mark in plot.Marks)
        {
            var line = Limit(mark.Frequency, mark.Label, horizontal: false);
            line.YAxisKey = "magnitude";
            model.Annotations.Add(line);
        }

        if (plot.StopbandLimitDb is { } stopband)
        {
            var line = Limit(stopband, "stop-band limit", horizontal: true);
            line.YAxisKey = "magnitude";
            model.Annotations.Add(line);
        }

        return Export(model);
    }

    public static string Histogram(string stageId, SampleDistribution distribution)
    {
        var unitText = distribution.Unit is "1" or "" || distribution.Figure.Contains('(', StringComparison.Ordinal) ? string.Empty : $" ({distribution.Unit})";
        var model = Model($"{stageId}: Monte Carlo, {distribution.Samples.Count} samples");
        var axis = new LinearAxis { Position = AxisPosition.Bottom, Title = distribution.Figure + unitText, MajorGridlineStyle = LineStyle.Dot };
        model.Axes.Add(axis);
        model.Axes.Add(new LinearAxis { Position = AxisPosition.Left, Title = "Samples", Minimum = 0, MajorGridlineStyle = LineStyle.Dot, AxisTitleDistance = 12 });
        var low = distribution.Samples.Min();
        var high = distribution.Samples.Max();
        if (distribution.Low is { } l)
        {
            low = Math.Min(low, l);
        }

        if (distribution.High is { } h)
        {
            high = Math.Max(high, h);
        }

        // Leave room beyond the limits so that their lines and labels are inside the plot.
        axis.Minimum = low - ((high - low) * 0.06) - 1e-12;
        axis.Maximum = high + ((high - low) * 0.12) + 1e-12;
        const int bins = 30;
        var width = high > low ? (high - low) / bins : 1e-12;
        var counts = new int[bins];
        foreach (var sample in distribution.Samples)
        {
            counts[Math.Clamp((int)((sample - low) / width), 0, bins - 1)]++;
        }

        var series = new RectangleBarSeries { Title = distribution.Figure, StrokeThickness = 0.5 };
        for (var i = 0; i < bins; i++)
        {
            series.Items.Add(new RectangleBarItem(low + (i * width), 0, low + ((i + 1) * width), counts[i]));
        }

        model.Series.Add(series);
        if (distribution.Low is { } lower)
        {
            model.Annotations.Add(Limit(lower, "lower limit", horizontal: false));
        }

        if (distribution.High is { } upper)
        {
            model.Annotations.Add(Limit(upper, "upper limit", horizontal: false));
        }

        return Export(model);
    }

    /// <summary>Contributors drawn beside the total; the rest are in the page's table.</summary>
    private const int NoiseTraces = 6;

    public static string NoiseDensity(string stageId, NoisePlot plot)
    {
        var model = Model($"{stageId}: output noise density, {EngineeringFunctions.Engineering(plot.OutputRms, "V")} RMS over the band");
        model.Axes.Add(new LogarithmicAxis
        {
            Position = AxisPosition.Bottom, Title = "Frequency (Hz)", MajorGridlineStyle = LineStyle.Dot,
            LabelFormatter = f => new DesignRules.Quantities.Quantity(f, DesignRules.Quantities.Dimension.Frequency).Format(),
        });

        // A log axis cannot show zero: a contributor whose transfer vanishes somewhere is drawn at a floor far below the total.
        double top = plot.Total.Count == 0 ? 1e-9 : plot.Total.Max();
        double floor = top * 1e-4;
        var shown = plot.Contributors.Where(c => c.Share >= 1e-4).Take(NoiseTraces).ToList();
        double bottom = Math.Max(floor, shown.SelectMany(c => c.Density).Concat(plot.Total).DefaultIfEmpty(floor).Min());
        model.Axes.Add(new LogarithmicAxis
        {
            Position = AxisPosition.Left, Title = "Noise density at the output (V/√Hz)", MajorGridlineStyle = LineStyle.Dot, AxisTitleDistance = 12,
            Minimum = bottom * 0.8, Maximum = top * 1.25,
            LabelFormatter = v => new DesignRules.Quantities.Quantity(v, DesignRules.Quantities.Dimension.VoltageNoiseDensity).Format(),
        });
        var total = new LineSeries { Title = "total", StrokeThickness = 2.5 };
        for (var i = 0; i < plot.Frequency.Count; i++)
        {
            total.Points.Add(new DataPoint(plot.Frequency[i], Math.Max(plot.Total[i], floor)));
        }

        model.Series.Add(total);
        foreach (var c in shown)
        {
            var series = new LineSeries
            {
                Title = $"{c.Element} {c.Source} ({EngineeringFunctions.Engineering(c.Share, "%")})",
                StrokeThickness = 1.5,
                LineStyle = LineStyle.Dash,
            };
            for (var i = 0; i < plot.Frequency.Count; i++)
            {
                series.Points.Add(new DataPoint(plot.Frequency[i], Math.Max(c.Density[i], floor)));
            }

            model.Series.Add(series);
        }

        return Export(model);
    }

    /// <summary>One voltage trace over time (scaled to the axis unit), styled by its role: the input dashed, amplifier outputs thinner.</summary>
    internal static LineSeries TraceSeries(Trace trace, IReadOnlyList<double> time, double scale)
    {
        var series = new LineSeries
        {
            Title = trace.Role switch
            {
                TraceRole.Input => $"{trace.Name} (input)",
                TraceRole.StageOutput => $"{trace.Name} (stage output)",
                _ => $"{trace.Name} (amplifier output)",
            },
            StrokeThickness = trace.Role == TraceRole.AmplifierOutput ? 1.5 : 2,
            LineStyle = trace.Role == TraceRole.Input ? LineStyle.Dash : LineStyle.Solid,
        };
        for (var i = 0; i < time.Count; i++)
        {
            series.Points.Add(new DataPoint(time[i] * scale, trace.Values[i]));
        }

        return series;
    }

    /// <summary>The house look every plot shares: title, font, white page, grey frame, legend below, invariant-culture labels.</summary>
    internal static PlotModel Model(string title)
    {
        var model = new PlotModel
        {
            Title = title,
            DefaultFont = "sans-serif",
            TitleFontSize = 14,
            Background = OxyColors.White,
            PlotAreaBorderColor = OxyColors.Gray,

            // OxyPlot formats axis labels in the current culture by default; the pages must not change with the build machine's locale.
            Culture = System.Globalization.CultureInfo.InvariantCulture,
        };
        model.Legends.Add(new Legend
        {
            LegendPlacement = LegendPlacement.Outside,
            LegendPosition = LegendPosition.BottomLeft,
            LegendOrientation = LegendOrientation.Vertical,
            LegendBorder = OxyColors.Undefined,
        });
        return model;
    }

    private static LineAnnotation Limit(double value, string text, bool horizontal) => new()
    {
        Type = horizontal ? LineAnnotationType.Horizontal : LineAnnotationType.Vertical,
        Y = horizontal ? value : 0,
        X = horizontal ? 0 : value,
        Text = text,
        LineStyle = LineStyle.Dash,
        Color = OxyColors.DimGray,
        TextColor = OxyColors.DimGray,
    };

    /// <summary>The plot as a standalone SVG document of the pages' one size.</summary>
    internal static string Export(PlotModel model) =>
        SvgExporter.ExportToString(model, Width, Height, isDocument: true, textMeasurer: new TextWidthEstimate(), useVerticalTextAlignmentWorkaround: true);
}
