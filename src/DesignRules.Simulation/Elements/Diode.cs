using System.Numerics;

namespace DesignRules.Simulation.Elements;

/// <summary>A junction diode from Anode to Cathode (see <see cref="DiodeModel"/> for its equations).</summary>
internal sealed record DiodeDefinition(string Id, string Anode, string Cathode, DiodeModel Model) : ElementDefinition(Id)
{
    public override IEnumerable<string> Nodes => [Anode, Cathode];

    public override IEnumerable<(string A, string B)> DcPaths => [(Anode, Cathode)];

    public override string? Validate() => Model is null ? "diode model is missing" : Model.Validate();

    public override Device Compile(CircuitLayout layout)
    {
        int anode = layout.Node(Anode), cathode = layout.Node(Cathode);
        int junction = Model.SeriesResistance > 0 ? layout.InternalNode(Id, "junction") : anode;
        int state = Model.JunctionCapacitance > 0 ? layout.IntegratedState(Id, Model.JunctionCapacitance) : -1;
        return new DiodeDevice(Id, anode, junction, cathode, state, Model);
    }
}

/// <summary>
/// Compiled diode. The junction voltage is limited between Newton iterations with the logarithmic junction-voltage
/// limiting of Nagel (1975): a forward step larger than 2·n·V_T above the critical voltage
/// V_crit = n·V_T·ln(n·V_T/(√2·Is)) is replaced by the voltage at which the exponential's current would change by the
/// linearised amount, so the exponential never overflows and Newton converges from any start.
/// </summary>
internal sealed class DiodeDevice(string id, int anode, int junction, int cathode, int state, DiodeModel model) : Device(id)
{
    private readonly double seriesConductance = model.SeriesResistance > 0 ? 1 / model.SeriesResistance : 0;
    private double lastVoltage;
    private double cachedTemperature = double.NaN;
    private double nvt;
    private double criticalForward;
    private double criticalBreakdown;

    public override void Reset() => lastVoltage = 0;

    public override void Prime(double[] x) => lastVoltage = (junction >= 0 ? x[junction] : 0) - (cathode >= 0 ? x[cathode] : 0);

    /// <summary>Is in A; a tolerance run changes it in place (a forward-voltage spread) instead of compiling again.</summary>
    public double SaturationCurrent
    {
        get => model.SaturationCurrent;
        set
        {
            model = model with { SaturationCurrent = value };
            cachedTemperature = double.NaN;
        }
    }

    public override void Load(LoadContext context)
    {
        Prepare(context.Temperature);
        if (junction != anode) context.Conductance(anode, junction, seriesConductance);
        double limitedV = LimitJunction(context);
        double current = Current(limitedV, context.JunctionShunt, out double g);
        LoadedJunctionConductance = g;
        context.NonlinearBranch(junction, cathode, current, g, limitedV);
        if (state >= 0)
        {
            double c = model.JunctionCapacitance;
            double chargeCurrent = context.Derivative(state, c * limitedV);
            double gc = context.Alpha * c;

            // In DC (no charge current, no capacitive conductance) the branch would add only zeros: skipped.
            if (chargeCurrent != 0 || gc != 0) context.NonlinearBranch(junction, cathode, chargeCurrent, gc, limitedV);
        }
    }

    public override void StoreCharges(LoadContext context)
    {
        // The limiting too: it moves the junction memory the next iteration limits from, as a load would.
        Prepare(context.Temperature);
        double limitedV = LimitJunction(context);
        if (state >= 0) context.Derivative(state, model.JunctionCapacitance * limitedV);
    }

    public override void LoadAc(AcLoadContext context)
    {
        Prepare(context.Temperature);
        if (junction != anode) context.Admittance(anode, junction, seriesConductance);
        double v = context.V(junction) - context.V(cathode);
        Current(v, context.JunctionShunt, out double g);
        context.Admittance(junction, cathode, new Complex(g, context.Omega * model.JunctionCapacitance));
    }

