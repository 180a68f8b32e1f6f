using System.Reflection;
using DesignRules.Loading;
using DesignRules.Rules;

namespace DesignRules.Pages.Tests;

/// <summary>Checks the example repository once per test run and renders its pages into fresh folders.</summary>
internal static class ExamplePages
{
    private static readonly Lazy<CheckReport> Report = new(() =>
    {
        var root = Path.Combine(RepositoryRoot(), "example-design");
        var files = RepositoryFiles.Find([root], out _);
        return DesignCheck.Run(files, new CheckOptions(Path.Combine(root, RuleSetLoader.DefaultFileName), new DateOnly(2026, 12, 1)));
    });

    public static CheckReport Check() => Report.Value;

    public static string RepositoryRoot() =>
        typeof(ExamplePages).Assembly.GetCustomAttributes<AssemblyMetadataAttribute>().Single(a => a.Key == "RepositoryRoot").Value!;

    /// <summary>Renders the example pages into a new temporary folder and returns it with the result.</summary>
    public static (string Folder, PageResult Result) Render(string? templates = null)
    {
        var folder = Path.Combine(Path.GetTempPath(), "designrules-pages-" + Guid.NewGuid().ToString("N"));
        var result = DatasheetPages.Write(Check(), new PageOptions(folder, templates, RepositoryRoot()));
        return (folder, result);
    }
}
