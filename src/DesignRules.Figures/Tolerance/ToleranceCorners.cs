using System.Collections.Concurrent;
using System.Globalization;
using DesignRules.Elaboration;
using DesignRules.Simulation;

namespace DesignRules.Figures.Tolerance;

/// <summary>One resistor-tolerance corner of the whole chain: a value per toleranced resistor, and how messages name it.</summary>
/// <param name="Name">"gain-high corner", "all resistors low", …</param>
/// <param name="Detail">The resistors that move and which way ("amp.rin −5 %, amp.rf +5 %").</param>
/// <param name="Values">Per resistor element id, its value at the corner, Ω.</param>
internal sealed record ToleranceCorner(string Name, string Detail, IReadOnlyDictionary<string, double> Values)
{
    /// <summary>How a message says where a figure was found: "at the gain-high corner [amp.rin −5 %, amp.rf +5 %]".</summary>
    public string Phrase => $"at the {Name} [{Detail}]";
}

/// <summary>The chain and its settled transient at one corner and band end.</summary>
internal sealed record CornerRun(ToleranceCorner Corner, BandEnd End, ElaboratedChain Chain, TransientResult Transient);

/// <summary>
/// The one place that yields the chain and its transient at each resistor-tolerance corner, for the rules that judge a
/// figure at its worst corner (swing DR201, common-mode range DR203, output current DR301, resistor power DR601). The
/// corners are chosen, not enumerated (a settled transient per vertex would cost 2^n runs):
/// <list type="bullet">
/// <item>the gain-high corner: in every stage whose transfer is linear, each toleranced resistor at the extreme that
/// raises the stage's |gain| (its sign from the worst-case analysis' one-at-a-time runs); every stage's gain up raises
/// every later level, so this is where outputs swing furthest and draw most current;</item>
/// <item>the gain-low corner, the opposite;</item>
/// <item>every resistor low and every resistor high: a resistor across a fixed voltage dissipates most at its low value.</item>
/// </list>
/// Other stages' resistors stay nominal in the gain corners. Corners that change nothing are dropped; a corner whose
/// transient fails or does not settle is left out and reported (DR920, DR925). Only periodic sources.
/// </summary>
internal static class ToleranceCorners
{
    /// <summary>Every corner's settled run at every band end (none for a DC source or a chain without tolerances); see <see cref="DesignAnalyses.CornerRuns"/>.</summary>
    internal static List<CornerRun> Compute(DesignAnalyses analyses)
    {
        var nominal = analyses.Chain(BandEnd.Top);
        if (!nominal.Succeeded || !analyses.IsPeriodic)
        {
            return [];
        }

        // Corners only where the nominal transient settled at every band end: a nominal run that failed or did not
        // settle is reported as such (DR920, DR925), and its corners would only repeat the same bounded failure.
        if (analyses.BandEnds.Any(e => !analyses.Steady(e).Settled || !analyses.Steady(e).Result.Succeeded))
        {
            return [];
        }

        var corners = Corners(analyses, nominal);
        var jobs = corners.SelectMany(c => analyses.BandEnds.Select(e => (Corner: c, End: e))).ToList();
        var baseline = analyses.BandEnds.ToDictionary(e => e, e => analyses.Chain(e).Options);
        var nominalRuns = analyses.BandEnds.ToDictionary(e => e, analyses.Steady);
        var runs = new CornerRun?[jobs.Count];
        var lost = new (SettledTransient Steady, ElaboratedChain Chain)?[jobs.Count];

        // The runs are independent: side by side on every core, each into its own slot, so the list keeps the jobs' order
        // and each run's bits do not depend on which core ran it or when. A core takes the next run only when its last is
        // done (no ranges of runs per core), so one long run does not leave a core idle behind a queue of others. They are
        // handed out longest first (the time steps the nominal run at the same band end took, the estimate of a corner's),
        // so that the last runs handed out are short ones and the cores finish together: the compressor's 10 Hz runs take
        // about 1.27 times the steps of its 2 kHz ones, and in the jobs' order one core finished about 8 % of the corner
        // runs' time after the other.
        var started = Enumerable.Range(0, jobs.Count)
            .OrderByDescending(i => Steps(nominalRuns[jobs[i].End]))
            .ThenBy(i => i)
            .ToList();
        var order = Partitioner.Create(started, EnumerablePartitionerOptions.NoBuffering);
        Parallel.ForEach(order, analyses.Parallelism, i =>
        {
            var (corner, end) = jobs[i];
            var options = baseline[end] with { Values = corner.Values };
            var chain = ChainElaborator.Elaborate(analyses.Design, options);
            if (!chain.Succeeded)
            {
                return;
            }

            // A corner moves resistors by their tolerance only: its steady state is near the nominal one at the same band
            // end, so the run starts from there instead of from the operating point (see PeriodicSteadyState.RunFrom).
            var steady = PeriodicSteadyState.RunFrom(chain, SteadyStateLimits.Default, nominalRuns[end]);
            if (steady.Settled && steady.Result.Succeeded && steady.Result.Time.Count >= 2)
            {
                runs[i] = new CornerRun(corner, end, chain with { Window = steady.Window }, steady.Result);
            }
            else
            {
                lost[i] = (steady, chain);
            }
        });

        // A corner left out is said, never passed over in silence: the rules that take the extreme over the corners would
        // otherwise judge the remaining ones as if they were all. Reported after the parallel loop, in the jobs' order.
        for (int i = 0; i < lost.Length; i++)
        {
            if (lost[i] is not var (steady, chain))
            {
                continue;
            }

            if (steady.Result.Failure is { } failure)
            {
                analyses.ReportFailure($"the transient of the {jobs[i].Corner.Name} tolerance corner", failure, chain);
            }
            else
            {
                analyses.ReportUnsettled(jobs[i].End, steady);
            }
        }

        return runs.OfType<CornerRun>().ToList();
    }

