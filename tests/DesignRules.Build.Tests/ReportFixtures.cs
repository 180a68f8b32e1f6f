using DesignRules.Diagnostics;
using DesignRules.Reports;
using DesignRules.Rules;

namespace DesignRules.Build.Tests;

/// <summary>A hand-made check report: an error, a warning, a waived finding with figures, and a built-in library note.</summary>
internal static class ReportFixtures
{
    public static string Root { get; } = Path.Combine(Path.GetTempPath(), "designrules-report-root");

    public static ReportSettings Settings { get; } = new(Root, "https://example.invalid/rules/", "1.2.3");

    public static CheckReport Report()
    {
        var design = Path.Combine(Root, "designs", "front end.yaml");
        var parts = Path.Combine(Root, "parts", "bench.yaml");
        var rules = new[]
        {
            DesignFileDiagnostics.UnknownPart,
            new DiagnosticDescriptor(RuleIds.ZeroCrossingGlitch, "Zero-crossing glitch", "slew", Severity.Warning, "{0}", "rules/DR103.md"),
        };
        var findings = new[]
        {
            new Finding(RuleIds.UnknownPart, "Unknown part", Severity.Error, "No amplifier named 'x{0}' {braces} kept.", new SourceSpan(design, 14, 16, 14, 33),
                "rules/DR906.md", "front-end", "gain", null, []),
            new Finding(RuleIds.ZeroCrossingGlitch, "Zero-crossing glitch", Severity.Warning, "Glitch of 2.5 µs at 20 kHz; allowed 2 µs.", new SourceSpan(design, 20, 5, 20, 9),
                "rules/DR103.md", "front-end", "rect", "Accepted: the meter averages over 100 ms.",
                [FigureKinds.Glitch.Of(2.5e-6).AtMost(2e-6), FigureKinds.AllowedGlitch.Of(2e-6), FigureKinds.GlitchErrorBand.Of(double.NegativeInfinity)]),
            new Finding(RuleIds.ZeroCrossingGlitch, "Zero-crossing glitch", Severity.Warning, "Another glitch.", new SourceSpan(parts, 2, 1, 2, 1),
                "rules/DR103.md", null, null, null, []),
            new Finding("DR990", "Internal", Severity.Note, "Outside the catalogue.", new SourceSpan("builtin:parts", 1, 1, 1, 1),
                "rules/DR990.md", null, null, null, []),
        };
        return new CheckReport(findings, rules, 1, 2);
    }
}
