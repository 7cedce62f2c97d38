using System.Text.Json.Nodes;
using Hull.Core.Tests.References;
using Hull.Core.Thermo;
using Hull.Core.Thermo.Uncertainty;
using static Hull.Core.Tests.Thermo.ThermoTestData;

namespace Hull.Core.Tests.Thermo.Uncertainty;

/// <summary>
/// Stability sampling against closed forms. One compound AB between fixed end-members A and B (formation energy 0,
/// no error) with E ~ N(ΔE, σ) relative to their tie-line: AB is a hull vertex exactly when E &lt; 0, so
/// P(vertex) = P(E &lt; 0) = Φ((0 − ΔE)/σ) = Φ(−ΔE/σ), and its energy above hull is max(E, 0) (common practice).
/// The reference values come from scipy.stats.norm (References/stability_odds.py, Debian's python3-scipy).
/// </summary>
public sealed class StabilitySamplingTests
{
    private static SystemHull Binary(double deltaEvPerAtom) =>
        SystemHull.OverElements([Formation("A", "Li", 0.0), Formation("B", "Co", 0.0), Formation("AB", "LiCo", deltaEvPerAtom)]);

    private static readonly (double Delta, double Sigma)[] BinaryCases = [(-0.02, 0.03), (0.01, 0.02), (0.05, 0.05), (-0.001, 0.1)];

    [Fact]
    public void Binary_vertex_probability_energy_above_hull_and_its_range_match_the_normal_closed_form()
    {
        var batch = new PythonTaskBatch("stability_odds.py");
        foreach ((double d, double s) in BinaryCases)
        {
            batch.Add(new JsonObject { ["dE"] = d, ["sigma"] = s });
        }

        JsonArray reference = batch.Run();
        for (int c = 0; c < BinaryCases.Length; c++)
        {
            (double d, double s) = BinaryCases[c];
            StabilitySamplingResult result = StabilitySampling.Run(
                Binary(d), [new EnergyUncertainty("AB", s)], [], SamplingPlan.Fixed(8000, seed: 19 + (ulong)c));
            EntryStabilityOdds ab = result.Entries.Single(e => e.EntryId == "AB");
            double p = reference[c]!["p_vertex"]!.GetValue<double>();
            double se = Math.Sqrt(p * (1 - p) / result.SampleCount);
            Assert.True(Math.Abs(ab.VertexProbability - p) <= 3 * se, $"case {c}: P = {ab.VertexProbability}, Φ(−ΔE/σ) = {p}, SE {se}");
            Assert.Equal(se, ab.VertexProbabilityStandardError, 0.1 * se);

            double mean = reference[c]!["mean_above"]!.GetValue<double>();
            Assert.True(Math.Abs(ab.MeanEnergyAboveHullEvPerAtom - mean) <= 4 * ab.MeanEnergyAboveHullStandardErrorEvPerAtom,
                $"case {c}: mean above {ab.MeanEnergyAboveHullEvPerAtom}, closed form {mean}");
            // A quantile's Monte Carlo error is √(q(1−q)/N)/f ≈ 0.03 σ at q = 0.05, N = 8000: 0.15 σ is five of them.
            Assert.Equal(reference[c]!["p05"]!.GetValue<double>(), ab.EnergyAboveHullP05EvPerAtom, 0.15 * s);
            Assert.Equal(reference[c]!["p95"]!.GetValue<double>(), ab.EnergyAboveHullP95EvPerAtom, 0.15 * s);

            // Its only decompositions are itself or A + B; the more probable one is named with its frequency.
            string[] expected = p >= 0.5 ? ["AB"] : ["A", "B"];
            Assert.Equal(expected, ab.MostProbableProducts);
            Assert.Equal(Math.Max(ab.VertexProbability, 1 - ab.VertexProbability), ab.MostProbableProductsProbability, 1e-12);
            Assert.Equal(p >= 0.5, result.ProbableStableSet.Contains("AB"));
        }
    }

    [Fact]
    public void Monte_carlo_error_falls_as_one_over_root_n_on_a_log_log_fit()
    {
        // P(vertex) = Φ(−0.01/0.02) = Φ(−0.5) = 0.308538 (scipy.stats.norm.cdf(-0.5), checked by the test above's script).
        const double p = 0.3085375387259869;
        SystemHull hull = Binary(0.01);
        int[] sizes = [100, 400, 1600, 6400];
        var logN = new double[sizes.Length];
        var logError = new double[sizes.Length];
        for (int k = 0; k < sizes.Length; k++)
        {
            double squares = 0;
            const int seeds = 24;
            for (ulong seed = 1; seed <= seeds; seed++)
            {
                double estimate = StabilitySampling.Run(hull, [new EnergyUncertainty("AB", 0.02)], [], SamplingPlan.Fixed(sizes[k], seed * 7919))
                    .Entries.Single(e => e.EntryId == "AB").VertexProbability;
                squares += (estimate - p) * (estimate - p);
            }

            logN[k] = Math.Log(sizes[k]);
            logError[k] = Math.Log(Math.Sqrt(squares / seeds));
        }

        double slope = Slope(logN, logError);
        Assert.InRange(slope, -0.65, -0.35);
    }

