using DesignRules.Diagnostics;

namespace DesignRules.Model;

/// <summary>
/// Kinds of hazardous energy a chain may connect to beyond its own supplies, as a design declares them
/// (<c>hazards:</c>). The set is closed and ours; the tool never guesses a kind from names or values.
/// </summary>
public enum HazardKind
{
    /// <summary>The public AC supply network, or a conductor of equipment fed from it (a motor lead, a mains shunt).</summary>
    Mains,
    /// <summary>AC above extra-low voltage that is not mains: an inverter output, a transformer secondary, a high-voltage winding.</summary>
    HighVoltageAc,
    /// <summary>DC above extra-low voltage: a DC bus, a photovoltaic string, a high-voltage supply.</summary>
    HighVoltageDc,
    /// <summary>A battery pack able to deliver fault currents that burn or start fires, whatever its voltage.</summary>
    HighEnergyBattery,
    /// <summary>Stored charge or energy that stays after switch-off: a capacitor bank, a pulse-discharge circuit.</summary>
    StoredEnergy,
}

/// <summary>What a design declares it connects to: one or more hazard kinds and an optional note for people.</summary>
/// <param name="Kinds">The declared kinds, in file order, each once.</param>
/// <param name="Note">Free text saying where the hazard is, if given.</param>
/// <param name="Span">Where the declaration is written.</param>
public sealed record Hazards(IReadOnlyList<Located<HazardKind>> Kinds, Located<string>? Note, SourceSpan Span)
{
    /// <summary>The names a design file uses, by kind.</summary>
    public static IReadOnlyDictionary<string, HazardKind> Names { get; } = new Dictionary<string, HazardKind>(StringComparer.Ordinal)
    {
        ["mains"] = HazardKind.Mains,
        ["high-voltage-ac"] = HazardKind.HighVoltageAc,
        ["high-voltage-dc"] = HazardKind.HighVoltageDc,
        ["high-energy-battery"] = HazardKind.HighEnergyBattery,
        ["stored-energy"] = HazardKind.StoredEnergy,
    };

    /// <summary>The file name of a kind (<c>high-voltage-dc</c>).</summary>
    public static string NameOf(HazardKind kind) => Names.First(n => n.Value == kind).Key;

    /// <summary>A short phrase for people, used in the caution.</summary>
    public static string Describe(HazardKind kind) => kind switch
    {
        HazardKind.Mains => "mains",
        HazardKind.HighVoltageAc => "AC above extra-low voltage",
        HazardKind.HighVoltageDc => "DC above extra-low voltage",
        HazardKind.HighEnergyBattery => "a high-energy battery",
        HazardKind.StoredEnergy => "stored energy that outlasts switch-off",
        _ => throw new ArgumentOutOfRangeException(nameof(kind)),
    };
}
