using System.Numerics;

namespace DesignRules.Simulation.Elements;

/// <summary>A behavioural amplifier (see <see cref="AmplifierModel"/>) with inputs NonInverting, Inverting and an Output node.</summary>
internal sealed record AmplifierDefinition(string Id, string NonInverting, string Inverting, string Output, AmplifierModel Model, SupplyRails Rails)
    : ElementDefinition(Id)
{
    public override IEnumerable<string> Nodes => [NonInverting, Inverting, Output];

    /// <summary>The output stage drives its node from a ground-referred source; the inputs draw only bias currents.</summary>
    public override IEnumerable<(string A, string B)> DcPaths => [(Output, Circuit.Ground)];

    public override bool ReportsCurrent => true;

    public override string? Validate() => Model is null || Rails is null ? "amplifier model or rails missing" : Rails.Validate() ?? Model.Validate(Rails);

    public override Device Compile(CircuitLayout layout)
    {
        int p = layout.Node(NonInverting), m = layout.Node(Inverting), o = layout.Node(Output);
        var parameters = new AmplifierParameters(Model, Rails);
        int x = layout.ModelState(Id, "drive");
        int xState = layout.IntegratedState(Id, parameters.DriveTimeScale);
        int y = -1, yState = -1, memory = -1, memoryState = -1;
        if (parameters.SecondPoleTime > 0)
        {
            y = layout.ModelState(Id, "second-pole");
            yState = layout.IntegratedState(Id, parameters.SecondPoleTime);
        }

        if (parameters.RecoveryDecayRate > 0)
        {
            memory = layout.ModelState(Id, "overload-memory");
            memoryState = layout.IntegratedState(Id, 1e6);
        }

        return new AmplifierDevice(Id, parameters, new AmplifierNodes(p, m, o, x, xState, y, yState, memory, memoryState)) { OutputName = Output };
    }
}

/// <summary>Unknown and state indices of one compiled amplifier.</summary>
internal readonly record struct AmplifierNodes(int Plus, int Minus, int Output, int Drive, int DriveState, int SecondPole, int SecondPoleState, int Memory, int MemoryState)
{
    /// <summary>Unknown that feeds the output stage.</summary>
    public int Stage => SecondPole >= 0 ? SecondPole : Drive;
}

/// <summary>Derived constants of an amplifier model at given rails.</summary>
internal sealed class AmplifierParameters
{
    /// <summary>Width of the smooth swing clamp, in V.</summary>
    public const double ClampWidth = 1e-3;

    public AmplifierParameters(AmplifierModel model, SupplyRails rails)
    {
        Model = model;
        Rails = rails;
        UnityOmega = 2 * Math.PI * model.GainBandwidth;
        PoleOmega = UnityOmega / model.OpenLoopGain;
        DriveTimeScale = 1 / UnityOmega;
        High = rails.Positive - model.SwingHeadroomPositive;
        Low = rails.Negative + model.SwingHeadroomNegative;
        double maxSlew = Math.Max(model.SlewRateRising, model.SlewRateFalling);
        ClampRate = 1000 * maxSlew;
        ActivityScale = 0.1 * maxSlew;
        GateScale = 0.01 * maxSlew;
        SecondPoleTime = model.SecondPoleFrequency is { } f2 ? 1 / (2 * Math.PI * f2) : 0;
        RecoveryDecayRate = model.OverloadRecoveryTime > 0 ? Math.Log(2) / model.OverloadRecoveryTime : 0;
        CurrentLimit = model.OutputCurrentLimit ?? double.PositiveInfinity;
    }

    public AmplifierModel Model { get; }

    public SupplyRails Rails { get; }

    /// <summary>ωu = 2π·GBW.</summary>
    public double UnityOmega { get; }

    /// <summary>ωp = ωu/A0.</summary>
    public double PoleOmega { get; }

    /// <summary>1/ωu: scale of the drive equation (makes its input coefficient of order one).</summary>
    public double DriveTimeScale { get; }

    /// <summary>Upper swing limit Vpos − headroom.</summary>
    public double High { get; }

    /// <summary>Lower swing limit Vneg + headroom.</summary>
    public double Low { get; }

    /// <summary>Clamp rate Gc in 1/s.</summary>
    public double ClampRate { get; }

    /// <summary>Clamp rate at which the overload memory counts the clamp as fully active, in V/s.</summary>
    public double ActivityScale { get; }

