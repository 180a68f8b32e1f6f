using System.Globalization;

namespace DesignRules.Rules;

/// <summary>
/// What a figure measures, independent of where: a stable name (<c>slew.demand</c>, <c>swing.margin</c>), its SI unit
/// symbol (<c>%</c> marks a fraction shown as a percentage, <c>1</c> a plain ratio) and the label people read on pages.
/// Every kind is a constant of <see cref="FigureKinds"/>; the name never changes once released, the label may.
/// </summary>
/// <param name="Name">Lower-case words joined by hyphens, grouped by dots (<c>tolerance.worst-case</c>).</param>
/// <param name="Unit">The SI unit symbol of the value.</param>
/// <param name="Label">The label for people; <c>{0}</c> stands for the subject, else the subject follows the label.</param>
public sealed record FigureKind(string Name, string Unit, string Label)
{
    /// <summary>The key of this kind for the stage or design as a whole.</summary>
    public FigureKey Key => new(this, null);

    /// <summary>The key of this kind at one subject of the stage: an amplifier output node, a slot (<c>u1</c>), a component.</summary>
    public FigureKey At(string subject) => new(this, subject);

    /// <summary>A figure of this kind for the stage or design as a whole.</summary>
    public Figure Of(double value) => new(Key, value);

    /// <summary>A figure of this kind at one subject of the stage.</summary>
    public Figure Of(string subject, double value) => new(At(subject), value);
}

/// <summary>
/// The stable identity of a figure within its stage (or design): its kind and, where a stage has several, the subject
/// (<c>slew.demand@rect.u1.out</c>, <c>swing.margin@u1</c>, <c>tolerance.worst-case</c>). Rules record by it, the JSON
/// report and the pages carry it, and two runs are compared by it; the label is only for people.
/// </summary>
/// <param name="Kind">What is measured.</param>
/// <param name="Subject">Where within the stage, or null for the stage as a whole.</param>
public readonly record struct FigureKey(FigureKind Kind, string? Subject)
{
    /// <summary>The label people read: the kind's label with the subject.</summary>
    public string Label => Subject is null ? Kind.Label.Replace("{0}", string.Empty, StringComparison.Ordinal).TrimEnd()
        : Kind.Label.Contains("{0}", StringComparison.Ordinal) ? string.Format(CultureInfo.InvariantCulture, Kind.Label, Subject)
        : $"{Kind.Label} {Subject}";

    /// <summary>The key as text: <c>name</c> or <c>name@subject</c>.</summary>
    public override string ToString() => Subject is null ? Kind.Name : $"{Kind.Name}@{Subject}";
}
