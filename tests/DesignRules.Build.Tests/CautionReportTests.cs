using System.Text.Json;
using DesignRules.Loading;
using DesignRules.Reports;
using DesignRules.Rules;

namespace DesignRules.Build.Tests;

/// <summary>
/// The JSON and SARIF reports carry the safety caution of every design that declares a hazard or works above
/// extra-low voltage: here the example's motor-current monitor (<c>hazards: [mains]</c>) and not its peak-hold design
/// (no declaration, ±15 V rails, 2 V signal).
/// </summary>
public sealed class CautionReportTests
{
    private static readonly string Root = Path.Combine(TestPaths.RepositoryRoot, "example-design");

    private static CheckReport Report()
    {
        var loaded = DesignLoader.LoadFiles([
            Path.Combine(Root, "designs", "motor-current-monitor.yaml"),
            Path.Combine(Root, "designs", "door-impact-peak-hold.yaml"),
        ]);
        Assert.False(loaded.HasErrors, string.Join(Environment.NewLine, loaded.Diagnostics));
        return new CheckReport([], [], loaded.Designs.Count, 2)
        {
            Designs = loaded.Designs.Select(d => new DesignSummary(d, [], [])).ToList(),
        };
    }

    private static ReportSettings Settings => new(Root, null, "0.0.0");

    private static void AssertMotorCaution(JsonElement cautions)
    {
        var caution = Assert.Single(cautions.EnumerateArray().ToList());
        Assert.Equal("motor-current-monitor", caution.GetProperty("design").GetString());
        Assert.Equal("designs/motor-current-monitor.yaml", caution.GetProperty("file").GetString());
        Assert.Equal(["mains"], caution.GetProperty("hazards").EnumerateArray().Select(h => h.GetString()));
        Assert.Equal("The current transformer clamps around a mains-powered compressor motor lead.", caution.GetProperty("note").GetString());
        Assert.False(caution.GetProperty("aboveExtraLowVoltage").GetBoolean());
        Assert.Contains("protective earthing and installation follow local codes and licensed practice", caution.GetProperty("text").GetString(), StringComparison.Ordinal);
    }

    [Fact]
    public void The_json_report_lists_the_motor_monitor_caution_and_no_other()
    {
        var document = JsonDocument.Parse(JsonReport.ToBytes(Report(), Settings)).RootElement;

        AssertMotorCaution(document.GetProperty("cautions"));
    }

    [Fact]
    public void The_sarif_run_carries_the_same_caution_in_its_property_bag()
    {
        var document = JsonDocument.Parse(SarifReport.ToBytes(Report(), Settings)).RootElement;

        var run = Assert.Single(document.GetProperty("runs").EnumerateArray().ToList());
        AssertMotorCaution(run.GetProperty("properties").GetProperty("cautions"));
    }
}