    /// <summary>Drive rate that separates "towards" from "away from" a limit in the recovery gate, in V/s.</summary>
    public double GateScale { get; }

    /// <summary>τ2 = 1/(2π·f2), or 0.</summary>
    public double SecondPoleTime { get; }

    /// <summary>ln 2 / Tor, or 0 when there is no overload recovery time.</summary>
    public double RecoveryDecayRate { get; }

    /// <summary>Output current limit (infinite when none).</summary>
    public double CurrentLimit { get; }
}

/// <summary>
/// Compiled behavioural amplifier. Unknowns: the drive state x (volts), an optional second-pole state y and an optional
/// overload memory m. Rows are scaled so that each has coefficients of order one. See <see cref="AmplifierModel"/>
/// for the equations.
/// </summary>
internal sealed class AmplifierDevice(string id, AmplifierParameters parameters, AmplifierNodes nodes) : Device(id)
{
    /// <summary>The model's derived constants; a tolerance run replaces them (offset, bias currents) in place.</summary>
    public AmplifierParameters Parameters { get; set; } = parameters;

    public AmplifierNodes Nodes { get; } = nodes;

    /// <summary>Name of the output node.</summary>
    public required string OutputName { get; init; }

    /// <summary>The drive row's own coefficient (∂/∂x) the last <see cref="Load"/> stamped: it grows where the swing clamp acts.</summary>
    internal double LoadedDriveSlope { get; private set; }

    /// <summary>The output stage's conductance the last <see cref="Load"/> stamped: it falls where the current limit acts.</summary>
    internal double LoadedOutputConductance { get; private set; }

    public override void Load(LoadContext context)
    {
        var p = Parameters;
        var n = Nodes;
        var e = Evaluate(context.X, context.Mode == AnalysisMode.Dc);
        double tau = p.DriveTimeScale;

        // Drive row: τ·dx/dt − τ·F(r, m) + τ·C(x) = 0.
        double dx = context.Derivative(n.DriveState, tau * e.X);
        double residual = dx - (tau * e.Drive) + (tau * e.Clamp);
        double jx = (context.Alpha * tau) + (tau * ((e.DriveSlope * p.PoleOmega) + e.ClampSlope));
        double jp = -e.DriveSlope;
        Span<int> columns = [n.Drive, n.Plus, n.Minus, n.Memory];
        Span<double> slopes = [jx, jp, -jp, -tau * e.DriveMemorySlope];
        StampRow(context, n.Drive, residual, columns, slopes);
        LoadedDriveSlope = jx;

        if (n.SecondPole >= 0)
        {
            double tau2 = p.SecondPoleTime;
            double y = context.X[n.SecondPole];
            double dy = context.Derivative(n.SecondPoleState, tau2 * y);
            Span<int> c2 = [n.SecondPole, n.Drive];
            Span<double> s2 = [(context.Alpha * tau2) + 1, -1];
            StampRow(context, n.SecondPole, dy + y - e.X, c2, s2);
        }

        if (n.Memory >= 0)
        {
            double m = context.X[n.Memory];
            if (context.Mode == AnalysisMode.Dc)
            {
                context.Derivative(n.MemoryState, m);
                context.Add(n.Memory, n.Memory, 1);
            }
            else
            {
                // dm/dt = k·(a − m), k = kd·(1 + 15·a²): fast attack while the clamp is active, decay ln2/Tor.
                double dm = context.Derivative(n.MemoryState, m);
                double a = Math.Tanh(e.Clamp / p.ActivityScale);
                double da = (1 - (a * a)) * e.ClampSlope / p.ActivityScale;
                double k = p.RecoveryDecayRate * (1 + (15 * a * a));
                double dk = p.RecoveryDecayRate * 30 * a;
                double scale = 1 / p.RecoveryDecayRate;
                Span<int> c3 = [n.Memory, n.Drive];
                Span<double> s3 = [scale * (context.Alpha + k), -scale * ((dk * (a - m)) + k) * da];
                StampRow(context, n.Memory, scale * (dm - (k * (a - m))), c3, s3);
            }
        }

        // Output stage: current i(y − vout) into the output node (its KCL row counts −i as leaving).
        Span<int> co = [n.Output, n.Stage];
        Span<double> so = [e.OutputConductance, -e.OutputConductance];
        LoadedOutputConductance = e.OutputConductance;
        StampRow(context, n.Output, -e.OutputCurrent, co, so);

        // Bias currents flow from each input node into the amplifier.
        context.AddRhs(n.Plus, -p.Model.InputBiasCurrentNonInverting * context.SourceScale);
        context.AddRhs(n.Minus, -p.Model.InputBiasCurrentInverting * context.SourceScale);
    }

