using System.Globalization;
using DesignRules.Quantities;
using DesignRules.Rules;
using OxyPlot;
using OxyPlot.Annotations;
using OxyPlot.Axes;
using OxyPlot.Series;

namespace DesignRules.Pages;

/// <summary>Draws the loop gain of an amplifier (crossover and phase margin marked) and a stage's step response.</summary>
internal static class StabilityPlotRenderer
{

    public static string LoopGain(string stageId, LoopGainPlot plot)
    {
        var model = PlotRenderer.Model($"{stageId}.{plot.Amplifier}: loop gain {plot.OperatingPoint}");
        model.Axes.Add(new LogarithmicAxis
        {
            Position = AxisPosition.Bottom, Title = "Frequency (Hz)", MajorGridlineStyle = LineStyle.Dot,
            LabelFormatter = f => new Quantity(f, Dimension.Frequency).Format(),
        });
        model.Axes.Add(new LinearAxis { Position = AxisPosition.Left, Title = "|T| (dB)", Key = "magnitude", MajorGridlineStyle = LineStyle.Dot, AxisTitleDistance = 12 });
        model.Axes.Add(new LinearAxis { Position = AxisPosition.Right, Title = "Phase of T (°)", Key = "phase", AxisTitleDistance = 12 });
        var magnitude = new LineSeries { Title = "|T|", YAxisKey = "magnitude", StrokeThickness = 2 };
        var phase = new LineSeries { Title = "phase of T", YAxisKey = "phase", StrokeThickness = 1.5, LineStyle = LineStyle.Dash };
        for (var i = 0; i < plot.Frequency.Count; i++)
        {
            magnitude.Points.Add(new DataPoint(plot.Frequency[i], plot.MagnitudeDb[i]));
            phase.Points.Add(new DataPoint(plot.Frequency[i], plot.PhaseDegrees[i]));
        }

        model.Series.Add(magnitude);
        model.Series.Add(phase);
        var degrees = plot.PhaseMargin.ToString("0.#", CultureInfo.InvariantCulture);
        model.Annotations.Add(new LineAnnotation
        {
            Type = LineAnnotationType.Vertical, X = plot.Crossover, LineStyle = LineStyle.Dash, Color = OxyColors.DimGray, TextColor = OxyColors.DimGray,
            Text = "crossover " + new Quantity(plot.Crossover, Dimension.Frequency).Format(),
        });
        model.Annotations.Add(new LineAnnotation
        {
            Type = LineAnnotationType.Horizontal, Y = plot.PhaseMargin - 180, YAxisKey = "phase", LineStyle = LineStyle.Dot, Color = OxyColors.DimGray,
            TextColor = OxyColors.DimGray, Text = "phase at crossover",
        });
        model.Annotations.Add(new LineAnnotation
        {
            Type = LineAnnotationType.Horizontal, Y = -180, YAxisKey = "phase", LineStyle = LineStyle.Dot, Color = OxyColors.Gray, TextColor = OxyColors.Gray, Text = "−180°",
        });
        model.Annotations.Add(new PointAnnotation
        {
            X = plot.Crossover, Y = plot.PhaseMargin - 180, YAxisKey = "phase", Size = 4, Text = $"phase margin {degrees}°", TextColor = OxyColors.Black,
        });
        return PlotRenderer.Export(model);
    }

    public static string Step(string stageId, StepPlot plot)
    {
        var end = plot.Time.Count > 0 ? plot.Time[^1] : 1;
        var (scale, unit) = end < 2e-6 ? (1e9, "ns") : end < 2e-3 ? (1e6, "µs") : (1e3, "ms");
        var overshoot = (plot.Overshoot * 100).ToString("0.#", CultureInfo.InvariantCulture);
        var model = PlotRenderer.Model($"{stageId}: answer to a {new Quantity(plot.Step, Dimension.Voltage).Format()} step at the source, overshoot {overshoot} %");
        model.Axes.Add(new LinearAxis { Position = AxisPosition.Bottom, Title = $"Time after the step ({unit})", MajorGridlineStyle = LineStyle.Dot });
        model.Axes.Add(new LinearAxis { Position = AxisPosition.Left, Title = "Voltage (V)", MajorGridlineStyle = LineStyle.Dot, AxisTitleDistance = 12 });
        foreach (var trace in plot.Traces)
        {
            model.Series.Add(PlotRenderer.TraceSeries(trace, plot.Time, scale));
        }

        if (plot.Settling is { } settling)
        {
            model.Annotations.Add(new LineAnnotation
            {
                Type = LineAnnotationType.Vertical, X = settling * scale, LineStyle = LineStyle.Dash, Color = OxyColors.DimGray, TextColor = OxyColors.DimGray,
                Text = "settled to 1 %",
            });
        }

        return PlotRenderer.Export(model);
    }
}
