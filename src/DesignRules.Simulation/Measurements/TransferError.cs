namespace DesignRules.Simulation.Measurements;

/// <summary>
/// Error of an output against an ideal transfer of the input (for example |vin| for an absolute-value circuit, or
/// gain·vin): where it leaves a tolerance band, for how long around the input's zero crossings (the glitch), and the
/// error area.
/// </summary>
/// <param name="WorstGlitchWidth">Longest out-of-band interval that starts near an input zero crossing, s.</param>
/// <param name="MeanGlitchWidth">Mean width of those intervals, s.</param>
/// <param name="Glitches">Number of such intervals.</param>
/// <param name="GlitchErrorArea">∫|error| dt over those intervals, per glitch on average, V·s.</param>
/// <param name="TotalErrorArea">∫|error| dt over the whole window, V·s.</param>
/// <param name="TimeOutOfBand">Total time with |error| above the tolerance, s.</param>
/// <param name="PeakError">Largest |error|, V.</param>
public sealed record TransferError(
    double WorstGlitchWidth, double MeanGlitchWidth, int Glitches, double GlitchErrorArea, double TotalErrorArea, double TimeOutOfBand, double PeakError)
{
    /// <summary>
    /// Compares <paramref name="output"/> with ideal(<paramref name="input"/>) point by point from <paramref name="from"/>.
    /// An out-of-band interval counts as a zero-crossing glitch when it starts within a quarter of the mean crossing
    /// spacing of an input zero crossing (before or after).
    /// </summary>
    /// <param name="time">Time points, s.</param>
    /// <param name="input">Input signal.</param>
    /// <param name="output">Output signal.</param>
    /// <param name="ideal">Ideal output as a function of the input.</param>
    /// <param name="tolerance">Half-width of the tolerance band, V.</param>
    /// <param name="from">Ignore time before this, s.</param>
    public static TransferError Measure(IReadOnlyList<double> time, IReadOnlyList<double> input, IReadOnlyList<double> output, Func<double, double> ideal, double tolerance, double from = 0)
    {
        ArgumentNullException.ThrowIfNull(time);
        ArgumentNullException.ThrowIfNull(input);
        ArgumentNullException.ThrowIfNull(output);
        ArgumentNullException.ThrowIfNull(ideal);
        var crossings = new List<double>();
        var intervals = new List<(double Start, double End, double Area)>();
        double total = 0, outOfBand = 0, peak = 0;
        double? openStart = null;
        double openArea = 0;
        int count = Math.Min(time.Count, Math.Min(input.Count, output.Count));
        int first = -1;
        for (int i = 0; i < count; i++)
        {
            if (time[i] < from) continue;
            double error = Math.Abs(output[i] - ideal(input[i]));
            peak = Math.Max(peak, error);
            if (first < 0)
            {
                first = i;
                if (error > tolerance) openStart = time[i];
                continue;
            }

            double dt = time[i] - time[i - 1];
            double previousError = Math.Abs(output[i - 1] - ideal(input[i - 1]));
            double segmentArea = 0.5 * (error + previousError) * dt;
            total += segmentArea;
            if ((input[i - 1] < 0) != (input[i] < 0) && input[i] != input[i - 1])
            {
                crossings.Add(time[i - 1] + (dt * input[i - 1] / (input[i - 1] - input[i])));
            }

            bool wasOut = previousError > tolerance, isOut = error > tolerance;
            if (wasOut && isOut) outOfBand += dt;
            else if (wasOut != isOut) outOfBand += dt * 0.5;
            if (isOut && openStart is null)
            {
                openStart = time[i - 1] + (dt * Fraction(previousError, error, tolerance));
                openArea = 0;
            }

            if (openStart is not null) openArea += segmentArea;
            if (!isOut && openStart is { } start)
            {
                intervals.Add((start, time[i - 1] + (dt * Fraction(previousError, error, tolerance)), openArea));
                openStart = null;
            }
        }

        if (openStart is { } last && first >= 0) intervals.Add((last, time[count - 1], openArea));
        double window = crossings.Count > 1 ? 0.25 * (crossings[^1] - crossings[0]) / (crossings.Count - 1) : double.PositiveInfinity;
        double worst = 0, sum = 0, area = 0;
        int glitches = 0;
        foreach (var (start, end, a) in intervals)
        {
            bool nearCrossing = crossings.Any(c => Math.Abs(start - c) <= window || (start <= c && c <= end));
            if (!nearCrossing) continue;
            glitches++;
            double width = end - start;
            worst = Math.Max(worst, width);
            sum += width;
            area += a;
        }

        return new TransferError(worst, glitches > 0 ? sum / glitches : 0, glitches, glitches > 0 ? area / glitches : 0, total, outOfBand, peak);
    }

    /// <summary>Where between two points the error crosses the tolerance (linear), as a fraction of the interval.</summary>
    private static double Fraction(double a, double b, double level) => a == b ? 0.5 : Math.Clamp((level - a) / (b - a), 0, 1);
}
