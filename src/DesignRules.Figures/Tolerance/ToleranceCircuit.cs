using System.Collections.Concurrent;
using DesignRules.Elaboration;
using DesignRules.Model;
using DesignRules.Simulation;

namespace DesignRules.Figures.Tolerance;

/// <summary>
/// The chain of one stage's tolerance analysis, elaborated once with every variable at its nominal value and compiled
/// once per thread; a corner or a Monte Carlo sample (<see cref="Variation"/>) changes the element values of the compiled
/// circuit in place and re-solves the DC transfer warm, from the nominal solution at each level (see
/// <see cref="VariedDcSolver"/>), instead of elaborating and solving the whole design again from zero.
/// <para>Use: <c>circuit.Measure(variation)</c> gives the stage's DC transfer at that assignment of the variables, from any
/// thread; <see cref="Nominal"/> is the transfer with every variable nominal, solved cold exactly as before.</para>
/// </summary>
internal sealed class ToleranceCircuit
{
    private readonly ConcurrentBag<VariedDcSolver> solvers = [];
    private readonly double[] diodeSaturation;
    private readonly DcSolutions? reference;
    private readonly DcSolutions? referenceCommonMode;

    private ToleranceCircuit(ElaboratedChain chain, ToleranceVariables variables, TransferPlan plan)
    {
        Chain = chain;
        Variables = variables;
        Plan = plan;
        diodeSaturation = new double[variables.Diodes.Count];
        if (!chain.Succeeded)
        {
            var problem = chain.Problems[0];
            Nominal = DcTransfer.Failed(chain, new SimulationFailure(FailureKind.UnusableRequest, problem.Message) { ElementId = problem.ElementId });
            return;
        }

        var stage = chain.Stage(plan.StageId);
        if (stage is null)
        {
            Nominal = DcTransfer.Failed(chain, new SimulationFailure(FailureKind.UnusableRequest, $"stage '{plan.StageId}' is not in the chain"));
            return;
        }

        Probe = stage;
        var solver = VariedDcSolver.Compile(chain.Circuit, out var failure);
        if (solver is null)
        {
            Nominal = DcTransfer.Failed(chain, failure!);
            return;
        }

        FigureNodes = [stage.InputNode, stage.OutputNode, stage.ReferenceInputNode, .. stage.Amplifiers.Select(a => a.OutputNode)];
        for (int i = 0; i < diodeSaturation.Length; i++) diodeSaturation[i] = solver.DiodeSaturationCurrent(variables.Diodes[i].ElementId);

        // Only the stage's own nodes are read (Transfer below), so a sample's level is accepted once they have converged
        // even while a non-linear stage behind still settles (VariedDcSolver.SetFigureNodes, with its error bound); the
        // nominal sweeps below are cold and full, unaffected.
        solver.SetFigureNodes(FigureNodes);
        reference = solver.ReferenceSweep(chain.SourceId, plan.Levels);
        referenceCommonMode = plan.CommonMode is { } cm && reference.Succeeded ? solver.ReferenceSweep(TransferPlan.CommonModeSourceId, [0, cm]) : null;
        Nominal = Transfer(reference, referenceCommonMode);

        // A sample's warm sweeps are read (Transfer) before the solver goes back to the pool, so they may reuse its arrays.
        solver.ReuseSolutions = true;
        solvers.Add(solver);
    }

    /// <summary>The chain with every variable nominal (element ids and locations are those of every variation).</summary>
    public ElaboratedChain Chain { get; }

    public ToleranceVariables Variables { get; }

    public TransferPlan Plan { get; }

    /// <summary>The measured stage in <see cref="Chain"/>, or null when the chain could not be built.</summary>
    public StageProbe? Probe { get; }

    /// <summary>The DC transfer with every variable nominal.</summary>
    public DcTransfer Nominal { get; }

    /// <summary>The nodes <see cref="Transfer"/> reads: the stage's input, output, reference input and amplifier outputs.</summary>
    private string[] FigureNodes { get; set; } = [];

    /// <summary>
    /// Whether a sample's level is accepted once the stage's own nodes have converged (on; off only to compare with the
    /// engine's test on every unknown of the chain in tests).
    /// </summary>
    internal bool FigureFocus { get; set; } = true;

    /// <summary>Whether samples may take the engine's linearised steps (on; off only to compare with the full path in tests).</summary>
    internal bool Linearised { get; set; } = true;

