using DesignRules.Diagnostics;
using DesignRules.Elaboration;
using DesignRules.Model;
using DesignRules.Simulation;

namespace DesignRules.Figures.Tolerance;

/// <summary>What one variable of a stage adds to a figure, and where in the design it is written.</summary>
/// <param name="What">How a message names it ("resistor rf", "amplifier u1 offset").</param>
/// <param name="Group">resistors, offsets, bias currents or diodes.</param>
/// <param name="Span">The YAML node to change.</param>
/// <param name="Plus">Figure change with the variable at +1 (its upper extreme).</param>
/// <param name="Minus">Figure change with it at −1 (not measured for resistors: NaN).</param>
internal sealed record Contribution(string What, string Group, SourceSpan Span, double Plus, double Minus)
{
    public double Size => Math.Max(Abs(Plus), Abs(Minus));

    private static double Abs(double v) => double.IsNaN(v) ? 0 : Math.Abs(v);
}

/// <summary>
/// Extreme-value worst case of one stage's DC transfer. Resistors: every vertex of the tolerance box (2^n corners for up to
/// <see cref="MaxEnumerated"/> toleranced resistors; beyond that the two vertices per figure that its one-at-a-time
/// sensitivities point to). Amplifier offset voltages and bias currents (at ± their maxima) and diode forward voltages (at
/// ± <see cref="DiodeSpread.ForwardVoltage"/>) are superposed: each is applied alone at both signs with the resistors
/// nominal and its change of every figure is added to the resistor range — exact for offsets and bias currents in a
/// linear stage, first order otherwise.
/// </summary>
internal sealed class WorstCaseAnalysis
{
    public const int MaxEnumerated = 10;

    public required StageProbe Stage { get; init; }

    public required ToleranceVariables Variables { get; init; }

    public required TransferPlan Plan { get; init; }

    /// <summary>
    /// The stage's chain compiled once with every variable nominal: <c>Circuit.Measure(variation)</c> gives the DC transfer
    /// at any corner (<see cref="ToleranceVariables.Nominal"/> with some variables set to ±1) or sample, warm-started.
    /// </summary>
    public required ToleranceCircuit Circuit { get; init; }

    public required TransferTarget Target { get; init; }

    public required AccuracyMetric Metric { get; init; }

    public required StageFigures Nominal { get; init; }

    /// <summary>Per level: the range of the deviation from the target, V.</summary>
    public required Interval[] Deviations { get; init; }

    public required Interval Gain { get; init; }

    public required Interval Mismatch { get; init; }

    public required Interval CommonModeShift { get; init; }

    /// <summary>The smallest common-mode rejection over the resistor corners (infinite when not measured).</summary>
    public required double WorstCommonModeRejection { get; init; }

    /// <summary>Resistor corners evaluated.</summary>
    public required int Corners { get; init; }

    /// <summary>True when the corners were chosen by sensitivity rather than enumerated.</summary>
    public required bool BySensitivity { get; init; }

    /// <summary>Per variable, the change of every figure it causes alone.</summary>
    public required IReadOnlyList<(ResistorVariable? Resistor, int Amplifier, string Kind, int Diode, StageFigures Plus, StageFigures? Minus)> Singles { get; init; }

    /// <summary>
    /// How much the extreme-value corners (every variable at its worst together) add to the output offset beyond the
    /// resistor corners plus the error sources superposed at nominal resistors: the cross terms such as bias current ×
    /// resistor mismatch, V.
    /// </summary>
    public double CrossTerm { get; init; }

    /// <summary>The first failed run, if any (the figures are then those of the runs that succeeded).</summary>
    public SimulationFailure? Failure { get; init; }

    public ElaboratedChain? FailedChain { get; init; }

    /// <summary>Worst relative transfer error and the level it occurs at.</summary>
    public (double Error, int Index) TransferError => Metric.WorstOf(Deviations, Nominal);

    /// <summary>Worst output offset (deviation at zero input), V.</summary>
    public double OutputOffset => Deviations[Plan.ZeroIndex].Magnitude;

