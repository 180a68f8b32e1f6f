using System.Numerics;

namespace DesignRules.Simulation.Noise;

/// <summary>
/// Small-signal noise analysis at the DC operating point. At each frequency the devices load their linearised
/// admittances (as in the AC analysis), the transfer of every noise source to the output is found (<see cref="NoiseTransfer"/>),
/// and the output power density is Σ |H_k(f)|²·S_k(f) over the independent sources. The densities are integrated over
/// the band by the trapezoidal rule in ln f (∫S df = ∫S·f d(ln f)), halving the logarithmic step until two successive
/// totals agree within the request's tolerance; the refinement is bounded by the request and by the sweep-point limit.
/// </summary>
internal static class NoiseAnalysis
{
    public static NoiseResult Run(CompiledCircuit compiled, double[] operatingPoint, NoiseRequest request, SolverLimits limits)
    {
        var layout = compiled.Layout;
        if (!layout.Nodes.TryGetValue(request.Output, out int output))
        {
            return new NoiseResult(new SimulationFailure(FailureKind.UnusableRequest, $"the noise output '{request.Output}' is not a node of this circuit") { Node = request.Output });
        }

        var sources = NoiseSource.Collect(compiled, operatingPoint);
        var context = new AcLoadContext(layout.Size)
        {
            JunctionShunt = limits.JunctionShunt, Temperature = compiled.Temperature, Stimulus = request.InputSource, StimulusAmplitude = 1,
        };
        Array.Copy(operatingPoint, context.X, operatingPoint.Length);
        var transfer = NoiseTransfer.For(request.Method, layout.Size);
        var transfers = new Complex[sources.Count];
        SimulationFailure? failure = null;

        Sample? Evaluate(double u)
        {
            double f = Math.Exp(u);
            context.Omega = 2 * Math.PI * f;
            context.System.Clear();
            foreach (var device in compiled.Devices) device.LoadAc(context);
            if (!transfer.Solve(context.System, output, sources, transfers, out var gain, out int singular))
            {
                string? owner = layout.Owners[singular];
                failure = new SimulationFailure(FailureKind.Undetermined, $"the small-signal equations of the noise analysis leave '{layout.Names[singular]}' undetermined")
                {
                    Node = owner is null ? layout.Names[singular] : null,
                    ElementId = owner,
                    SweepValue = f,
                };
                return null;
            }

            var power = new double[sources.Count];
            for (int k = 0; k < sources.Count; k++)
            {
                double h = transfers[k].Magnitude;
                power[k] = h * h * sources[k].Density(f);
            }

            return new Sample(f, power, gain.Magnitude);
        }

        double u0 = Math.Log(request.Start), u1 = Math.Log(request.Stop);
        int intervals = Math.Max(2, (int)Math.Ceiling((Math.Log10(request.Stop / request.Start) * request.PointsPerDecade) - 1e-9));
        if (intervals + 1 > limits.MaxSweepPoints)
        {
            return new NoiseResult(new SimulationFailure(FailureKind.UnusableRequest, "the noise band needs more frequency points than the sweep-point limit allows"));
        }

        var samples = new List<Sample>(intervals + 1);
        for (int i = 0; i <= intervals; i++)
        {
            // The last point is the band top exactly, not exp(ln) of it.
            if (Evaluate(i == intervals ? u1 : u0 + ((u1 - u0) * i / intervals)) is not { } s) return new NoiseResult(failure);
            samples.Add(s);
        }

        samples[^1] = samples[^1] with { Frequency = request.Stop };
        samples[0] = samples[0] with { Frequency = request.Start };
        double[] integrals = Integrate(samples, sources.Count, (u1 - u0) / intervals);
        double total = integrals.Sum();
        double change = double.PositiveInfinity;
        bool converged = false;
        for (int level = 0; level < request.MaxRefinements && !converged; level++)
        {
            if ((2 * intervals) + 1 > limits.MaxSweepPoints) break;
            var refined = new List<Sample>((2 * intervals) + 1);
            double h = (u1 - u0) / (2 * intervals);
            for (int i = 0; i < intervals; i++)
            {
                refined.Add(samples[i]);
                if (Evaluate(u0 + (h * ((2 * i) + 1))) is not { } mid) return new NoiseResult(failure);
                refined.Add(mid);
            }

            refined.Add(samples[^1]);
            samples = refined;
            intervals *= 2;
            double[] next = Integrate(samples, sources.Count, h);
            double nextTotal = next.Sum();
            change = nextTotal > 0 ? Math.Abs(nextTotal - total) / nextTotal : 0;
            converged = change <= request.Tolerance;
            integrals = next;
            total = nextTotal;
        }

        if (request.MaxRefinements == 0) change = double.NaN;
        return Result(compiled, sources, samples, integrals, total, converged, change);
    }

    /// <summary>Trapezoidal rule in u = ln f with step h: ∫S df = ∫S(f)·f du, per source.</summary>
    private static double[] Integrate(List<Sample> samples, int count, double h)
    {
        var sums = new double[count];
        for (int i = 0; i < samples.Count; i++)
        {
            double w = i == 0 || i == samples.Count - 1 ? 0.5 * h : h;
            var s = samples[i];
            for (int k = 0; k < count; k++) sums[k] += w * s.Power[k] * s.Frequency;
        }

        return sums;
    }

    private static NoiseResult Result(CompiledCircuit compiled, List<NoiseSource> sources, List<Sample> samples, double[] integrals, double total, bool converged, double change)
    {
        var contributors = new List<NoiseContribution>(sources.Count);
        for (int k = 0; k < sources.Count; k++)
        {
            var density = samples.Select(s => Math.Sqrt(s.Power[k])).ToArray();
            contributors.Add(new NoiseContribution(sources[k].Element, sources[k].Kind, Math.Sqrt(integrals[k]), total > 0 ? integrals[k] / total : 0, density));
        }

        contributors.Sort((a, b) =>
        {
            int byPower = b.Rms.CompareTo(a.Rms);
            if (byPower != 0) return byPower;
            int byId = string.CompareOrdinal(a.Element, b.Element);
            return byId != 0 ? byId : a.Kind.CompareTo(b.Kind);
        });
        return new NoiseResult(null)
        {
            Frequencies = samples.Select(s => s.Frequency).ToArray(),
            OutputDensity = samples.Select(s => Math.Sqrt(s.Power.Sum())).ToArray(),
            Gain = samples.Select(s => s.Gain).ToArray(),
            Contributors = contributors,
            OutputRms = Math.Sqrt(total),
            PassbandGain = samples.Count == 0 ? 0 : samples.Max(s => s.Gain),
            Converged = converged,
            RelativeChange = change,
            Temperature = compiled.Temperature,
        };
    }

    private sealed record Sample(double Frequency, double[] Power, double Gain);
}
