using System.Reflection;
using DesignRules.Loading;
using DesignRules.Model;

namespace DesignRules.Elaboration.Tests;

/// <summary>Loads designs written as YAML text in a test (with an optional parts file beside them), and finds the repository.</summary>
internal static class TestDesigns
{
    /// <summary>Loads one design from YAML text; a parts file, when given, is written beside it as <c>parts.yaml</c>.</summary>
    public static Design Load(string yaml, string? partsYaml = null)
    {
        string file = "test.yaml";
        if (partsYaml is not null)
        {
            string folder = Path.Combine(Path.GetTempPath(), "dr-elab-tests", Guid.NewGuid().ToString("N"));
            Directory.CreateDirectory(folder);
            File.WriteAllText(Path.Combine(folder, "parts.yaml"), partsYaml);
            file = Path.Combine(folder, "test.yaml");
        }

        var result = new DesignLoader().LoadText(file, yaml);
        Assert.False(result.HasErrors, string.Join("\n", result.Diagnostics));
        return Assert.Single(result.Designs);
    }

    /// <summary>Elaborates and asserts the chain has no problems.</summary>
    public static ElaboratedChain Elaborate(Design design, ElaborationOptions? options = null)
    {
        var chain = ChainElaborator.Elaborate(design, options);
        Assert.True(chain.Succeeded, string.Join("\n", chain.Problems));
        return chain;
    }

    /// <summary>The repository root, recorded at build time (outputs may live outside the source tree).</summary>
    public static string RepositoryRoot() =>
        typeof(TestDesigns).Assembly.GetCustomAttributes<AssemblyMetadataAttribute>().Single(a => a.Key == "RepositoryRoot").Value!;

    /// <summary>A design with a DC source, no source impedance, a light load and one block stage given as YAML lines.</summary>
    public static string DcDesign(string stageYaml, double level = 1, string supplies = "{ positive: 15 V, negative: -15 V }", string sourceExtra = "") => $$"""
        design:
          id: test
        supplies: {{supplies}}
        source: { waveform: dc, offset: {{level.ToString(System.Globalization.CultureInfo.InvariantCulture)}} V{{sourceExtra}} }
        load: { resistance: 1M }
        stages:
        {{stageYaml}}
        """;
}

/// <summary>Reading sampled waveforms of variable time step.</summary>
internal static class Waveforms
{
    /// <summary>The mean of a sampled waveform over [t0, t1] by the trapezoid rule on the engine's own time points.</summary>
    public static double Mean(IReadOnlyList<double> time, IReadOnlyList<double> values, double t0, double t1)
    {
        double area = 0;
        for (int i = 1; i < time.Count; i++)
        {
            double a = Math.Max(time[i - 1], t0), b = Math.Min(time[i], t1);
            if (b <= a) continue;
            double va = Interpolate(time, values, a), vb = Interpolate(time, values, b);
            area += 0.5 * (va + vb) * (b - a);
        }

        return area / (t1 - t0);
    }

    public static double Interpolate(IReadOnlyList<double> time, IReadOnlyList<double> values, double t)
    {
        if (t <= time[0]) return values[0];
        if (t >= time[^1]) return values[^1];
        int lo = 0, hi = time.Count - 1;
        while (hi - lo > 1)
        {
            int mid = (lo + hi) / 2;
            if (time[mid] <= t) lo = mid; else hi = mid;
        }

        double f = (t - time[lo]) / (time[hi] - time[lo]);
        return values[lo] + (f * (values[hi] - values[lo]));
    }
}