    /// <summary>
    /// The variables' contributions to a figure: each resistor's one-at-a-time change, each error source's change.
    /// </summary>
    public IEnumerable<Contribution> ContributionsTo(Func<StageFigures, double> figure, Design design)
    {
        double n = figure(Nominal);
        foreach (var s in Singles)
        {
            double plus = figure(s.Plus) - n;
            double minus = s.Minus is null ? double.NaN : figure(s.Minus) - n;
            if (s.Resistor is { } r)
            {
                yield return new Contribution($"resistor {r.Name}", "resistors", r.Span, plus, minus);
            }
            else if (s.Amplifier >= 0)
            {
                var a = Stage.Amplifiers.Single(p => p.ElementId == Variables.Amplifiers[s.Amplifier].ElementId);
                var group = s.Kind switch { "offset" => "offsets", "bias current" => "bias currents", _ => "offset currents" };
                yield return new Contribution($"amplifier {a.Slot} {s.Kind}", group, ToleranceSpans.Amplifier(design, Stage, a.Slot), plus, minus);
            }
            else
            {
                var d = Stage.Diodes.Single(p => p.ElementId == Variables.Diodes[s.Diode].ElementId);
                yield return new Contribution($"diode {d.Slot} forward voltage", "diodes", ToleranceSpans.Diode(Stage, d.Slot), plus, minus);
            }
        }
    }

    /// <summary>
    /// The temperature the figures are taken at, °C: the reference 25 °C without a declared range, else the end or middle
    /// of the range where the worst transfer error occurs.
    /// </summary>
    public double Temperature { get; init; } = TemperatureBehaviour.Reference;

    /// <summary>The design's operating range (°C) when it declares one; null for 25 °C only.</summary>
    public (double Low, double High)? TemperatureRange { get; init; }

    /// <summary>With a declared range: the analysis at its low end, middle and high end (in that order); else empty.</summary>
    public IReadOnlyList<WorstCaseAnalysis> AtTemperatures { get; init; } = [];

    /// <summary>
    /// The temperature (°C) at which <paramref name="figure"/> is largest, or null without a declared range: the worst
    /// end (or the middle) a finding names.
    /// </summary>
    public double? WorstTemperatureOf(Func<WorstCaseAnalysis, double> figure)
    {
        if (AtTemperatures.Count == 0) return null;
        var worst = AtTemperatures.Where(a => !double.IsNaN(figure(a))).MaxBy(figure);
        return worst?.Temperature;
    }

    /// <summary>
    /// How much the amplifiers' offset drift moves the output offset at the worst end of the range, V: per amplifier, its
    /// offset's change of the output at that temperature times the drift's share of its offset extreme there,
    /// TCVos·|ΔT| / (Vos,max + TCVos·|ΔT|) — that is TCVos·|ΔT| times the offset's gain to the output (the noise gain).
    /// 0 without a declared range or a stated drift.
    /// </summary>
    public double OffsetDrift => AtTemperatures.Count == 0 ? 0 : AtTemperatures.Max(a => a.OwnOffsetDrift());

    private double OwnOffsetDrift()
    {
        double total = 0;
        foreach (var s in Singles.Where(s => s.Amplifier >= 0 && s.Kind == "offset" && s.Minus is not null))
        {
            var a = Variables.Amplifiers[s.Amplifier];
            double extreme = TemperatureBehaviour.Offset(a, Temperature);
            if (!(extreme > 0)) continue;
            double change = Math.Max(Math.Abs(s.Plus.Deviations[Plan.ZeroIndex] - Nominal.Deviations[Plan.ZeroIndex]),
                Math.Abs(s.Minus!.Deviations[Plan.ZeroIndex] - Nominal.Deviations[Plan.ZeroIndex]));
            total += change * (extreme - a.MaximumOffset) / extreme;
        }

        return total;
    }

    /// <summary>
    /// Runs the analysis of one stage of the nominal chain: at 25 °C, or, where the design declares an operating range,
    /// at its low end, middle and high end on the same compiled circuit, combined into one worst case.
    /// </summary>
    public static WorstCaseAnalysis Run(Design design, ElaboratedChain nominalChain, StageProbe stage, Interval? dynamic, int maxDegreeOfParallelism = -1)
    {
        var baseline = nominalChain.Options;
        var variables = ToleranceVariables.Of(stage, baseline);
        var plan = TransferPlan.Of(nominalChain, stage);
        var target = TransferTarget.Of(stage);
        var circuit = ToleranceCircuit.Of(design, baseline, variables, plan);
        if (design.Temperature is not { } range)
        {
            return RunAt(stage, dynamic, variables, plan, target, circuit, maxDegreeOfParallelism);
        }

        double low = range.Value.Low.Value, high = range.Value.High.Value;
        var runs = new[] { low, (low + high) / 2, high }
            .Select(t => RunAt(stage, dynamic, variables.At(t), plan, target, circuit, maxDegreeOfParallelism)).ToArray();
        return Combine(runs, (low, high));
    }

