using System.Diagnostics;
using CsCheck;
using DesignRules.Diagnostics;
using DesignRules.Loading;

namespace DesignRules.Tests.Loading;

/// <summary>
/// Generated and mutated design files: every one must end in a model or in located diagnostics, never an
/// exception, and never take more than a second.
/// </summary>
public sealed class LoaderRobustnessProperties
{
    private static readonly string[] Seeds =
    [
        File.ReadAllText(Path.Combine(FixtureFiles.Directory("loader/good"), "inverting.yaml")),
        .. FixtureFiles.Yaml("loader/bad").Select(File.ReadAllText),
    ];

    // Characters that matter to YAML and to our value syntax, plus ordinary text.
    private const string Alphabet = ":-[]{}&*!|>'\"#%@`,?~ \n\t.0123456789kMmunpµΩ%VAFHzs/°abcdefxyzR_";

    private static readonly Gen<string> Token = Gen.OneOf<string>(
        Gen.Char[Alphabet].Array[1, 6].Select(a => new string(a)),
        Gen.OneOf<string>("design:", "library:", "stages:", "- ", "  ", "\n", "*a", "&a ", "<<: ", "1e308", "-0", "NaN", "4k7",
            "R47", "10 V/us", "20Hz..20kHz", "..", "true", "null", "~", "block: absolute-value", "netlist:", "between: [a, b]",
            "jfet-input-15v", "values:", "{", "}", "[", "]", "\"", "'", "!!binary", "%YAML 1.2\n---\n", "---\n", "\t"));

    private static readonly Gen<string> Mutated =
        Gen.Select(Gen.Int[0, Seeds.Length - 1], Gen.Select(Gen.Int[0, 3], Gen.Int[0, 4000], Gen.Int[0, 40], Token).Array[1, 8])
            .Select((seed, edits) =>
            {
                var text = Seeds[seed];
                foreach (var (kind, at, length, token) in edits)
                {
                    var i = text.Length == 0 ? 0 : at % text.Length;
                    text = kind switch
                    {
                        0 => text.Insert(i, token),
                        1 => text.Remove(i, Math.Min(length, text.Length - i)),
                        2 => text.Remove(i, Math.Min(length, text.Length - i)).Insert(i, token),
                        _ => SwapLines(text, at, length),
                    };
                }

                return text;
            });

    private static readonly Gen<string> Generated =
        Gen.Select(Gen.Int[0, 3], Token).Array[0, 60].Select(parts =>
            string.Concat(parts.Select(p => new string(' ', p.Item1 * 2) + p.Item2 + (p.Item1 == 3 ? "\n" : string.Empty))));

    [Fact]
    public void Ten_thousand_generated_and_mutated_files_end_in_a_model_or_located_diagnostics()
    {
        // Warm up first, so that compiling the loader is not counted against the first generated file.
        _ = new DesignLoader(LoaderLimits.Default, _ => null).LoadText("warm-up.yaml", Seeds[0]);
        Gen.Frequency<string>((4, Mutated), (1, Generated)).Sample(
            text =>
            {
                var clock = Stopwatch.StartNew();
                var result = new DesignLoader(LoaderLimits.Default, _ => null).LoadText("fuzz.yaml", text);
                clock.Stop();

                Assert.True(clock.Elapsed < TimeSpan.FromSeconds(1), $"took {clock.Elapsed} on:\n{text}");
                // A mutated parts-file fixture may still be a valid parts file: then a library loads instead of a design.
                var loadedLibrary = result.Libraries.Any(l => l.File != DesignLoader.BuiltinLibraryFile);
                Assert.True(result.Designs.Count == 1 || loadedLibrary || result.Diagnostics.Any(d => d.Severity == Severity.Error),
                    "neither a design, a parts library nor an error for:\n" + text);
                foreach (var d in result.Diagnostics)
                {
                    Assert.Matches("^DR9[0-9]{2}$", d.Id);
                    Assert.True(d.Span.Line >= 1 && d.Span.Column >= 1, d.ToString());
                    Assert.False(string.IsNullOrWhiteSpace(d.Message));
                }
            },
            iter: 10_000,
            threads: 1,
            // Fixed, so every run (and CI) tests the same 10,000 files; this seed once produced a valid parts file.
            seed: "7e_xvcf8Rfb1");
    }

    private static string SwapLines(string text, int a, int b)
    {
        var lines = text.Split('\n');
        if (lines.Length < 2)
        {
            return text;
        }

        var i = a % lines.Length;
        var j = b % lines.Length;
        (lines[i], lines[j]) = (lines[j], lines[i]);
        return string.Join('\n', lines);
    }
}