    /// <summary>Unknown index of the junction's anode side (the anode itself without series resistance).</summary>
    public int Junction => junction;

    /// <summary>Unknown index of the cathode (−1 for the reference).</summary>
    public int Cathode => cathode;

    /// <summary>
    /// The junction conductance (with the load's junction shunt) the last <see cref="Load"/> stamped: what
    /// <see cref="LoadedConductance"/> computes again for that load's shunt, kept so a linearised step need not.
    /// </summary>
    internal double LoadedJunctionConductance { get; private set; }

    /// <summary>
    /// dI/dV of the junction (with the junction shunt <paramref name="shunt"/>) at the voltage the last <see cref="Load"/>
    /// linearised it at (the limited voltage, where it limited): the conductance that load stamped.
    /// </summary>
    internal double LoadedConductance(double shunt)
    {
        Current(lastVoltage, shunt, out double conductance);
        return conductance;
    }

    /// <summary>
    /// Junction current at a solution vector, without the solver's junction shunt (which is a numerical aid, not a
    /// carrier flow): the current whose shot noise 2·q·|I| the noise analysis counts.
    /// </summary>
    internal double JunctionCurrent(double[] x, double temperature)
    {
        Prepare(temperature);
        double v = (junction >= 0 ? x[junction] : 0) - (cathode >= 0 ? x[cathode] : 0);
        return Current(v, 0, out _);
    }

    /// <summary>Junction current (Shockley law plus breakdown plus the junction shunt) and its conductance.</summary>
    internal double Current(double v, double shunt, out double conductance)
    {
        double e = SmoothFunctions.LimitedExp(v / nvt, out double slope);
        double current = model.SaturationCurrent * (e - 1);
        conductance = model.SaturationCurrent * slope / nvt;
        if (model.BreakdownVoltage is { } bv)
        {
            double eb = SmoothFunctions.LimitedExp(-(v + bv) / nvt, out double slopeB);
            current -= model.BreakdownCurrent * eb;
            conductance += model.BreakdownCurrent * slopeB / nvt;
        }

        current += shunt * v;
        conductance += shunt;
        return current;
    }

    private void Prepare(double temperature)
    {
        if (temperature == cachedTemperature) return;
        cachedTemperature = temperature;
        nvt = model.EmissionCoefficient * PhysicalConstants.ThermalVoltage(temperature);
        criticalForward = nvt * Math.Log(nvt / (Math.Sqrt(2) * model.SaturationCurrent));
        criticalBreakdown = nvt * Math.Log(nvt / (Math.Sqrt(2) * model.BreakdownCurrent));
    }

    /// <summary>The junction voltage at the present guess, limited from the last one (which it then replaces).</summary>
    private double LimitJunction(LoadContext context)
    {
        double v = context.V(junction) - context.V(cathode);
        double limitedV = Limit(v, lastVoltage, out bool limited);
        if (limited)
        {
            context.Limited = true;
            context.LimitedBy = Id;
        }

        lastVoltage = limitedV;
        return limitedV;
    }

    private double Limit(double v, double previous, out bool limited)
    {
        v = LimitExponential(v, previous, criticalForward, out limited);
        if (model.BreakdownVoltage is { } bv)
        {
            double w = LimitExponential(-(v + bv), -(previous + bv), criticalBreakdown, out bool limitedB);
            v = -w - bv;
            limited |= limitedB;
        }

        return v;
    }

    private double LimitExponential(double v, double previous, double critical, out bool limited)
    {
        limited = false;
        if (v > critical && Math.Abs(v - previous) > 2 * nvt)
        {
            limited = true;
            if (previous > 0)
            {
                double arg = 1 + ((v - previous) / nvt);
                return arg > 0 ? previous + (nvt * Math.Log(arg)) : critical;
            }

            return nvt * Math.Log(v / nvt);
        }

        return v;
    }
}