    [Fact]
    public void Zero_sigma_reproduces_the_plain_hull_exactly()
    {
        SystemHull plain = Ternary();
        foreach (double sigma in new[] { 0.0, 1e-13 })
        {
            var uncertainties = plain.Entries.Select(e => new EnergyUncertainty(e.Id, sigma)).ToArray();
            StabilitySamplingResult result = StabilitySampling.Run(plain, uncertainties, [], SamplingPlan.Fixed(50, 3));
            foreach (EntryStability entry in plain.Entries)
            {
                EntryStabilityOdds odds = result.Entries.Single(o => o.EntryId == entry.Id);
                Assert.Equal(entry.IsHullVertex ? 1.0 : 0.0, odds.VertexProbability);
                Assert.Equal(0.0, odds.VertexProbabilityStandardError);
                Assert.True(odds.PlainIsVertex == entry.IsHullVertex);
                if (sigma == 0)
                {
                    Assert.Equal(entry.EnergyAboveHullEvPerAtom, odds.MeanEnergyAboveHullEvPerAtom);
                    Assert.Equal(entry.EnergyAboveHullEvPerAtom, odds.EnergyAboveHullP05EvPerAtom);
                    Assert.Equal(entry.EnergyAboveHullEvPerAtom, odds.EnergyAboveHullP95EvPerAtom);
                }
                else
                {
                    Assert.Equal(entry.EnergyAboveHullEvPerAtom, odds.MeanEnergyAboveHullEvPerAtom, 1e-11);
                }

                Assert.Equal(entry.Decomposition.Products.Select(pr => pr.Phase.Id), odds.MostProbableProducts);
                Assert.Equal(1.0, odds.MostProbableProductsProbability);
            }

            Assert.Equal(plain.StablePhases.Where(s => !s.IsSynthetic).Select(s => s.Id), result.MostFrequentStableSet);
            Assert.Equal(1.0, result.MostFrequentStableSetProbability);
        }
    }

    [Fact]
    public void A_shared_error_that_shifts_every_member_equally_leaves_a_hull_of_members_only_unchanged()
    {
        // Adding one constant to every energy per atom adds the same plane to every point, so the lower hull's
        // vertices and every energy above it stay as they were (common practice: the hull is invariant under
        // adding an affine function of composition; a constant per atom is one).
        SystemHull plain = Ternary();
        var uncertainties = plain.Entries.Select(e => new EnergyUncertainty(e.Id, 0.0, "same-method")).ToArray();
        StabilitySamplingResult result = StabilitySampling.Run(
            plain, uncertainties, [new CorrelationGroup("same-method", 0.2)], SamplingPlan.Fixed(200, 11));
        foreach (EntryStability entry in plain.Entries)
        {
            EntryStabilityOdds odds = result.Entries.Single(o => o.EntryId == entry.Id);
            Assert.Equal(entry.IsHullVertex ? 1.0 : 0.0, odds.VertexProbability);
            Assert.Equal(entry.EnergyAboveHullEvPerAtom, odds.EnergyAboveHullP05EvPerAtom, 1e-9);
            Assert.Equal(entry.EnergyAboveHullEvPerAtom, odds.EnergyAboveHullP95EvPerAtom, 1e-9);
            Assert.Equal("same-method", odds.Group);
        }

        // The same σ drawn independently per entry does change the verdicts.
        var independent = plain.Entries.Select(e => new EnergyUncertainty(e.Id, 0.2)).ToArray();
        StabilitySamplingResult loose = StabilitySampling.Run(plain, independent, [], SamplingPlan.Fixed(200, 11));
        Assert.Contains(loose.Entries, o => o.VertexProbability is > 0 and < 1);
    }