    public override void StoreCharges(LoadContext context)
    {
        // The charges Load stores: τ·x (Evaluate's X is the drive unknown itself), τ2·y and m.
        var n = Nodes;
        context.Derivative(n.DriveState, Parameters.DriveTimeScale * context.X[n.Drive]);
        if (n.SecondPole >= 0) context.Derivative(n.SecondPoleState, Parameters.SecondPoleTime * context.X[n.SecondPole]);
        if (n.Memory >= 0) context.Derivative(n.MemoryState, context.X[n.Memory]);
    }

    public override void LoadAc(AcLoadContext context)
    {
        var p = Parameters;
        var n = Nodes;
        var e = Evaluate(context.X, dc: true);
        double tau = p.DriveTimeScale;
        context.Add(n.Drive, n.Drive, new Complex(tau * ((e.DriveSlope * p.PoleOmega) + e.ClampSlope), context.Omega * tau));
        if (string.Equals(Id, context.BrokenAmplifier, StringComparison.Ordinal))
        {
            // The loop is broken at this amplifier's controlling input (Bode's return ratio): the drive sees a unit
            // injected differential voltage instead of v(+) − v(−), whose returned value the loop-gain analysis reads.
            context.AddRhs(n.Drive, e.DriveSlope);
        }
        else
        {
            context.Add(n.Drive, n.Plus, -e.DriveSlope);
            context.Add(n.Drive, n.Minus, e.DriveSlope);
        }

        if (n.SecondPole >= 0)
        {
            context.Add(n.SecondPole, n.SecondPole, new Complex(1, context.Omega * p.SecondPoleTime));
            context.Add(n.SecondPole, n.Drive, -1);
        }

        if (n.Memory >= 0) context.Add(n.Memory, n.Memory, 1);
        context.Add(n.Output, n.Output, e.OutputConductance);
        context.Add(n.Output, n.Stage, -e.OutputConductance);
    }

    /// <summary>Values of the model functions at a solution vector.</summary>
    internal AmplifierEvaluation Evaluate(double[] x, bool dc)
    {
        var p = Parameters;
        var n = Nodes;
        var model = p.Model;
        double vp = n.Plus >= 0 ? x[n.Plus] : 0;
        double vm = n.Minus >= 0 ? x[n.Minus] : 0;
        double drive = x[n.Drive];
        double r = (p.UnityOmega * (vp - vm + model.InputOffsetVoltage)) - (p.PoleOmega * drive);
        double slewLimit = r >= 0 ? model.SlewRateRising : model.SlewRateFalling;

        // Slew limiting is a large-signal, time-domain effect. At DC (operating points, sweeps, and the point an AC
        // analysis is linearised at) the drive follows r itself; a saturated tanh there would leave the drive row with
        // no slope whenever a diode opens the loop, and the matrix singular.
        double t = dc ? 0 : Math.Tanh(r / slewLimit);
        double s = dc ? r : slewLimit * t;
        double sSlope = dc ? 1 : 1 - (t * t);
        double f = s, fSlope = sSlope, fMemory = 0;
        if (n.Memory >= 0 && !dc)
        {
            double m = x[n.Memory];
            double gPos = Gate(m, out double gPosSlope);
            double gNeg = Gate(-m, out double gNegSlope);
            double z = r / p.GateScale;
            double tz = Math.Tanh(z);
            double sigmaDown = 0.5 * (1 - tz), sigmaUp = 0.5 * (1 + tz);
            double sigmaSlope = 0.5 * (1 - (tz * tz)) / p.GateScale;
            double blocked = (gPos * sigmaDown) + (gNeg * sigmaUp);
            double blockedSlope = (-gPos * sigmaSlope) + (gNeg * sigmaSlope);
            f = s * (1 - blocked);
            fSlope = (sSlope * (1 - blocked)) - (s * blockedSlope);
            fMemory = -s * ((gPosSlope * sigmaDown) - (gNegSlope * sigmaUp));
        }

        double w = AmplifierParameters.ClampWidth;
        double above = (drive - p.High) / w, below = (p.Low - drive) / w;
        double clamp = p.ClampRate * w * (SmoothFunctions.Softplus(above) - SmoothFunctions.Softplus(below));
        double clampSlope = p.ClampRate * (SmoothFunctions.Logistic(above) + SmoothFunctions.Logistic(below));

        double stage = n.SecondPole >= 0 ? x[n.SecondPole] : drive;
        double vo = n.Output >= 0 ? x[n.Output] : 0;
        double u = stage - vo;
        double current, conductance;
        if (double.IsPositiveInfinity(p.CurrentLimit))
        {
            conductance = 1 / model.OutputResistance;
            current = u * conductance;
        }
        else
        {
            double to = Math.Tanh(u / (model.OutputResistance * p.CurrentLimit));
            current = p.CurrentLimit * to;
            conductance = (1 - (to * to)) / model.OutputResistance;
        }

        return new AmplifierEvaluation(drive, r, s, f, fSlope * p.UnityOmega * p.DriveTimeScale, fMemory, clamp, clampSlope, current, conductance, vp, vm, vo, slewLimit);
    }

