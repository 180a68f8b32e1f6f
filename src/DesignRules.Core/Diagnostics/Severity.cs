namespace DesignRules.Diagnostics;

/// <summary>How serious a diagnostic is. Errors fail a build.</summary>
public enum Severity
{
    /// <summary>Information only.</summary>
    Note,
    /// <summary>Something to look at; fails the build only when warnings are treated as errors.</summary>
    Warning,
    /// <summary>Fails the build.</summary>
    Error,
}
