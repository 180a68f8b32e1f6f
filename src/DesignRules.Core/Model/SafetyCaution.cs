namespace DesignRules.Model;

/// <summary>
/// The caution a design's pages and reports carry when it can hurt someone: because it declares a hazard
/// (<c>hazards:</c>), or because its supplies or signals are above extra-low voltage. Only the declaration and the
/// written voltages count; nothing is guessed from names.
/// </summary>
/// <param name="Hazards">The declared hazard kinds, in file order (empty when only the voltages call for a caution).</param>
/// <param name="Note">The design's own note on the hazard, on one line, if given.</param>
/// <param name="AboveExtraLowVoltage">Whether a supply rail, the supply span or the source's peak exceeds extra-low voltage.</param>
public sealed record SafetyCaution(IReadOnlyList<HazardKind> Hazards, string? Note, bool AboveExtraLowVoltage)
{
    // The extra-low-voltage band of IEC 61140:2016 (voltage band I of IEC 60449): not above 120 V ripple-free DC and not
    // above 50 V AC rms, between conductors or to earth. Checked against the IEC Electropedia definition of
    // "extra-low voltage" and the note in IEC 61347-2-2 that cites the ELV band of IEC 61140:2016. A source waveform is
    // judged by its peak against the peak of 50 V rms of a sine.

    /// <summary>Upper limit of extra-low voltage for ripple-free DC (IEC 61140 ELV band), in volts.</summary>
    public const double ExtraLowDc = 120;

    /// <summary>Upper limit of extra-low voltage for AC, rms (IEC 61140 ELV band), in volts.</summary>
    public const double ExtraLowAcRms = 50;

    /// <summary>What the tool does not check, said the same way wherever a caution appears.</summary>
    public const string Scope =
        "DesignRules checks signal performance only; isolation, creepage and clearance, protective earthing and installation follow local codes and licensed practice.";

    /// <summary>The caution as one paragraph for people.</summary>
    public string Text
    {
        get
        {
            var parts = new List<string>();
            if (Hazards.Count > 0)
            {
                var what = Join(Hazards.Select(Model.Hazards.Describe).ToList());
                parts.Add($"This design connects to {what}" + (Note is null ? "." : $": {Note.TrimEnd('.')}."));
            }

            if (AboveExtraLowVoltage)
            {
                parts.Add((Hazards.Count > 0 ? "It also works" : "This design works") +
                    " above extra-low voltage (120 V ripple-free DC or 50 V AC rms, the ELV band of IEC 61140).");
            }

            parts.Add(Scope);
            return string.Join(' ', parts);
        }
    }

    /// <summary>The caution a design needs, or null when it declares no hazard and stays within extra-low voltage.</summary>
    public static SafetyCaution? For(Design design)
    {
        ArgumentNullException.ThrowIfNull(design);
        var kinds = design.Hazards?.Kinds.Select(k => k.Value).ToList() ?? [];
        var high = IsAboveExtraLowVoltage(design);
        if (kinds.Count == 0 && !high)
        {
            return null;
        }

        var note = design.Hazards?.Note?.Value;
        note = string.IsNullOrWhiteSpace(note) ? null : string.Join(' ', note.Split((char[]?)null, StringSplitOptions.RemoveEmptyEntries));
        return new SafetyCaution(kinds, note, high);
    }

    /// <summary>Whether a rail, the span between the rails or the source's peak exceeds extra-low voltage.</summary>
    public static bool IsAboveExtraLowVoltage(Design design)
    {
        ArgumentNullException.ThrowIfNull(design);
        var rails = Math.Max(Math.Abs(design.Supplies.Positive.Value.Value), Math.Abs(design.Supplies.Negative.Value.Value));
        var span = design.Supplies.Positive.Value.Value - design.Supplies.Negative.Value.Value;
        var w = design.Source.Waveform;
        var peak = Math.Abs(w.Offset?.Value.Value ?? 0) + (w.Amplitude?.Value.Value ?? 0) + w.Components.Sum(c => Math.Abs(c.Offset?.Value.Value ?? 0) + (c.Amplitude?.Value.Value ?? 0));
        return rails > ExtraLowDc || span > ExtraLowDc || peak > ExtraLowAcRms * Math.Sqrt(2);
    }

    private static string Join(List<string> items) => items.Count switch
    {
        1 => items[0],
        2 => $"{items[0]} and {items[1]}",
        _ => string.Join(", ", items.Take(items.Count - 1)) + " and " + items[^1],
    };
}
