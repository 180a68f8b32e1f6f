namespace DesignRules.Quantities;

/// <summary>What is wrong with a text that was read as a quantity or a range.</summary>
public enum QuantityErrorKind
{
    /// <summary>The text was missing, empty or only white space.</summary>
    Empty,
    /// <summary>The text is not a value in any accepted form (or is longer than <see cref="Quantity.MaxTextLength"/>).</summary>
    Malformed,
    /// <summary>The text is a value, but its unit belongs to another dimension than the one expected.</summary>
    WrongDimension,
    /// <summary>The text names NaN or infinity, or the value overflows a double.</summary>
    NotFinite,
    /// <summary>A range whose low end is above its high end.</summary>
    BadRange,
}

/// <summary>A problem found while reading a quantity; a value, never an exception.</summary>
/// <param name="Kind">The class of problem.</param>
/// <param name="Message">A sentence for people that quotes the text and says what was expected.</param>
/// <param name="Found">For <see cref="QuantityErrorKind.WrongDimension"/>, the dimension the text actually has; otherwise <see langword="null"/>.</param>
public sealed record QuantityError(QuantityErrorKind Kind, string Message, Dimension? Found);