    /// <summary>
    /// One analysis per temperature combined: the figures of the temperature with the worst transfer error (its
    /// contributions explain a finding), every range widened to cover all temperatures.
    /// </summary>
    private static WorstCaseAnalysis Combine(WorstCaseAnalysis[] runs, (double Low, double High) range)
    {
        var basis = runs.Where(r => !double.IsNaN(r.TransferError.Error)).MaxBy(r => r.TransferError.Error) ?? runs[1];
        var deviations = (Interval[])basis.Deviations.Clone();
        var gain = basis.Gain;
        var mismatch = basis.Mismatch;
        var shift = basis.CommonModeShift;
        foreach (var r in runs.Where(r => r.Failure is null && r.Deviations.Length == deviations.Length))
        {
            for (int i = 0; i < deviations.Length; i++) deviations[i] = deviations[i].Include(r.Deviations[i].Low).Include(r.Deviations[i].High);
            gain = gain.Include(r.Gain.Low).Include(r.Gain.High);
            mismatch = mismatch.Include(r.Mismatch.Low).Include(r.Mismatch.High);
            shift = shift.Include(r.CommonModeShift.Low).Include(r.CommonModeShift.High);
        }

        var failed = runs.FirstOrDefault(r => r.Failure is not null);
        return new WorstCaseAnalysis
        {
            Stage = basis.Stage, Variables = basis.Variables, Plan = basis.Plan, Circuit = basis.Circuit, Target = basis.Target,
            Metric = basis.Metric, Nominal = basis.Nominal, Deviations = deviations, Gain = gain, Mismatch = mismatch,
            CommonModeShift = shift, WorstCommonModeRejection = runs.Min(r => r.WorstCommonModeRejection),
            Corners = runs.Sum(r => r.Corners), BySensitivity = basis.BySensitivity, Singles = basis.Singles,
            CrossTerm = runs.Max(r => r.CrossTerm), Failure = failed?.Failure, FailedChain = failed?.FailedChain,
            Temperature = basis.Temperature, TemperatureRange = range, AtTemperatures = runs,
        };
    }

