namespace DesignRules.Pages.Tests;

/// <summary>
/// The example's motor-current monitor takes its signal from a current transformer on a mains-powered motor lead and
/// declares <c>hazards: [mains]</c>: its page and the index carry the caution. The peak-hold design declares nothing and
/// stays within extra-low voltage (±15 V rails, 2 V signal): its page carries none.
/// </summary>
public sealed class CautionTests
{
    private static readonly Lazy<string> Folder = new(() => ExamplePages.Render().Folder);

    private const string Scope = "isolation, creepage and clearance, protective earthing and installation follow local codes and licensed practice";

    [Fact]
    public void The_motor_current_monitor_page_shows_the_mains_caution_with_its_note()
    {
        var page = File.ReadAllText(Path.Combine(Folder.Value, "motor-current-monitor.md"));

        var caution = Assert.Single(page.Split('\n'), l => l.StartsWith("> **Caution.**", StringComparison.Ordinal));
        Assert.Contains("connects to mains: The current transformer clamps around a mains-powered compressor motor lead.", caution, StringComparison.Ordinal);
        Assert.Contains(Scope, caution, StringComparison.Ordinal);
        Assert.DoesNotContain("extra-low voltage", caution, StringComparison.Ordinal);
    }

    [Fact]
    public void The_index_shows_the_caution_for_the_motor_current_monitor_only()
    {
        var index = File.ReadAllText(Path.Combine(Folder.Value, "index.md"));

        var cautions = index.Split('\n').Where(l => l.StartsWith("> **Caution", StringComparison.Ordinal)).ToList();
        var caution = Assert.Single(cautions);
        Assert.Contains("Compressor motor current monitor", caution, StringComparison.Ordinal);
        Assert.Contains("connects to mains", caution, StringComparison.Ordinal);
        Assert.Contains(Scope, caution, StringComparison.Ordinal);
    }

    [Fact]
    public void A_design_without_hazards_and_with_low_voltages_shows_no_caution()
    {
        var page = File.ReadAllText(Path.Combine(Folder.Value, "door-impact-peak-hold.md"));

        Assert.DoesNotContain("Caution", page, StringComparison.Ordinal);
    }
}
