namespace DesignRules.Reports;

/// <summary>Help-page addresses of rules: a base address (a folder URI or a web address) plus <c>DRnnn.md</c>.</summary>
public static class HelpLinks
{
    /// <summary>The help page of <paramref name="ruleId"/> under <paramref name="baseUri"/>, or null when there is no base.</summary>
    public static string? For(string ruleId, string? baseUri) =>
        string.IsNullOrWhiteSpace(baseUri) ? null : baseUri.TrimEnd('/', '\\') + "/" + ruleId + ".md";

    /// <summary>A <c>file://</c> address for a local folder of help pages, ending in a slash.</summary>
    public static string FolderUri(string folder)
    {
        ArgumentNullException.ThrowIfNull(folder);
        var full = Path.GetFullPath(folder);
        return new Uri(Path.EndsInDirectorySeparator(full) ? full : full + Path.DirectorySeparatorChar).AbsoluteUri;
    }
}
