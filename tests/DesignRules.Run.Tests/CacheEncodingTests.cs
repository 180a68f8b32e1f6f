using System.Text;
using System.Text.Json;
using DesignRules.Loading;
using DesignRules.Rules;

namespace DesignRules.Run.Tests;

/// <summary>
/// How the results cache stores the bulk of a result, a plot's numbers: as the bytes of each value, which read back
/// bit for bit and without parsing decimal text, and refuse to read back as anything else.
/// </summary>
public sealed class CacheEncodingTests : IDisposable
{
    // IEEE 754-2008 binary64: the values whose text form is the hardest to give back exactly (NaN, both infinities,
    // negative zero, the smallest subnormal, the largest finite value) and a value that needs all 17 significant digits.
    private static readonly double[] Awkward =
        [double.NaN, double.PositiveInfinity, double.NegativeInfinity, -0.0, double.Epsilon, double.MaxValue, 0.1 + 0.2];

    private readonly ExampleCopy repo = new();

    public void Dispose() => repo.Dispose();

    [Fact]
    public void A_plots_numbers_come_back_bit_for_bit_including_NaN_infinities_and_negative_zero()
    {
        var design = AnyDesign();
        var plot = new StagePlots("stage", new TransientPlot(1e3, Awkward, [new Trace("out", TraceRole.StageOutput, Awkward)], []),
            new BodePlot(Awkward, Awkward, Awkward), new SampleDistribution("gain", "V/V", Awkward, -0.0, double.NaN));
        var original = new DesignResult([], new DesignSummary(design, [], []) { Plots = [plot] });

        var replayed = ResultCodec.Decode(ResultCodec.Encode(original), design).Summary.Plots.Single();

        foreach (var values in new[] { replayed.Transient!.Time, replayed.Transient.Traces.Single().Values, replayed.Bode!.Frequency,
            replayed.Bode.MagnitudeDb, replayed.Bode.PhaseDegrees, replayed.Distribution!.Samples })
        {
            Assert.Equal(Awkward.Select(BitConverter.DoubleToInt64Bits), values.Select(BitConverter.DoubleToInt64Bits));
        }
    }

    [Fact]
    public void A_plots_numbers_are_stored_as_one_text_of_their_bytes_not_as_decimal_numbers()
    {
        var design = AnyDesign();
        var plot = new StagePlots("stage", null, new BodePlot([10.0, 100.0, 1000.0], [0.0, -3.0103, -20.0], [0.0, -45.0, -84.3]), null);
        var bytes = ResultCodec.Encode(new DesignResult([], new DesignSummary(design, [], []) { Plots = [plot] }));

        using var stored = JsonDocument.Parse(bytes);
        var bode = stored.RootElement.GetProperty("Plots")[0].GetProperty("Bode");
        Assert.Equal(JsonValueKind.String, bode.GetProperty("Frequency").ValueKind);
        // 3 values of 8 bytes each (IEEE 754 binary64), little-endian: 10.0 is 0x4024000000000000.
        var raw = Convert.FromBase64String(bode.GetProperty("Frequency").GetString()!);
        Assert.Equal(24, raw.Length);
        Assert.Equal(new byte[] { 0, 0, 0, 0, 0, 0, 0x24, 0x40 }, raw[..8]);
    }

    [Fact]
    public void A_list_of_numbers_whose_bytes_are_not_whole_values_is_refused_as_a_damaged_entry()
    {
        var design = AnyDesign();
        var plot = new StagePlots("stage", null, new BodePlot([10.0], [0.0], [0.0]), null);
        var text = Encoding.UTF8.GetString(ResultCodec.Encode(new DesignResult([], new DesignSummary(design, [], []) { Plots = [plot] })));
        var eight = Convert.ToBase64String(BitConverter.GetBytes(10.0));
        var seven = Convert.ToBase64String(BitConverter.GetBytes(10.0)[..7]);
        Assert.Contains(eight, text, StringComparison.Ordinal);

        var damaged = Encoding.UTF8.GetBytes(text.Replace(eight, seven, StringComparison.Ordinal));

        Assert.Throws<JsonException>(() => ResultCodec.Decode(damaged, design));
    }

    [Fact]
    public void A_kept_page_whose_file_was_only_touched_is_still_kept_and_an_edit_of_the_same_size_is_rendered_again()
    {
        repo.Run();
        var page = Path.Combine(repo.Pages, "door-impact-peak-hold.md");
        var text = File.ReadAllText(page);

        // A new last-write time alone: the content is read and is still what was written, so the page is kept.
        File.SetLastWriteTimeUtc(page, File.GetLastWriteTimeUtc(page).AddMinutes(5));
        var (touched, _) = repo.Run();
        Assert.Contains("door-impact-peak-hold.md", touched.Pages!.Kept);

        // An edit that keeps the size: its last-write time moves, the content differs, and the page is rendered again.
        var edited = text[..^2] + (text[^2] == 'x' ? "y" : "x") + text[^1];
        File.WriteAllText(page, edited);
        var (after, _) = repo.Run();
        Assert.DoesNotContain("door-impact-peak-hold.md", after.Pages!.Kept);
        Assert.Equal(text, File.ReadAllText(page));
    }

    private static DesignRules.Model.Design AnyDesign() =>
        DesignLoader.LoadFiles([Path.Combine(ExampleCopy.RepositoryRoot, "example-design", "designs", "door-impact-peak-hold.yaml")]).Designs.Single();
}
