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

/// <summary>The JSON report lists every stage's Monte Carlo yield with its interval, level, samples and verdict.</summary>
public sealed class YieldReportTests
{
    [Fact]
    public void The_json_report_carries_the_yield_interval_and_the_samples()
    {
        var root = Path.Combine(TestPaths.RepositoryRoot, "example-design");
        var loaded = DesignLoader.LoadFiles([Path.Combine(root, "designs", "door-impact-peak-hold.yaml")]);
        var estimate = new YieldEstimate("peak-hold", 4000, 3981, 7, 0.05, 0.99, 0.95, 0.99295, 0.99714, YieldVerdict.Met, null, Sequential: true);
        var report = new CheckReport([], [], 1, 1)
        {
            Designs = [new DesignSummary(Assert.Single(loaded.Designs), [], []) { Yields = [estimate] }],
        };

        var yields = JsonDocument.Parse(JsonReport.ToBytes(report, new ReportSettings(root, null, "0.0.0"))).RootElement.GetProperty("yields");

        var y = Assert.Single(yields.EnumerateArray().ToList());
        Assert.Equal("door-impact-peak-hold", y.GetProperty("design").GetString());
        Assert.Equal("peak-hold", y.GetProperty("stage").GetString());
        Assert.Equal(4000, y.GetProperty("samples").GetInt32());
        Assert.Equal(3981, y.GetProperty("passing").GetInt32());
        Assert.Equal(0.99295, y.GetProperty("lower").GetDouble());
        Assert.Equal(0.99714, y.GetProperty("upper").GetDouble());
        Assert.Equal(0.95, y.GetProperty("confidence").GetDouble());
        Assert.Equal(0.99, y.GetProperty("required").GetDouble());
        Assert.Equal("met", y.GetProperty("verdict").GetString());
        Assert.True(y.GetProperty("sequential").GetBoolean());
        Assert.Equal(JsonValueKind.Null, y.GetProperty("samplesNeeded").ValueKind);
    }
}
