using System.Globalization;
using System.Reflection;
using System.Text.RegularExpressions;

namespace DesignRules.Benchmarks;

/// <summary>
/// A synthetic hardware repository of N designs for the scale benchmark: the example's four designs (its stage kinds —
/// non-inverting, absolute-value, averaging filter, peak detector, half-wave follower, difference — and its parts file)
/// copied round-robin under new ids, each with its source amplitude scaled by a factor from 0.90 to 1.00, so that no two
/// designs in a row have the same values. Below 0.9 the compressor's preamp fails its accuracy (its offset's share grows
/// as the signal shrinks), and a repository with errors is not the one a team's pull request builds: the build stops red
/// and the next build checks again instead of skipping. The rule set keeps the example's rules with a smaller Monte Carlo count
/// (100 samples per stage), so that a 500-design run fits a short benchmark job on a shared machine.
/// </summary>
internal static partial class SyntheticRepository
{
    public static string RepositoryRoot =>
        typeof(SyntheticRepository).Assembly.GetCustomAttributes<AssemblyMetadataAttribute>().Single(a => a.Key == "RepositoryRoot").Value!;

    /// <summary>Writes the repository into a fresh folder and returns it.</summary>
    public static string Write(int designs)
    {
        var root = Directory.CreateTempSubdirectory($"designrules-scale-{designs}-").FullName;
        var example = Path.Combine(RepositoryRoot, "example-design");
        Directory.CreateDirectory(Path.Combine(root, "designs"));
        Directory.CreateDirectory(Path.Combine(root, "parts"));
        foreach (var parts in Directory.GetFiles(Path.Combine(example, "parts"), "*.yaml"))
        {
            File.Copy(parts, Path.Combine(root, "parts", Path.GetFileName(parts)));
        }

        var templates = Directory.GetFiles(Path.Combine(example, "designs"), "*.yaml").Order(StringComparer.Ordinal).Select(File.ReadAllText).ToList();
        for (var i = 0; i < designs; i++)
        {
            var text = templates[i % templates.Count];
            var id = IdLine().Match(text).Groups[1].Value;
            var factor = 0.9 + (0.02 * (i / templates.Count % 6));
            text = IdLine().Replace(text, $"  id: {id}-{i:D4}", 1);
            text = Amplitude().Replace(text, m => string.Create(CultureInfo.InvariantCulture,
                $"  amplitude: {double.Parse(m.Groups[1].Value, CultureInfo.InvariantCulture) * factor:0.###} {m.Groups[2].Value}"), 1);
            File.WriteAllText(Path.Combine(root, "designs", $"{id}-{i:D4}.yaml"), text);
        }

        File.WriteAllText(Path.Combine(root, "design-rules.yaml"),
            "rule-set:\n  monte-carlo: { samples: 100, seed: 20261202, distribution: normal }\nrules:\n  DR301: { derating: 70% }\n");
        return root;
    }

    /// <summary>Changes one design's content (a comment), as an engineer's edit would: its key changes, the others' do not.</summary>
    public static void TouchOne(string root, int edit) =>
        File.AppendAllText(Directory.GetFiles(Path.Combine(root, "designs"), "*.yaml").Order(StringComparer.Ordinal).First(),
            string.Create(CultureInfo.InvariantCulture, $"# edit {edit}\n"));

    [GeneratedRegex(@"^  id: ([a-z0-9-]+)", RegexOptions.Multiline | RegexOptions.CultureInvariant)]
    private static partial Regex IdLine();

    [GeneratedRegex(@"^  amplitude: ([0-9.]+) (mV|V)", RegexOptions.Multiline | RegexOptions.CultureInvariant)]
    private static partial Regex Amplitude();
}
