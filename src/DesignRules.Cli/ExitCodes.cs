namespace DesignRules.Cli;

/// <summary>The process exit codes the command line promises.</summary>
internal static class ExitCodes
{
    /// <summary>No finding at error level.</summary>
    public const int Clean = 0;

    /// <summary>At least one finding at error level (not waived).</summary>
    public const int Errors = 1;

    /// <summary>The input or the options cannot be used (a missing path, a malformed option, an unknown rule id).</summary>
    public const int Unusable = 2;
}
