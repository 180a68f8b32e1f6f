using DesignRules.Elaboration;
using DesignRules.Model;
using DesignRules.Simulation;

namespace DesignRules.Figures.Tolerance;

/// <summary>
/// Where a stage's DC transfer is measured: the source emf replaced by DC levels (the waveform's lowest and highest value,
/// its mean and its DC level, and zero when the signal passes through it), so every later stage sees its input at ±Vp scaled by the stages before it; and, for a difference
/// stage fed from a split source, the common-mode source stepped from 0 V to the source's common-mode level.
/// </summary>
/// <param name="StageId">The stage measured.</param>
/// <param name="Levels">Source emf levels, V, ascending: only levels the signal spans (0 V among them when it spans it).</param>
/// <param name="ZeroIndex">
/// Index of the level the output offset is judged at: 0 V, or the source's DC level (the intended bias) when the signal
/// never visits 0 V.
/// </param>
/// <param name="CommonMode">The common-mode level to step to, V, for a split-fed difference stage (1 V when the source states 0 V); null otherwise.</param>
internal sealed record TransferPlan(string StageId, double[] Levels, int ZeroIndex, double? CommonMode)
{
    /// <summary>Id of the common-mode source the elaborator adds for a split source.</summary>
    public const string CommonModeSourceId = "source.cm";

    public static TransferPlan Of(ElaboratedChain chain, StageProbe stage)
    {
        var waveform = chain.SourceWaveform;
        var levels = new List<double> { 0, waveform.DcValue };
        // The level the offset is judged at: 0 V, or the source's own DC level (its intended bias) when the signal never
        // visits 0 V — a single-supply stage biased at mid-supply is not judged at a resting level it never sees.
        double bias = 0;
        if (chain.Period is { } period && period > 0)
        {
            double low = double.PositiveInfinity, high = double.NegativeInfinity;
            const int points = 4096;
            for (int i = 0; i < points; i++)
            {
                double v = waveform.ValueAt(period * i / points);
                low = Math.Min(low, v);
                high = Math.Max(high, v);
            }

            levels.Add(low);
            levels.Add(high);
            levels.Add((low + high) / 2);
            double margin = 1e-9 * Math.Max(Math.Abs(low), Math.Abs(high));
            if (low > margin || high < -margin)
            {
                // Only the levels the signal spans (offset ± amplitude): 0 V lies outside it.
                bias = waveform.DcValue;
                levels.RemoveAt(0);
            }
        }

        // Two small levels either side of the bias (a tenth of the span) give a linear stage's gain where its extreme
        // levels clip at a tolerance corner: the worst-case gain is the corner's linear gain, not a clipped ratio.
        if (TransferTarget.Of(stage).IsLinear && levels.Count > 2)
        {
            double spread = 0.1 * (levels.Max() - levels.Min()) / 2;
            if (spread > 0)
            {
                levels.Add(bias - spread);
                levels.Add(bias + spread);
            }
        }

        // A peak detector holds positive peaks: its negative levels say nothing and are hard to solve (its loop is open).
        bool positiveOnly = TransferTarget.Of(stage).Kind == TransferKind.Peak;
        // Levels closer than a part in 1e9 of the largest are one level; the bias level (0 V or the DC level) is always kept exactly, however small the
        // signal (a merge once dropped it for a 1 pV source or a sum whose mean is a rounding error off zero).
        var candidates = levels.Where(l => !positiveOnly || l >= 0).ToList();
        double tolerance = 1e-9 * candidates.Select(Math.Abs).DefaultIfEmpty(0).Max();
        var distinct = new List<double> { bias };
        foreach (var level in candidates.OrderBy(Math.Abs))
        {
            if (distinct.TrueForAll(kept => Math.Abs(level - kept) > tolerance))
            {
                distinct.Add(level);
            }
        }

        distinct.Sort();
        double? commonMode = !Circuit.IsReference(stage.ReferenceInputNode) && chain.Design.Source.CommonMode is { } cm
            ? (cm.Value.Value != 0 ? cm.Value.Value : 1.0)
            : null;
        return new TransferPlan(stage.StageId, [.. distinct], distinct.FindIndex(l => l == bias), commonMode);
    }
}