    /// <summary>Elaborates the chain for a stage's variables on top of <paramref name="baseline"/> and solves it nominal.</summary>
    public static ToleranceCircuit Of(Design design, ElaborationOptions baseline, ToleranceVariables variables, TransferPlan plan) =>
        new(ChainElaborator.Elaborate(design, variables.Options(baseline, variables.Nominal)), variables, plan);

    /// <summary>The stage's DC transfer with the variables at <paramref name="v"/>; thread-safe.</summary>
    public DcTransfer Measure(Variation v)
    {
        if (!Nominal.Succeeded || reference is null) return Nominal;
        if (!solvers.TryTake(out var solver))
        {
            solver = VariedDcSolver.Compile(Chain.Circuit, out var failure);
            if (solver is null) return DcTransfer.Failed(Chain, failure!);
            solver.SetFigureNodes(FigureNodes);
            solver.ReuseSolutions = true;
        }

        try
        {
            solver.Linearised = Linearised;

            solver.StopAtFigureNodes = FigureFocus;
            Apply(solver, v);
            var levels = solver.Sweep(Chain.SourceId, Plan.Levels, reference);
            DcSolutions? common = null;
            if (levels.Succeeded && Plan.CommonMode is { } cm)
            {
                common = referenceCommonMode is { Succeeded: true }
                    ? solver.Sweep(TransferPlan.CommonModeSourceId, [0, cm], referenceCommonMode)
                    : solver.Sweep(TransferPlan.CommonModeSourceId, [0, cm]);
            }

            return Transfer(levels, common);
        }
        finally
        {
            solvers.Add(solver);
        }
    }

    /// <summary>Sets every variable's element in the compiled circuit (the nominal value where the variable is 0).</summary>
    private void Apply(VariedDcSolver solver, Variation v)
    {
        var resistors = Variables.Resistors;
        for (int i = 0; i < resistors.Count; i++)
        {
            var r = resistors[i];
            solver.SetResistance(r.ElementId, r.Tolerance > 0 && v.Resistors[i] != 0 ? r.Nominal * (1 + (v.Resistors[i] * TemperatureBehaviour.ResistorSpread(r, v.Temperature))) : r.Nominal);
        }

        var amplifiers = Variables.Amplifiers;
        for (int i = 0; i < amplifiers.Count; i++)
        {
            var a = amplifiers[i];
            double growth = TemperatureBehaviour.BiasGrowth(a, v.Temperature);
            double ib = v.Biases[i] * a.MaximumBias * growth;
            double ios = v.OffsetCurrents[i] * a.MaximumOffsetCurrent * growth;
            solver.SetAmplifierInputs(a.ElementId, v.Offsets[i] * TemperatureBehaviour.Offset(a, v.Temperature), ib + (ios / 2), ib - (ios / 2));
        }

        var diodes = Variables.Diodes;
        for (int i = 0; i < diodes.Count; i++)
        {
            double shift = (v.Diodes[i] * DiodeSpread.ForwardVoltage) + TemperatureBehaviour.DiodeShift(diodes[i], v.Temperature);
            double scale = shift != 0 ? DiodeSpread.SaturationScale(diodes[i], shift) : 1;
            solver.SetDiodeSaturationCurrent(diodes[i].ElementId, diodeSaturation[i] * scale);
        }
    }

    private DcTransfer Transfer(DcSolutions levels, DcSolutions? common)
    {
        if (!levels.Succeeded) return DcTransfer.Failed(Chain, levels.Failure!);
        if (common is { Succeeded: false }) return DcTransfer.Failed(Chain, common.Failure!);
        var stage = Probe!;
        var inputs = levels.Voltage(stage.InputNode);
        var outputs = levels.Voltage(stage.OutputNode);
        if (!Circuit.IsReference(stage.ReferenceInputNode))
        {
            var referenceInput = levels.Voltage(stage.ReferenceInputNode);
            for (int i = 0; i < inputs.Length; i++) inputs[i] -= referenceInput[i];
        }

        double shift = 0;
        if (common is not null)
        {
            var y = common.Voltage(stage.OutputNode);
            shift = y[1] - y[0];
        }

        // The same clipping marks as a cold measurement, so the worst-case gain stays the corner's linear gain.
        return new DcTransfer(inputs, outputs, shift, null, Chain) { Clipped = DcTransfer.ClippedLevels(stage, levels.Voltage, outputs.Length) };
    }
}
