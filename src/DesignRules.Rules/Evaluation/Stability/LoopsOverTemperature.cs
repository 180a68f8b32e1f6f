using DesignRules.Figures.Stability;

namespace DesignRules.Rules.Evaluation.Stability;

/// <summary>
/// Which loop a stability rule judges where a part states a <c>gbw-derating</c> and the design a temperature range: the
/// 25 °C loop, or the loop at an end of the range where some GBW rises (<see cref="DesignAnalyses.GbwEnds"/>), whichever
/// is worse by the rule's own measure. A higher GBW moves the crossover up towards the second pole and the pole of the
/// output resistance with a capacitive load, so phase margin and peaking are worst where GBW is highest (Franco, Design
/// with Operational Amplifiers, §8.4); without a derating only the 25 °C loop is judged, as before.
/// </summary>
internal static class LoopsOverTemperature
{
    /// <summary>
    /// The closed loop of an amplifier that is worst by <paramref name="badness"/> (larger is worse) over 25 °C and the
    /// GBW-raising ends, with the temperature it was found at (null: 25 °C) and that end's variant of the chain (null: the
    /// nominal chain); null when the loop is closed nowhere.
    /// </summary>
    public static (AmplifierLoop Loop, LoopMargins Margins, double? At, GbwAtTemperature? End)? Worst(DesignEvaluation evaluation, string stageId, string slot, Func<LoopMargins, double> badness)
    {
        var candidates = new List<(LoopGainFigures Figures, GbwAtTemperature? End)> { (evaluation.Analyses.LoopGains, null) };
        foreach (var end in evaluation.Analyses.GbwEnds.Where(e => e.Raises))
        {
            var figures = evaluation.Analyses.LoopGainsAt(end);
            if (figures.Failure is null)
            {
                candidates.Add((figures, end));
            }
        }

        (AmplifierLoop Loop, LoopMargins Margins, double? At, GbwAtTemperature? End)? worst = null;
        foreach (var (figures, end) in candidates)
        {
            if (figures.Of(stageId, slot) is { Loop.Margins: { State: LoopState.Closed } m } loop && (worst is null || badness(m) > badness(worst.Value.Margins)))
            {
                worst = (loop, m, end?.Celsius, end);
            }
        }

        return worst;
    }
}