    /// <summary>The analysis with every variable's extreme taken at <paramref name="variables"/>' temperature.</summary>
    private static WorstCaseAnalysis RunAt(
        StageProbe stage, Interval? dynamic, ToleranceVariables variables, TransferPlan plan, TransferTarget target, ToleranceCircuit circuit,
        int maxDegreeOfParallelism)
    {
        var toleranced = variables.Toleranced.ToArray();

        // Runs: nominal, each toleranced resistor alone at +1, each error source alone at ±1.
        var runs = new List<Variation> { variables.Nominal };
        var singles = new List<(int Resistor, int Amplifier, string Kind, int Diode, int Plus, int Minus)>();
        foreach (int r in toleranced)
        {
            var v = variables.Nominal;
            v.Resistors[r] = 1;
            singles.Add((r, -1, "resistor", -1, runs.Count, -1));
            runs.Add(v);
        }

        for (int a = 0; a < variables.Amplifiers.Count; a++)
        {
            string[] kinds = variables.Amplifiers[a].MaximumOffsetCurrent > 0 ? ["offset", "bias current", "offset current"] : ["offset", "bias current"];
            foreach (var kind in kinds)
            {
                int plus = runs.Count;
                foreach (double sign in new[] { 1.0, -1.0 })
                {
                    var v = variables.Nominal;
                    (kind switch { "offset" => v.Offsets, "bias current" => v.Biases, _ => v.OffsetCurrents })[a] = sign;
                    runs.Add(v);
                }

                singles.Add((-1, a, kind, -1, plus, plus + 1));
            }
        }

        for (int d = 0; d < variables.Diodes.Count; d++)
        {
            int plus = runs.Count;
            foreach (double sign in new[] { 1.0, -1.0 })
            {
                var v = variables.Nominal;
                v.Diodes[d] = sign;
                runs.Add(v);
            }

            singles.Add((-1, -1, "diode", d, plus, plus + 1));
        }

        var first = Evaluate(circuit, runs, maxDegreeOfParallelism);
        var nominalTransfer = first[0];
        if (!nominalTransfer.Succeeded)
        {
            return Empty(stage, variables, plan, target, circuit, nominalTransfer);
        }

        var metric = AccuracyMetric.Of(target, nominalTransfer, dynamic);
        var figures = first.Select(t => t.Succeeded ? StageFigures.Of(t, target, plan) : null).ToArray();
        var nominal = figures[0]!;

        // Resistor corners: every vertex, or those the sensitivities point to.
        var corners = new List<Variation>();
        bool bySensitivity = toleranced.Length > MaxEnumerated;
        if (!bySensitivity)
        {
            for (int mask = 0; mask < (1 << toleranced.Length); mask++)
            {
                var v = variables.Nominal;
                for (int b = 0; b < toleranced.Length; b++) v.Resistors[toleranced[b]] = (mask & (1 << b)) != 0 ? 1 : -1;
                corners.Add(v);
            }
        }
        else
        {
            var seen = new HashSet<string>(StringComparer.Ordinal);
            foreach (var field in Fields(nominal))
            {
                foreach (double direction in new[] { 1.0, -1.0 })
                {
                    var v = variables.Nominal;
                    for (int k = 0; k < toleranced.Length; k++)
                    {
                        var single = figures[1 + k];
                        double slope = single is null ? 0 : field(single) - field(nominal);
                        v.Resistors[toleranced[k]] = direction * (slope >= 0 ? 1 : -1);
                    }

                    if (seen.Add(string.Join(',', v.Resistors)))
                    {
                        corners.Add(v);
                    }
                }
            }
        }

        var cornerRuns = Evaluate(circuit, corners, maxDegreeOfParallelism);
        var cornerFigures = cornerRuns.Where(t => t.Succeeded).Select(t => StageFigures.Of(t, target, plan)).ToList();
        cornerFigures.Add(nominal);

        var deviations = Enumerable.Range(0, plan.Levels.Length)
            .Select(i => cornerFigures.Aggregate(Interval.Point(nominal.Deviations[i]), (acc, f) => acc.Include(f.Deviations[i]))).ToArray();
        var gain = cornerFigures.Aggregate(Interval.Point(nominal.Gain), (acc, f) => acc.Include(f.Gain));
        var mismatch = cornerFigures.Aggregate(Interval.Point(nominal.Mismatch), (acc, f) => acc.Include(f.Mismatch));
        var shift = cornerFigures.Aggregate(Interval.Point(nominal.CommonModeShift), (acc, f) => acc.Include(f.CommonModeShift));
        double cmrr = cornerFigures.Min(f => f.CommonModeRejection);

        var singleFigures = new List<(ResistorVariable?, int, string, int, StageFigures, StageFigures?)>();
        foreach (var s in singles)
        {
            var plus = figures[s.Plus];
            var minus = s.Minus >= 0 ? figures[s.Minus] : null;
            if (plus is null || (s.Minus >= 0 && minus is null)) continue;
            singleFigures.Add((s.Resistor >= 0 ? variables.Resistors[s.Resistor] : null, s.Amplifier, s.Kind, s.Diode, plus, minus));
            if (s.Resistor >= 0) continue;

            // Superpose the error source on the resistor range.
            for (int i = 0; i < deviations.Length; i++)
            {
                deviations[i] = deviations[i].Widen(plus.Deviations[i] - nominal.Deviations[i], minus!.Deviations[i] - nominal.Deviations[i]);
            }

            gain = gain.Widen(plus.Gain - nominal.Gain, minus!.Gain - nominal.Gain);
            mismatch = mismatch.Widen(plus.Mismatch - nominal.Mismatch, minus.Mismatch - nominal.Mismatch);
        }

        // Extreme-value analysis over every variable together: at each resistor corner, every error source at the sign
        // that moves the output at the bias level up, and every one at the sign that moves it down. Superposition at
        // nominal resistors misses the cross terms (bias current × resistor mismatch, which a compensation resistor
        // cancels only at nominal values); every combined run is a feasible point of the variable box, so it only widens.
        var combined = CombinedCorners(variables, corners, singles, figures, plan.ZeroIndex);
        var combinedRuns = Evaluate(circuit, combined, maxDegreeOfParallelism);
        double superposedOffset = deviations[plan.ZeroIndex].Magnitude;
        foreach (var f in combinedRuns.Where(t => t.Succeeded).Select(t => StageFigures.Of(t, target, plan)))
        {
            for (int i = 0; i < deviations.Length; i++) deviations[i] = deviations[i].Include(f.Deviations[i]);
            gain = gain.Include(f.Gain);
            mismatch = mismatch.Include(f.Mismatch);
        }

        var failed = first.Concat(cornerRuns).Concat(combinedRuns).FirstOrDefault(t => !t.Succeeded);
        return new WorstCaseAnalysis
        {
            Stage = stage,
            Variables = variables,
            Plan = plan,
            Circuit = circuit,
            Target = target,
            Metric = metric,
            Nominal = nominal,
            Deviations = deviations,
            Gain = gain,
            Mismatch = mismatch,
            CommonModeShift = shift,
            WorstCommonModeRejection = cmrr,
            Corners = corners.Count,
            BySensitivity = bySensitivity,
            Singles = singleFigures,
            CrossTerm = Math.Max(0, deviations[plan.ZeroIndex].Magnitude - superposedOffset),
            Failure = failed?.Failure,
            FailedChain = failed?.Chain,
            Temperature = variables.Temperature,
        };
    }

