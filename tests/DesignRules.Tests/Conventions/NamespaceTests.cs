using System.Text.RegularExpressions;
using System.Xml.Linq;
using DesignRules.Tests.Loading;

namespace DesignRules.Tests.Conventions;

/// <summary>
/// Namespaces follow folders: a file in <c>src/P/A/B/</c> declares the project's root namespace followed by <c>.A.B</c>,
/// so a type is found where its namespace says. Holds for every project under src/ and tests/.
/// </summary>
public sealed partial class NamespaceTests
{
    public static TheoryData<string> Projects()
    {
        var root = FixtureFiles.RepositoryRoot();
        var data = new TheoryData<string>();
        foreach (var project in Directory.EnumerateFiles(Path.Combine(root, "src"), "*.csproj", SearchOption.AllDirectories)
                     .Concat(Directory.EnumerateFiles(Path.Combine(root, "tests"), "*.csproj", SearchOption.AllDirectories))
                     .Order(StringComparer.Ordinal))
        {
            data.Add(Path.GetRelativePath(root, project).Replace('\\', '/'));
        }

        return data;
    }

    [Theory]
    [MemberData(nameof(Projects))]
    public void Every_file_declares_the_namespace_of_its_folder(string project)
    {
        var root = FixtureFiles.RepositoryRoot();
        var file = Path.Combine(root, project);
        var folder = Path.GetDirectoryName(file)!;
        var rootNamespace = XDocument.Load(file).Descendants("RootNamespace").Select(e => e.Value).FirstOrDefault()
            ?? Path.GetFileNameWithoutExtension(file);
        var offenders = new List<string>();
        foreach (var source in Directory.EnumerateFiles(folder, "*.cs", SearchOption.AllDirectories))
        {
            var relative = Path.GetRelativePath(folder, source);
            if (relative.StartsWith("obj", StringComparison.Ordinal) || relative.StartsWith("bin", StringComparison.Ordinal))
            {
                continue;
            }

            var match = Namespace().Match(File.ReadAllText(source));
            if (!match.Success)
            {
                continue; // top-level statements (a program's entry point) declare no namespace
            }

            var sub = Path.GetDirectoryName(relative)!.Replace(Path.DirectorySeparatorChar, '.');
            var expected = sub.Length == 0 ? rootNamespace : $"{rootNamespace}.{sub}";
            if (match.Groups[1].Value != expected)
            {
                offenders.Add($"{relative}: namespace {match.Groups[1].Value}, expected {expected}");
            }
        }

        Assert.True(offenders.Count == 0, string.Join('\n', offenders));
    }

    [GeneratedRegex(@"^namespace ([\w.]+)\s*[;{]", RegexOptions.Multiline | RegexOptions.CultureInvariant)]
    private static partial Regex Namespace();
}
