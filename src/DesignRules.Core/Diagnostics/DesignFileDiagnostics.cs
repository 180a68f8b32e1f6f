namespace DesignRules.Diagnostics;

/// <summary>The DR9xx descriptors: problems in the design and parts files themselves.</summary>
public static class DesignFileDiagnostics
{
    private const string Category = "design-file";

    /// <summary>The YAML text cannot be parsed.</summary>
    public static readonly DiagnosticDescriptor YamlSyntax = Make(
        "DR900", "YAML syntax error", "The file is not valid YAML: {0}. Check indentation, colons after keys and matching quotes.");

    /// <summary>A key that the format does not know.</summary>
    public static readonly DiagnosticDescriptor UnknownKey = Make(
        "DR901", "Unknown key", "Unknown key '{0}' in {1}.{2} Accepted keys: {3}.");

    /// <summary>A key that must be present is missing.</summary>
    public static readonly DiagnosticDescriptor MissingKey = Make(
        "DR902", "Missing required key", "Missing key '{1}' in {0}: expected {2}.");

    /// <summary>A value whose unit belongs to another dimension.</summary>
    public static readonly DiagnosticDescriptor WrongUnit = Make(
        "DR903", "Wrong unit", "'{0}' for '{1}' has the wrong unit: {2}. Expected {3}.");

    /// <summary>A value that cannot be read as a number with a unit.</summary>
    public static readonly DiagnosticDescriptor MalformedValue = Make(
        "DR904", "Malformed value", "'{0}' for '{1}' is not accepted: {2}.");

    /// <summary>A value outside the range that makes physical sense.</summary>
    public static readonly DiagnosticDescriptor OutOfRange = Make(
        "DR905", "Value out of range", "'{0}' for '{1}' is out of range: {2}.");

    /// <summary>A part reference that names no part of the expected kind.</summary>
    public static readonly DiagnosticDescriptor UnknownPart = Make(
        "DR906", "Unknown part", "No {0} named '{1}' in the parts libraries this design uses.{2} Known: {3}.");

    /// <summary>A block name that is not a built-in topology.</summary>
    public static readonly DiagnosticDescriptor UnknownBlock = Make(
        "DR907", "Unknown block", "No built-in block named '{0}'.{1} Blocks: {2}.");

    /// <summary>A netlist node that nothing else connects to, or an input/output node that no element uses.</summary>
    public static readonly DiagnosticDescriptor UnknownNode = Make(
        "DR908", "Unconnected node", "Node '{0}' in stage '{1}' {2}.{3} Nodes of this stage: {4}.");

    /// <summary>An id used twice where ids must be unique.</summary>
    public static readonly DiagnosticDescriptor DuplicateId = Make(
        "DR909", "Duplicate id", "The {0} id '{1}' is already used at {2}. Give each {0} its own id.");

    /// <summary>A parts library reference that does not resolve to a file.</summary>
    public static readonly DiagnosticDescriptor LibraryNotFound = Make(
        "DR910", "Parts library not found", "Parts library '{0}' was not found (looked for '{1}'). Paths are relative to the file that names them.");

    /// <summary>Parts libraries that use each other in a circle.</summary>
    public static readonly DiagnosticDescriptor LibraryCycle = Make(
        "DR911", "Parts library cycle", "Parts libraries use each other in a circle: {0}. Remove one of the 'uses' entries.");

    /// <summary>A file, nesting or alias expansion beyond the loader's bounds.</summary>
    public static readonly DiagnosticDescriptor SizeLimit = Make(
        "DR912", "Size limit exceeded", "{0} exceeds the loader's limit of {1}; the file is refused without being expanded.");

    /// <summary>A node of the wrong shape (a list where a mapping is expected, and so on).</summary>
    public static readonly DiagnosticDescriptor WrongShape = Make(
        "DR913", "Wrong kind of YAML node", "'{0}' must be {1}, not {2}.");

    /// <summary>A word outside a fixed set of choices.</summary>
    public static readonly DiagnosticDescriptor UnknownChoice = Make(
        "DR914", "Unknown choice", "'{0}' is not an accepted value for '{1}'.{2} Accepted: {3}.");

    /// <summary>A file that is neither a design file nor a parts file, or cannot be read.</summary>
    public static readonly DiagnosticDescriptor NotADesignFile = Make(
        "DR915", "Not a design or parts file", "{0}. A design file starts with 'design:', a parts file with 'library:'.");

    /// <summary>Keys that exclude each other, or a choice that needs a key that is missing.</summary>
    public static readonly DiagnosticDescriptor ConflictingKeys = Make(
        "DR916", "Conflicting keys", "{0}");

    /// <summary>An id that is not lower-case letters, digits and hyphens.</summary>
    public static readonly DiagnosticDescriptor BadId = Make(
        "DR917", "Malformed id", "'{0}' is not a valid id: use lower-case letters, digits and hyphens, starting with a letter, at most 64 characters (e.g. 'input-buffer').");

    /// <summary>A date that is not an ISO 8601 calendar date.</summary>
    public static readonly DiagnosticDescriptor BadDate = Make(
        "DR918", "Malformed date", "'{0}' for '{1}' is not a date; write it as YYYY-MM-DD (e.g. 2027-06-30).");

    /// <summary>The same key twice in one mapping.</summary>
    public static readonly DiagnosticDescriptor DuplicateKey = Make(
        "DR919", "Duplicate key", "The key '{0}' appears twice in this mapping (first at {1}); YAML keeps only one. Remove or rename one.");

    /// <summary>Every descriptor in this class, in id order.</summary>
    public static IReadOnlyList<DiagnosticDescriptor> All { get; } =
    [
        YamlSyntax, UnknownKey, MissingKey, WrongUnit, MalformedValue, OutOfRange, UnknownPart, UnknownBlock, UnknownNode,
        DuplicateId, LibraryNotFound, LibraryCycle, SizeLimit, WrongShape, UnknownChoice, NotADesignFile, ConflictingKeys,
        BadId, BadDate, DuplicateKey,
    ];

    private static DiagnosticDescriptor Make(string id, string title, string format) =>
        new(id, title, Category, Severity.Error, format, $"rules/{id}.md");
}