    /// <summary>
    /// Per resistor corner, two assignments of every error source (offsets, bias and offset currents, diode forward
    /// voltages) at ± its extreme: the signs that raise the output at the bias level, and the signs that lower it (each
    /// source's sign from its own runs at nominal resistors). None when the stage has no error source.
    /// </summary>
    private static List<Variation> CombinedCorners(
        ToleranceVariables variables, List<Variation> corners, List<(int Resistor, int Amplifier, string Kind, int Diode, int Plus, int Minus)> singles,
        StageFigures?[] figures, int bias)
    {
        var sources = singles.Where(s => s.Resistor < 0 && figures[s.Plus] is not null && figures[s.Minus] is not null)
            .Select(s => (s.Amplifier, s.Kind, s.Diode, Sign: figures[s.Plus]!.Deviations[bias] >= figures[s.Minus]!.Deviations[bias] ? 1.0 : -1.0))
            .ToList();
        var combined = new List<Variation>();
        if (sources.Count == 0)
        {
            return combined;
        }

        foreach (var corner in corners.Append(variables.Nominal))
        {
            foreach (double direction in new[] { 1.0, -1.0 })
            {
                var v = variables.Nominal;
                Array.Copy(corner.Resistors, v.Resistors, v.Resistors.Length);
                foreach (var (amplifier, kind, diode, sign) in sources)
                {
                    if (diode >= 0) v.Diodes[diode] = direction * sign;
                    else (kind switch { "offset" => v.Offsets, "bias current" => v.Biases, _ => v.OffsetCurrents })[amplifier] = direction * sign;
                }

                combined.Add(v);
            }
        }

        return combined;
    }

    /// <summary>Runs the variations side by side; results are in the order of <paramref name="runs"/>.</summary>
    /// <remarks>A run with every variable nominal is the circuit's cold nominal solve itself.</remarks>
    internal static DcTransfer[] Evaluate(ToleranceCircuit circuit, IReadOnlyList<Variation> runs, int maxDegreeOfParallelism)
    {
        var results = new DcTransfer[runs.Count];
        Parallel.For(0, runs.Count, new ParallelOptions { MaxDegreeOfParallelism = maxDegreeOfParallelism, TaskScheduler = TaskScheduler.Current },
            i => results[i] = IsNominal(runs[i]) ? circuit.Nominal : circuit.Measure(runs[i]));
        return results;
    }

    private static bool IsNominal(Variation v) =>
        v.Temperature == TemperatureBehaviour.Reference && v.Resistors.All(u => u == 0) && v.Offsets.All(u => u == 0) && v.Biases.All(u => u == 0) && v.Diodes.All(u => u == 0) && v.OffsetCurrents.All(u => u == 0);

    private static IEnumerable<Func<StageFigures, double>> Fields(StageFigures nominal)
    {
        for (int i = 0; i < nominal.Deviations.Length; i++)
        {
            int level = i;
            yield return f => f.Deviations[level];
        }

        yield return f => f.Gain;
        yield return f => f.Mismatch;
        yield return f => f.CommonModeShift;
    }

    private static WorstCaseAnalysis Empty(StageProbe stage, ToleranceVariables variables, TransferPlan plan, TransferTarget target, ToleranceCircuit circuit, DcTransfer failed)
    {
        var nothing = new StageFigures(new double[plan.Levels.Length], double.NaN, double.NaN, 0, double.PositiveInfinity);
        return new WorstCaseAnalysis
        {
            Stage = stage, Variables = variables, Plan = plan, Circuit = circuit, Target = target,
            Metric = new AccuracyMetric([], double.NaN, null, 0), Nominal = nothing,
            Deviations = new Interval[plan.Levels.Length], Gain = Interval.Point(double.NaN), Mismatch = Interval.Point(double.NaN),
            CommonModeShift = Interval.Point(0), WorstCommonModeRejection = double.PositiveInfinity, Corners = 0, BySensitivity = false,
            Singles = [], Failure = failed.Failure, FailedChain = failed.Chain, Temperature = variables.Temperature,
        };
    }
}