    /// <summary>The time steps a settled run took in its last run, accepted and rejected: its cost, for the order of the corner runs.</summary>
    private static long Steps(SettledTransient run) =>
        (long)run.Result.Statistics.AcceptedSteps + run.Result.Statistics.RejectedSteps;

    private static List<ToleranceCorner> Corners(DesignAnalyses analyses, ElaboratedChain nominal)
    {
        var resistors = nominal.Stages.SelectMany(s => s.Components)
            .Where(c => c.Kind == Model.ElementKind.Resistor && c.ResistorFamily is { } f && Math.Abs(f.Tolerance.Value.Value) > 0)
            .OrderBy(c => c.ElementId, StringComparer.Ordinal).ToList();
        if (resistors.Count == 0)
        {
            return [];
        }

        // Per resistor: +1 when its upper extreme raises its stage's |gain|, −1 when it lowers it, 0 for a non-linear stage.
        var raises = new Dictionary<string, int>(StringComparer.Ordinal);
        foreach (var stage in nominal.Stages)
        {
            var analysis = analyses.WorstCase(stage);
            double g = analysis.Nominal.Gain;
            if (!analysis.Target.IsLinear || !double.IsFinite(g) || g == 0)
            {
                continue;
            }

            foreach (var single in analysis.Singles.Where(s => s.Resistor is not null))
            {
                double change = Math.Abs(single.Plus.Gain) - Math.Abs(g);
                if (double.IsFinite(change) && Math.Abs(change) > 1e-12 * Math.Abs(g))
                {
                    raises[single.Resistor!.ElementId] = change > 0 ? 1 : -1;
                }
            }
        }

        var list = new List<ToleranceCorner>();
        void Add(string name, Func<string, int> sign)
        {
            var values = new Dictionary<string, double>(StringComparer.Ordinal);
            var detail = new List<string>();
            foreach (var r in resistors)
            {
                int u = sign(r.ElementId);
                if (u == 0) continue;
                double t = Math.Abs(r.ResistorFamily!.Tolerance.Value.Value);
                values[r.ElementId] = r.NominalValue * (1 + (u * t));
                detail.Add($"{r.ElementId} {(u > 0 ? "+" : "−")}{(t * 100).ToString("0.###", CultureInfo.InvariantCulture)} %");
            }

            if (values.Count > 0 && !list.Any(c => c.Values.Count == values.Count && c.Values.All(kv => values.TryGetValue(kv.Key, out var v) && v == kv.Value)))
            {
                list.Add(new ToleranceCorner(name, string.Join(", ", detail), values));
            }
        }

        Add("gain-high corner", id => raises.GetValueOrDefault(id));
        Add("gain-low corner", id => -raises.GetValueOrDefault(id));
        Add("all-resistors-low corner", _ => -1);
        Add("all-resistors-high corner", _ => 1);
        return list;
    }
}
