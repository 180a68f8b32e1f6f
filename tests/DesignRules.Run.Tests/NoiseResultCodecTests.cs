using DesignRules.Rules;

namespace DesignRules.Run.Tests;

/// <summary>The results cache's encoding gives back what a check computed, noise plots and noise figures included.</summary>
public sealed class NoiseResultCodecTests : IDisposable
{
    private readonly ExampleCopy repo = new();

    public void Dispose() => repo.Dispose();

    [Fact]
    public void A_design_with_noise_requirements_round_trips_its_noise_plot_and_noise_figures_byte_for_byte()
    {
        // The envelope design states an snr on its preamp and a min-signal on its rectifier: both get a noise analysis.
        var report = DesignCheck.Run([repo.Design("compressor-vibration-envelope")], new CheckOptions(repo.RuleSet, new DateOnly(2026, 12, 1)));
        var summary = Assert.Single(report.Designs);
        var result = new DesignResult(report.Findings.Where(f => f.DesignId == summary.Design.Id.Value).ToList(), summary);

        var bytes = ResultCodec.Encode(result);
        var decoded = ResultCodec.Decode(bytes, summary.Design);
        Assert.Equal(bytes, ResultCodec.Encode(decoded));

        var noisy = summary.Plots.Where(p => p.Noise is not null).ToList();
        Assert.Equal(["preamp", "rectifier"], noisy.Select(p => p.StageId));
        foreach (var plots in noisy)
        {
            var before = plots.Noise!;
            var after = decoded.Summary.Plots.Single(p => p.StageId == plots.StageId).Noise;
            Assert.NotNull(after);
            Assert.Equal(before.Frequency, after.Frequency);
            Assert.Equal(before.Total, after.Total);
            Assert.Equal(before.OutputRms, after.OutputRms);
            Assert.Equal(before.Contributors.Select(c => (c.Element, c.Source, c.Rms, c.Share)), after.Contributors.Select(c => (c.Element, c.Source, c.Rms, c.Share)));
            Assert.Equal(before.Contributors.SelectMany(c => c.Density), after.Contributors.SelectMany(c => c.Density));
        }

        var noiseFigures = summary.StageFigures.SelectMany(s => s.Value).Where(f => f.Key.Kind.Name.StartsWith("noise.", StringComparison.Ordinal)).ToList();
        Assert.Contains(noiseFigures, f => f.Key == FigureKinds.SignalToNoise.Key && f.Limit is not null);
        Assert.Contains(noiseFigures, f => f.Key == FigureKinds.DeadZoneAndFloor.Key && f.Limit is not null);
        var decodedNoise = decoded.Summary.StageFigures.SelectMany(s => s.Value).Where(f => f.Key.Kind.Name.StartsWith("noise.", StringComparison.Ordinal)).ToList();
        Assert.Equal(noiseFigures, decodedNoise);
    }
}
