namespace DesignRules.Diagnostics;

/// <summary>The DR9xx descriptors: problems in the design and parts files themselves (titles and messages live in the rule catalogue).</summary>
public static class DesignFileDiagnostics
{
    /// <summary>The YAML text cannot be parsed.</summary>
    public static readonly DiagnosticDescriptor YamlSyntax = RuleCatalogue.Default[RuleIds.YamlSyntax];

    /// <summary>A key that the format does not know.</summary>
    public static readonly DiagnosticDescriptor UnknownKey = RuleCatalogue.Default[RuleIds.UnknownKey];

    /// <summary>A key that must be present is missing.</summary>
    public static readonly DiagnosticDescriptor MissingKey = RuleCatalogue.Default[RuleIds.MissingKey];

    /// <summary>A value whose unit belongs to another dimension.</summary>
    public static readonly DiagnosticDescriptor WrongUnit = RuleCatalogue.Default[RuleIds.WrongUnit];

    /// <summary>A value that cannot be read as a number with a unit.</summary>
    public static readonly DiagnosticDescriptor MalformedValue = RuleCatalogue.Default[RuleIds.MalformedValue];

    /// <summary>A value outside the range that makes physical sense.</summary>
    public static readonly DiagnosticDescriptor OutOfRange = RuleCatalogue.Default[RuleIds.OutOfRange];

    /// <summary>A part reference that names no part of the expected kind.</summary>
    public static readonly DiagnosticDescriptor UnknownPart = RuleCatalogue.Default[RuleIds.UnknownPart];

    /// <summary>A block name that is not a built-in topology.</summary>
    public static readonly DiagnosticDescriptor UnknownBlock = RuleCatalogue.Default[RuleIds.UnknownBlock];

    /// <summary>A netlist node that nothing else connects to, or an input/output node that no element uses.</summary>
    public static readonly DiagnosticDescriptor UnknownNode = RuleCatalogue.Default[RuleIds.UnconnectedNode];

    /// <summary>An id used twice where ids must be unique.</summary>
    public static readonly DiagnosticDescriptor DuplicateId = RuleCatalogue.Default[RuleIds.DuplicateId];

    /// <summary>A parts library reference that does not resolve to a file.</summary>
    public static readonly DiagnosticDescriptor LibraryNotFound = RuleCatalogue.Default[RuleIds.LibraryNotFound];

    /// <summary>Parts libraries that use each other in a circle.</summary>
    public static readonly DiagnosticDescriptor LibraryCycle = RuleCatalogue.Default[RuleIds.LibraryCycle];

    /// <summary>A file, nesting or alias expansion beyond the loader's bounds.</summary>
    public static readonly DiagnosticDescriptor SizeLimit = RuleCatalogue.Default[RuleIds.SizeLimit];

    /// <summary>A node of the wrong shape (a list where a mapping is expected, and so on).</summary>
    public static readonly DiagnosticDescriptor WrongShape = RuleCatalogue.Default[RuleIds.WrongShape];

    /// <summary>A word outside a fixed set of choices.</summary>
    public static readonly DiagnosticDescriptor UnknownChoice = RuleCatalogue.Default[RuleIds.UnknownChoice];

    /// <summary>A file that is neither a design file nor a parts file, or cannot be read.</summary>
    public static readonly DiagnosticDescriptor NotADesignFile = RuleCatalogue.Default[RuleIds.NotADesignFile];

    /// <summary>Keys that exclude each other, or a choice that needs a key that is missing.</summary>
    public static readonly DiagnosticDescriptor ConflictingKeys = RuleCatalogue.Default[RuleIds.ConflictingKeys];

    /// <summary>An id that is not lower-case letters, digits and hyphens.</summary>
    public static readonly DiagnosticDescriptor BadId = RuleCatalogue.Default[RuleIds.MalformedId];

    /// <summary>A date that is not an ISO 8601 calendar date.</summary>
    public static readonly DiagnosticDescriptor BadDate = RuleCatalogue.Default[RuleIds.MalformedDate];

    /// <summary>The same key twice in one mapping.</summary>
    public static readonly DiagnosticDescriptor DuplicateKey = RuleCatalogue.Default[RuleIds.DuplicateKey];

    /// <summary>Every descriptor in this class, in id order.</summary>
    public static IReadOnlyList<DiagnosticDescriptor> All { get; } =
    [
        YamlSyntax, UnknownKey, MissingKey, WrongUnit, MalformedValue, OutOfRange, UnknownPart, UnknownBlock, UnknownNode,
        DuplicateId, LibraryNotFound, LibraryCycle, SizeLimit, WrongShape, UnknownChoice, NotADesignFile, ConflictingKeys,
        BadId, BadDate, DuplicateKey,
    ];
}
