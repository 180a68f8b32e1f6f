using System.Reflection;
using System.Text;

namespace DesignRules.Run;

/// <summary>
/// Which tool computed a result, as precisely as it can be told: the version, and the build identity (module version id)
/// of every DesignRules assembly and every library they use. A rebuilt tool — even one of the same version from a
/// changed working tree — has another identity, so the cache never replays a result an older tool computed.
/// </summary>
internal static class ToolIdentity
{
    private static readonly Lazy<string> Value = new(Compute);

    public static string Text => Value.Value;

    private static string Compute()
    {
        var text = new StringBuilder("version ").Append(RepositoryConventions.ToolVersion).Append('\n');
        var seen = new SortedDictionary<string, string>(StringComparer.Ordinal);
        var pending = new Stack<Assembly>([typeof(ToolIdentity).Assembly]);
        while (pending.Count > 0)
        {
            var assembly = pending.Pop();
            var name = assembly.GetName().Name ?? string.Empty;
            if (seen.ContainsKey(name))
            {
                continue;
            }

            seen[name] = assembly.ManifestModule.ModuleVersionId.ToString("N") + " " + assembly.GetName().Version;
            foreach (var reference in assembly.GetReferencedAssemblies().Where(r => Counts(r.Name)))
            {
                if (!seen.ContainsKey(reference.Name!))
                {
                    pending.Push(Assembly.Load(reference));
                }
            }
        }

        foreach (var (name, identity) in seen)
        {
            text.Append(name).Append(' ').Append(identity).Append('\n');
        }

        return text.ToString();
    }

    // The tool's own assemblies and the libraries whose behaviour shapes a result or a page.
    private static bool Counts(string? name) =>
        name is not null && (name.StartsWith("DesignRules", StringComparison.Ordinal) || name.StartsWith("YamlDotNet", StringComparison.Ordinal)
            || name.StartsWith("MathNet", StringComparison.Ordinal) || name.StartsWith("Scriban", StringComparison.Ordinal)
            || name.StartsWith("OxyPlot", StringComparison.Ordinal));
}