    [Fact]
    public void Leaving_far_entries_out_of_each_rebuild_gives_the_same_answer_as_rebuilding_everything()
    {
        SystemHull plain = Ternary();
        var uncertainties = plain.Entries.Select((e, k) => new EnergyUncertainty(e.Id, 0.01 + 0.01 * (k % 4), k % 3 == 0 ? "g" : null)).ToArray();
        CorrelationGroup[] groups = [new("g", 0.015)];
        var fast = StabilitySampling.Run(plain, uncertainties, groups, SamplingPlan.Fixed(400, 5), 2, rebuildAll: false);
        var full = StabilitySampling.Run(plain, uncertainties, groups, SamplingPlan.Fixed(400, 5), 1, rebuildAll: true);
        Assert.Equal(full.Entries.Count, fast.Entries.Count);
        for (int k = 0; k < full.Entries.Count; k++)
        {
            EntryStabilityOdds a = fast.Entries[k], b = full.Entries[k];
            Assert.Equal(b.EntryId, a.EntryId);
            Assert.Equal(b.VertexProbability, a.VertexProbability);
            Assert.Equal(b.MeanEnergyAboveHullEvPerAtom, a.MeanEnergyAboveHullEvPerAtom, 1e-12);
            Assert.Equal(b.MostProbableProducts, a.MostProbableProducts);
            Assert.Equal(b.MostProbableProductsProbability, a.MostProbableProductsProbability);
        }
    }

    [Fact]
    public void Same_seed_gives_the_same_answer_on_any_number_of_threads_and_in_any_entry_order()
    {
        SystemHull plain = Ternary();
        var uncertainties = plain.Entries.Select(e => new EnergyUncertainty(e.Id, 0.03)).ToArray();
        var one = StabilitySampling.Run(plain, uncertainties, [], SamplingPlan.Fixed(300, 42), maxThreads: 1);
        var two = StabilitySampling.Run(plain, Shuffled(uncertainties, 3), [], SamplingPlan.Fixed(300, 42), maxThreads: 2);
        SystemHull shuffled = SystemHull.OverElements(Shuffled(TernaryEntries(), 9));
        var three = StabilitySampling.Run(shuffled, uncertainties, [], SamplingPlan.Fixed(300, 42), maxThreads: 2);
        foreach (EntryStabilityOdds a in one.Entries)
        {
            foreach (var other in new[] { two, three })
            {
                EntryStabilityOdds b = other.Entries.Single(o => o.EntryId == a.EntryId);
                Assert.Equal(a.VertexProbability, b.VertexProbability);
                Assert.Equal(a.MeanEnergyAboveHullEvPerAtom, b.MeanEnergyAboveHullEvPerAtom);
                Assert.Equal(a.EnergyAboveHullP95EvPerAtom, b.EnergyAboveHullP95EvPerAtom);
            }
        }

        var otherSeed = StabilitySampling.Run(plain, uncertainties, [], SamplingPlan.Fixed(300, 43));
        Assert.NotEqual(one.Entries.Select(e => e.MeanEnergyAboveHullEvPerAtom), otherSeed.Entries.Select(e => e.MeanEnergyAboveHullEvPerAtom));
    }

    [Fact]
    public void Sampling_to_a_target_stops_when_every_probability_reaches_it()
    {
        SystemHull hull = Binary(0.01);
        var result = StabilitySampling.Run(hull, [new EnergyUncertainty("AB", 0.02)], [], SamplingPlan.ToTarget(0.01, 1));
        Assert.Equal(SamplingStopReason.TargetReached, result.StopReason);
        Assert.True(result.LargestVertexStandardError <= 0.01);
        Assert.Equal(0, result.SampleCount % SamplingPlan.BatchSize);
        // p(1 − p)/N ≤ 1e-4 with p ≈ 0.31 needs N ≥ 2,130: the first whole batch past it, give or take one batch of noise.
        Assert.InRange(result.SampleCount, 2000, 2500);
    }