/// <summary>
/// One measurement of a stage's DC transfer: its input (differential for a split-fed stage) and output at every level of
/// the plan, and the output shift when the common-mode level is applied.
/// </summary>
/// <param name="Inputs">Stage input voltage at each level, V.</param>
/// <param name="Outputs">Stage output voltage at each level, V.</param>
/// <param name="CommonModeShift">Output change from 0 V to the plan's common-mode level, V (0 when not measured).</param>
/// <param name="Failure">Why the measurement failed, if it did.</param>
/// <param name="Chain">The chain measured (to locate a failure).</param>
internal sealed record DcTransfer(double[] Inputs, double[] Outputs, double CommonModeShift, SimulationFailure? Failure, ElaboratedChain Chain)
{
    /// <summary>
    /// Per level: true when an amplifier of the stage sits at (within 2 % of the supply span of) its swing limit there, so
    /// that the level says nothing about the stage's linear gain. Empty when not measured.
    /// </summary>
    public bool[] Clipped { get; init; } = [];

    public bool Succeeded => Failure is null;

    /// <summary>Elaborates the design with <paramref name="options"/> and measures the plan's stage.</summary>
    public static DcTransfer Measure(Design design, ElaborationOptions options, TransferPlan plan)
    {
        var chain = ChainElaborator.Elaborate(design, options);
        if (!chain.Succeeded)
        {
            var problem = chain.Problems[0];
            return Failed(chain, new SimulationFailure(FailureKind.UnusableRequest, problem.Message) { ElementId = problem.ElementId });
        }

        var stage = chain.Stage(plan.StageId);
        if (stage is null)
        {
            return Failed(chain, new SimulationFailure(FailureKind.UnusableRequest, $"stage '{plan.StageId}' is not in the chain"));
        }

        var sweep = Simulate.DcSweep(chain.Circuit, chain.SourceId, plan.Levels);
        if (!sweep.Succeeded)
        {
            return Failed(chain, sweep.Failure!);
        }

        var input = sweep.Voltage(stage.InputNode);
        var outputs = sweep.Voltage(stage.OutputNode);
        var inputs = input;
        if (!Circuit.IsReference(stage.ReferenceInputNode))
        {
            var reference = sweep.Voltage(stage.ReferenceInputNode);
            inputs = input.Select((v, i) => v - reference[i]).ToArray();
        }

        double shift = 0;
        if (plan.CommonMode is { } cm)
        {
            var common = Simulate.DcSweep(chain.Circuit, TransferPlan.CommonModeSourceId, [0, cm]);
            if (!common.Succeeded)
            {
                return Failed(chain, common.Failure!);
            }

            var y = common.Voltage(stage.OutputNode);
            shift = y[1] - y[0];
        }

        return new DcTransfer(inputs, outputs, shift, null, chain) { Clipped = ClippedLevels(stage, sweep.Voltage, outputs.Length) };
    }

    /// <summary>
    /// Per level: whether an amplifier of <paramref name="stage"/> sits within 2 % of the supply span of its swing limit,
    /// read from the node voltages of a sweep of <paramref name="count"/> levels (see <see cref="Clipped"/>).
    /// </summary>
    internal static bool[] ClippedLevels(StageProbe stage, Func<string, double[]> voltage, int count)
    {
        var clipped = new bool[count];
        foreach (var amp in stage.Amplifiers)
        {
            var v = voltage(amp.OutputNode);
            double span = amp.Rails.Positive - amp.Rails.Negative, near = 0.02 * span;
            double high = amp.Rails.Positive - amp.Part.OutputHeadroom.Positive.Value.Value;
            double low = amp.Rails.Negative + amp.Part.OutputHeadroom.Negative.Value.Value;
            for (int i = 0; i < v.Length && i < clipped.Length; i++)
            {
                clipped[i] |= v[i] >= high - near || v[i] <= low + near;
            }
        }

        return clipped;
    }

    internal static DcTransfer Failed(ElaboratedChain chain, SimulationFailure failure) => new([], [], 0, failure, chain);
}
