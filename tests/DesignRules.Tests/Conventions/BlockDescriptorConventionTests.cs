using System.Text.RegularExpressions;
using DesignRules.Blocks;
using DesignRules.Tests.Loading;

namespace DesignRules.Tests.Conventions;

/// <summary>
/// A built-in block's knowledge lives in its descriptor (src/DesignRules.Core/Blocks) and nowhere else: no other source
/// or template file names a block in a string literal or tests a block's name.
/// </summary>
public sealed partial class BlockDescriptorConventionTests
{
    private static readonly string DescriptorFolder = Path.Combine("src", "DesignRules.Core", "Blocks") + Path.DirectorySeparatorChar;

    [Fact]
    public void No_file_outside_the_descriptors_switches_over_block_names()
    {
        var root = FixtureFiles.RepositoryRoot();
        var names = BlockCatalog.All.Keys.ToHashSet(StringComparer.Ordinal);
        var offenders = new List<string>();
        var files = Directory.EnumerateFiles(Path.Combine(root, "src"), "*.cs", SearchOption.AllDirectories)
            .Concat(Directory.EnumerateFiles(Path.Combine(root, "templates"), "*", SearchOption.AllDirectories))
            .Where(f => !Path.GetRelativePath(root, f).StartsWith(DescriptorFolder, StringComparison.Ordinal))
            .Where(f => !f.Contains($"{Path.DirectorySeparatorChar}obj{Path.DirectorySeparatorChar}", StringComparison.Ordinal));
        foreach (var file in files)
        {
            var lines = File.ReadAllLines(file);
            for (int i = 0; i < lines.Length; i++)
            {
                // A requirement's transfer kind may share a block's word ("absolute-value"); that table is not about blocks.
                // Nor is an XML documentation attribute (<param name="inverting">).
                var line = DocAttribute().Replace(TransferKeyEntry().Replace(lines[i], string.Empty), string.Empty);
                bool literal = Literal().Matches(line).Any(m => names.Contains(m.Groups[1].Value));
                if (literal || NameTest().IsMatch(line))
                {
                    offenders.Add($"{Path.GetRelativePath(root, file)}({i + 1}): {lines[i].Trim()}");
                }
            }
        }

        Assert.True(offenders.Count == 0, "block names outside the descriptors:\n" + string.Join('\n', offenders));
    }

    [Fact]
    public void The_convention_scan_would_see_a_switch_over_block_names()
    {
        // The scan above must be able to fail: the patterns it uses find the shapes the old switches had.
        Assert.Matches(Literal(), "\"peak-detector\" => \"rdis\",");
        Assert.Matches(NameTest(), "var x = (block.Block.Name, slot) switch");
        Assert.Matches(NameTest(), "stage is BlockStage { Block.Name: \"difference\" }");
        Assert.DoesNotMatch(NameTest(), "kind = block.Block.Name;");
        Assert.DoesNotMatch(NameTest(), "var kind = stage is BlockStage b ? b.Block.Name : \"netlist\";");
    }

    [Fact]
    public void Every_descriptor_names_distinct_values_and_slots_the_loader_can_type()
    {
        foreach (var block in BlockCatalog.All.Values)
        {
            var values = block.AllValues.Concat(block.Flags).ToList();
            Assert.Equal(values.Count, values.Distinct(StringComparer.Ordinal).Count());
            Assert.All(block.AmplifierSlots.Concat(block.OptionalAmplifierSlots), s => Assert.Matches("^u[0-9]+$", s));
            Assert.All(block.DiodeSlots, s => Assert.Matches("^d[0-9]+$", s));
            // Only blocks with diodes rectify, and only a slot the block has opens its loop by design.
            Assert.True(!block.Rectifies || block.DiodeSlots.Count > 0, block.Name);
            Assert.All(new[] { "u9" }, s => Assert.False(block.OpensLoopByDesign(s), block.Name));
            Assert.True(block.OutputValue is null || block.AllValues.Contains(block.OutputValue), block.Name);
        }
    }

    [GeneratedRegex("\"([a-z][a-z-]*)\"")]
    private static partial Regex Literal();

    [GeneratedRegex(@"Block\.Name\s*(\)\s*switch|switch|==|!=|is\b)|Block\.Name:\s*""|\(\w+\.Block\.Name,")]
    private static partial Regex NameTest();

    [GeneratedRegex(@"<\w+ name=""[^""]*""")]
    private static partial Regex DocAttribute();

    [GeneratedRegex(@"\[""[a-z-]+""\]\s*=\s*TransferKind\.")]
    private static partial Regex TransferKeyEntry();
}
