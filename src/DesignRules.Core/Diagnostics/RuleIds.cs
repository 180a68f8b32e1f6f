namespace DesignRules.Diagnostics;

/// <summary>
/// One named constant per entry of <c>rules/catalogue.yaml</c>, named for what the rule judges in the trade's words.
/// Code names a rule only through these; a test keeps them and the catalogue in step both ways, and a convention test
/// finds no id spelt as a string literal anywhere else.
/// </summary>
public static class RuleIds
{
    /// <summary>DR101: Full-power bandwidth.</summary>
    public static readonly RuleId FullPowerBandwidth = new("DR101");

    /// <summary>DR102: Slew demand on an amplifier output.</summary>
    public static readonly RuleId SlewDemand = new("DR102");

    /// <summary>DR103: Zero-crossing glitch.</summary>
    public static readonly RuleId ZeroCrossingGlitch = new("DR103");

    /// <summary>DR201: Output swing.</summary>
    public static readonly RuleId OutputSwing = new("DR201");

    /// <summary>DR202: Open-loop excursion by design.</summary>
    public static readonly RuleId OpenLoopExcursion = new("DR202");

    /// <summary>DR203: Input common-mode range.</summary>
    public static readonly RuleId CommonModeRange = new("DR203");

    /// <summary>DR204: Differential input voltage.</summary>
    public static readonly RuleId DifferentialInput = new("DR204");

    /// <summary>DR205: Single-supply bias point.</summary>
    public static readonly RuleId SingleSupplyBias = new("DR205");

    /// <summary>DR301: Amplifier output current.</summary>
    public static readonly RuleId OutputCurrent = new("DR301");

    /// <summary>DR302: Source impedance divides the signal.</summary>
    public static readonly RuleId SourceImpedance = new("DR302");

    /// <summary>DR303: High-impedance output under load.</summary>
    public static readonly RuleId HighImpedanceOutput = new("DR303");

    /// <summary>DR304: Loading between stages.</summary>
    public static readonly RuleId InterstageLoading = new("DR304");

    /// <summary>DR305: Hold capacitor still filling.</summary>
    public static readonly RuleId HoldCapacitorFilling = new("DR305");

    /// <summary>DR401: Worst-case transfer.</summary>
    public static readonly RuleId WorstCaseTransfer = new("DR401");

    /// <summary>DR402: Monte Carlo yield.</summary>
    public static readonly RuleId MonteCarloYield = new("DR402");

    /// <summary>DR403: Common-mode rejection from resistor mismatch.</summary>
    public static readonly RuleId CommonModeRejection = new("DR403");

    /// <summary>DR404: Absolute-value symmetry.</summary>
    public static readonly RuleId HalfCycleSymmetry = new("DR404");

    /// <summary>DR405: Output offset budget.</summary>
    public static readonly RuleId OutputOffset = new("DR405");

    /// <summary>DR406: Yield not shown by the samples.</summary>
    public static readonly RuleId YieldNotShown = new("DR406");

    /// <summary>DR407: Averaged level.</summary>
    public static readonly RuleId AverageTransfer = new("DR407");

    /// <summary>DR410: Filter figure over tolerances.</summary>
    public static readonly RuleId FilterTolerance = new("DR410");

    /// <summary>DR420: Signal-to-noise ratio.</summary>
    public static readonly RuleId SignalToNoise = new("DR420");

    /// <summary>DR421: Noise level.</summary>
    public static readonly RuleId NoiseLevel = new("DR421");

    /// <summary>DR422: Smallest signal above the dead zone and the noise floor.</summary>
    public static readonly RuleId SmallestSignal = new("DR422");

    /// <summary>DR501: Closed-loop bandwidth.</summary>
    public static readonly RuleId ClosedLoopBandwidth = new("DR501");

    /// <summary>DR502: Precision-rectifier error at the band top.</summary>
    public static readonly RuleId RectifierLoopGain = new("DR502");

    /// <summary>DR503: Noise gain below the minimum stable gain.</summary>
    public static readonly RuleId MinimumStableGain = new("DR503");

    /// <summary>DR510: Phase margin.</summary>
    public static readonly RuleId PhaseMargin = new("DR510");

    /// <summary>DR511: Closed-loop peaking.</summary>
    public static readonly RuleId LoopPeaking = new("DR511");

    /// <summary>DR512: Capacitive load.</summary>
    public static readonly RuleId CapacitiveLoad = new("DR512");

    /// <summary>DR513: Stability not judged.</summary>
    public static readonly RuleId StabilityNotJudged = new("DR513");

    /// <summary>DR514: Step overshoot.</summary>
    public static readonly RuleId StepOvershoot = new("DR514");

    /// <summary>DR530: Filter response off its requirement.</summary>
    public static readonly RuleId FilterResponse = new("DR530");

    /// <summary>DR531: Stop-band attenuation short.</summary>
    public static readonly RuleId StopbandAttenuation = new("DR531");

