using DesignRules.Diagnostics;
using DesignRules.Rules;

namespace DesignRules.Cli;

/// <summary>Findings for people: one compiler-style line each, then a summary.</summary>
internal static class HumanReport
{
    public static void Write(CheckReport report, string summary, Terminal terminal)
    {
        foreach (var f in report.Findings)
        {
            // A waived finding says "waived", never its level: a log parser that counts "warning" lines counts open ones only.
            var level = f.IsWaived ? "waived" : f.Severity.ToString().ToLowerInvariant();
            var painted = f.IsWaived ? terminal.Dim(level) : f.Severity switch
            {
                Severity.Error => terminal.Red(level),
                Severity.Warning => terminal.Yellow(level),
                _ => terminal.Cyan(level),
            };
            var line = $"{f.Span}: {painted} {terminal.Bold(f.RuleId)}: {f.Message}";
            terminal.Output.WriteLine(f.IsWaived ? $"{line} {terminal.Dim($"(reason: {f.Waiver})")}" : line);
        }

        terminal.Output.WriteLine(summary);
    }
}