    /// <summary>Observed flags and values at an accepted solution.</summary>
    internal AmplifierSample Observe(double[] x)
    {
        var p = Parameters;
        var model = p.Model;
        var e = Evaluate(x, dc: false);
        bool atLimit = e.X > p.High - (2 * AmplifierParameters.ClampWidth) || e.X < p.Low + (2 * AmplifierParameters.ClampWidth);
        bool slewLimited = !atLimit && Math.Abs(e.Slew) >= 0.9 * e.SlewLimit;
        bool currentLimited = Math.Abs(e.OutputCurrent) >= 0.9 * p.CurrentLimit;
        double cmHigh = p.Rails.Positive - model.CommonModeHeadroomPositive, cmLow = p.Rails.Negative + model.CommonModeHeadroomNegative;
        bool outside = e.Plus > cmHigh || e.Plus < cmLow || e.Minus > cmHigh || e.Minus < cmLow;
        return new AmplifierSample(slewLimited, atLimit, currentLimited, outside, e.Plus - e.Minus, e.OutputCurrent, e.Output);
    }

    private static double Gate(double m, out double slope)
    {
        double t = Math.Tanh((m - 0.5) / 0.05);
        slope = 0.5 * (1 - (t * t)) / 0.05;
        return 0.5 * (1 + t);
    }

    /// <summary>Stamps a row R(x) ≈ R0 + Σ J·(x − x0) = 0 as Σ J·x = Σ J·x0 − R0.</summary>
    private static void StampRow(LoadContext context, int row, double residual, ReadOnlySpan<int> columns, ReadOnlySpan<double> slopes)
    {
        double rhs = -residual;
        for (int i = 0; i < columns.Length; i++)
        {
            int c = columns[i];
            if (c < 0) continue;
            context.Add(row, c, slopes[i]);
            rhs += slopes[i] * context.X[c];
        }

        context.AddRhs(row, rhs);
    }
}

/// <summary>Model function values at one solution (see <see cref="AmplifierModel"/>).</summary>
/// <param name="X">Drive state x.</param>
/// <param name="Demand">Rate demand r = ωp·(A0·vd − x), V/s.</param>
/// <param name="Slew">Slew-limited rate S(r), V/s.</param>
/// <param name="Drive">Gated rate F(r, m), V/s.</param>
/// <param name="DriveSlope">dF/dr·ωu·τ (= dF/dr): coefficient of the inputs in the scaled drive row.</param>
/// <param name="DriveMemorySlope">dF/dm.</param>
/// <param name="Clamp">Clamp rate C(x), V/s.</param>
/// <param name="ClampSlope">dC/dx, 1/s.</param>
/// <param name="OutputCurrent">Current into the output node, A.</param>
/// <param name="OutputConductance">d(current)/d(y − vout), S.</param>
/// <param name="Plus">Non-inverting input voltage.</param>
/// <param name="Minus">Inverting input voltage.</param>
/// <param name="Output">Output node voltage.</param>
/// <param name="SlewLimit">Slew rate in the present direction.</param>
internal readonly record struct AmplifierEvaluation(
    double X, double Demand, double Slew, double Drive, double DriveSlope, double DriveMemorySlope, double Clamp, double ClampSlope,
    double OutputCurrent, double OutputConductance, double Plus, double Minus, double Output, double SlewLimit);

/// <summary>What the engine records for an amplifier at one accepted point.</summary>
internal readonly record struct AmplifierSample(
    bool SlewLimited, bool AtSwingLimit, bool CurrentLimited, bool InputOutsideCommonModeRange, double DifferentialInput, double OutputCurrent, double OutputVoltage);