    [Fact]
    public void A_cancelled_run_stops_between_samples_and_throws()
    {
        SystemHull plain = Ternary();
        var uncertainties = plain.Entries.Select(e => new EnergyUncertainty(e.Id, 0.03)).ToArray();
        using var before = new CancellationTokenSource();
        before.Cancel();
        Assert.ThrowsAny<OperationCanceledException>(() =>
            StabilitySampling.Run(plain, uncertainties, [], SamplingPlan.Fixed(1000, 1), 2, before.Token));

        // A run of minutes (5e4 samples of 300 entries, invented energies) cancelled while it samples; fixed and
        // target plans alike. The call returns only once its threads are done.
        var random = new Random(11);
        PhaseEntry[] many = [.. TernaryEntries(), .. Enumerable.Range(0, 288).Select(k =>
            Formation($"r{k}", $"Li{random.Next(1, 9)}Co{random.Next(1, 9)}O{random.Next(1, 9)}", -1.8 + random.NextDouble()))];
        SystemHull big = SystemHull.OverElements(many);
        var sigmas = big.Entries.Select(e => new EnergyUncertainty(e.Id, 0.02)).ToArray();
        foreach (SamplingPlan plan in new[] { SamplingPlan.Fixed(50_000, 2), SamplingPlan.ToTarget(1e-4, 2) })
        {
            using var during = new CancellationTokenSource(TimeSpan.FromMilliseconds(50));
            Assert.ThrowsAny<OperationCanceledException>(() => StabilitySampling.Run(big, sigmas, [], plan, 2, during.Token));
        }

        // An uncancelled token changes nothing.
        var plainRun = StabilitySampling.Run(plain, uncertainties, [], SamplingPlan.Fixed(200, 4), 2);
        var withToken = StabilitySampling.Run(plain, uncertainties, [], SamplingPlan.Fixed(200, 4), 2, CancellationToken.None);
        Assert.Equal(
            plainRun.Entries.Select(e => (e.VertexProbability, e.MeanEnergyAboveHullEvPerAtom, e.EnergyAboveHullP95EvPerAtom)),
            withToken.Entries.Select(e => (e.VertexProbability, e.MeanEnergyAboveHullEvPerAtom, e.EnergyAboveHullP95EvPerAtom)));
    }

    [Fact]
    public void Bad_input_is_refused_naming_what_and_where()
    {
        var e1 = Assert.Throws<ThermoInputException>(() => new EnergyUncertainty("AB", -0.1));
        Assert.Contains("'AB'", e1.Message);
        Assert.Throws<ThermoInputException>(() => new EnergyUncertainty("AB", double.NaN));
        Assert.Throws<ThermoInputException>(() => new CorrelationGroup("g", double.PositiveInfinity));

        var e2 = Assert.Throws<ThermoInputException>(() =>
            StabilitySampling.Run(Binary(0.01), [new EnergyUncertainty("AB", 0.02, "lonely")], [], SamplingPlan.Fixed(10, 1)));
        Assert.Contains("'lonely'", e2.Message);
        Assert.Contains("entry 'AB'", e2.Message);
        Assert.Equal("AB", e2.EntryId);

        var e3 = Assert.Throws<ThermoInputException>(() => SamplingPlan.Fixed(SamplingLimits.MaxSamples + 1, 1));
        Assert.Contains("work limit", e3.Message);
        var many = Enumerable.Range(0, 400).Select(k => Formation($"c{k}", "LiCo", 0.01 * k)).Append(Formation("A", "Li", 0)).Append(Formation("B", "Co", 0)).ToArray();
        var e4 = Assert.Throws<ThermoInputException>(() =>
            StabilitySampling.Run(SystemHull.OverElements(many), [], [], SamplingPlan.Fixed(SamplingLimits.MaxSamples, 1)));
        Assert.Contains("work limit", e4.Message);
        Assert.Throws<ThermoInputException>(() => SamplingPlan.ToTarget(0.0, 1));
        Assert.Throws<ThermoInputException>(() =>
            StabilitySampling.Run(Binary(0.01), [new EnergyUncertainty("AB", 0.02), new EnergyUncertainty("AB", 0.03)], [], SamplingPlan.Fixed(10, 1)));
    }

    // An invented Li–Co–O set (formation energies, eV/atom): stable, on-facet and above-hull entries.
    private static PhaseEntry[] TernaryEntries() =>
    [
        Formation("Li", "Li", 0), Formation("Co", "Co", 0), Formation("O", "O", 0),
        Formation("Li2O", "Li2O", -2.07), Formation("CoO", "CoO", -1.24), Formation("Co3O4", "Co3O4", -1.30),
        Formation("LiCoO2", "LiCoO2", -1.72), Formation("Li2O2", "Li2O2", -1.62), Formation("LiCoO2-b", "LiCoO2", -1.69),
        Formation("Li6CoO4", "Li6CoO4", -1.78), Formation("CoO2", "CoO2", -1.05), Formation("LiCo2O4", "LiCo2O4", -1.55),
    ];

    private static SystemHull Ternary() => SystemHull.OverElements(TernaryEntries());

    private static double Slope(double[] x, double[] y)
    {
        double mx = x.Average(), my = y.Average();
        double sxy = 0, sxx = 0;
        for (int k = 0; k < x.Length; k++)
        {
            sxy += (x[k] - mx) * (y[k] - my);
            sxx += (x[k] - mx) * (x[k] - mx);
        }

        return sxy / sxx;
    }
}