    /// <summary>DR601: Resistor power.</summary>
    public static readonly RuleId ResistorPower = new("DR601");

    /// <summary>DR602: Diode reverse voltage.</summary>
    public static readonly RuleId DiodeReverseVoltage = new("DR602");

    /// <summary>DR603: Diode forward current.</summary>
    public static readonly RuleId DiodeForwardCurrent = new("DR603");

    /// <summary>DR604: Supply span.</summary>
    public static readonly RuleId SupplySpan = new("DR604");

    /// <summary>DR605: Resistor with no rating.</summary>
    public static readonly RuleId UnratedResistor = new("DR605");

    /// <summary>DR701: Resistor outside the declared E-series.</summary>
    public static readonly RuleId PreferredValue = new("DR701");

    /// <summary>DR702: Requirement no rule can check.</summary>
    public static readonly RuleId UncheckedRequirement = new("DR702");

    /// <summary>DR703: Expired waiver.</summary>
    public static readonly RuleId ExpiredWaiver = new("DR703");

    /// <summary>DR704: Waiver that matches nothing.</summary>
    public static readonly RuleId UnmatchedWaiver = new("DR704");

    /// <summary>DR710: Capacitor outside the declared E-series.</summary>
    public static readonly RuleId PreferredCapacitorValue = new("DR710");

    /// <summary>DR900: YAML syntax error.</summary>
    public static readonly RuleId YamlSyntax = new("DR900");

    /// <summary>DR901: Unknown key.</summary>
    public static readonly RuleId UnknownKey = new("DR901");

    /// <summary>DR902: Missing required key.</summary>
    public static readonly RuleId MissingKey = new("DR902");

    /// <summary>DR903: Wrong unit.</summary>
    public static readonly RuleId WrongUnit = new("DR903");

    /// <summary>DR904: Malformed value.</summary>
    public static readonly RuleId MalformedValue = new("DR904");

    /// <summary>DR905: Value out of range.</summary>
    public static readonly RuleId OutOfRange = new("DR905");

    /// <summary>DR906: Unknown part.</summary>
    public static readonly RuleId UnknownPart = new("DR906");

    /// <summary>DR907: Unknown block.</summary>
    public static readonly RuleId UnknownBlock = new("DR907");

    /// <summary>DR908: Unconnected node.</summary>
    public static readonly RuleId UnconnectedNode = new("DR908");

    /// <summary>DR909: Duplicate id.</summary>
    public static readonly RuleId DuplicateId = new("DR909");

    /// <summary>DR910: Parts library not found.</summary>
    public static readonly RuleId LibraryNotFound = new("DR910");

    /// <summary>DR911: Parts library cycle.</summary>
    public static readonly RuleId LibraryCycle = new("DR911");

    /// <summary>DR912: Size limit exceeded.</summary>
    public static readonly RuleId SizeLimit = new("DR912");

    /// <summary>DR913: Wrong kind of YAML node.</summary>
    public static readonly RuleId WrongShape = new("DR913");

    /// <summary>DR914: Unknown choice.</summary>
    public static readonly RuleId UnknownChoice = new("DR914");

    /// <summary>DR915: Not a design or parts file.</summary>
    public static readonly RuleId NotADesignFile = new("DR915");

    /// <summary>DR916: Conflicting keys.</summary>
    public static readonly RuleId ConflictingKeys = new("DR916");

    /// <summary>DR917: Malformed id.</summary>
    public static readonly RuleId MalformedId = new("DR917");

    /// <summary>DR918: Malformed date.</summary>
    public static readonly RuleId MalformedDate = new("DR918");

    /// <summary>DR919: Duplicate key.</summary>
    public static readonly RuleId DuplicateKey = new("DR919");

    /// <summary>DR920: Analysis failed.</summary>
    public static readonly RuleId AnalysisFailed = new("DR920");

    /// <summary>DR925: Transient did not settle.</summary>
    public static readonly RuleId TransientNotSettled = new("DR925");

    /// <summary>DR930: Template error.</summary>
    public static readonly RuleId TemplateError = new("DR930");

    /// <summary>DR931: Pages folder refused.</summary>
    public static readonly RuleId PagesFolderRefused = new("DR931");

    /// <summary>DR940: No design found.</summary>
    public static readonly RuleId NoDesignFound = new("DR940");

    /// <summary>DR990: Internal failure of the tool.</summary>
    public static readonly RuleId InternalFailure = new("DR990");

    /// <summary>Every constant of this class, in id order.</summary>
    public static IReadOnlyList<RuleId> All { get; } = typeof(RuleIds).GetFields(System.Reflection.BindingFlags.Public | System.Reflection.BindingFlags.Static)
        .Where(f => f.FieldType == typeof(RuleId))
        .Select(f => (RuleId)f.GetValue(null)!)
        .OrderBy(id => id.Value, StringComparer.Ordinal)
        .ToList();
}
