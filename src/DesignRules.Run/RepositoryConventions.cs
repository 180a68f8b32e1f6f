using System.Globalization;
using System.Reflection;
using DesignRules.Loading;

namespace DesignRules.Run;

/// <summary>
/// The one place for what a hardware repository looks like to both hosts: where designs, parts, the rule-set file,
/// pages and templates are found by default, how a date is written, what today is, and which version of the tool runs.
/// (The MSBuild props file repeats the globs and folder names because MSBuild needs them before any task runs; a test
/// keeps the two in step.)
/// </summary>
public static class RepositoryConventions
{
    /// <summary>Design files below the root, by default.</summary>
    public const string DesignPattern = "designs/**/*.yaml";

    /// <summary>Parts files below the root, by default.</summary>
    public const string PartsPattern = "parts/**/*.yaml";

    /// <summary>The rule-set file at the root, read when present.</summary>
    public const string RuleSetFileName = RuleSetLoader.DefaultFileName;

    /// <summary>The pages folder below the root, by default.</summary>
    public const string PagesFolderName = "design-pages";

    /// <summary>The folder of the repository's own templates below the root, used when present.</summary>
    public const string TemplateFolderName = "design-templates";

    /// <summary>How a date (waiver expiry, <c>--today</c>, <c>DesignRulesToday</c>) is written.</summary>
    public const string DateFormat = "yyyy-MM-dd";

    /// <summary>The example a message about a mistyped date gives.</summary>
    public const string DateExample = "2027-06-30";

    /// <summary>The date waiver expiry is judged against when none is given: today, on this machine's clock.</summary>
    public static DateOnly Today() => DateOnly.FromDateTime(DateTime.Today);

    /// <summary>Reads a date written <see cref="DateFormat"/>; false for anything else.</summary>
    public static bool TryParseDate(string text, out DateOnly date) =>
        DateOnly.TryParseExact((text ?? string.Empty).Trim(), DateFormat, CultureInfo.InvariantCulture, DateTimeStyles.None, out date);

    /// <summary>The rule-set file of a repository root, when it has one.</summary>
    public static string? FindRuleSet(string root)
    {
        var path = Path.Combine(root, RuleSetFileName);
        return File.Exists(path) ? path : null;
    }

    /// <summary>The tool's version as reports, the stamp and the cache state it.</summary>
    public static string ToolVersion { get; } =
        typeof(RepositoryConventions).Assembly.GetCustomAttribute<AssemblyInformationalVersionAttribute>()?.InformationalVersion ?? "0.0.0";
}
