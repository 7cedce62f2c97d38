using Hull.Core.Tests.Generators;
using Hull.Core.Thermo;
using Hull.Core.Thermo.Uncertainty;

namespace Hull.Core.Tests.Thermo.Uncertainty;

/// <summary>
/// The samples' readings do not depend on how many workers drew them: every reading of every sample (vertex flag,
/// energy above hull to the last bit, decomposition, stable set) and every number of the summary are the same on
/// one, two and three threads, over calls that continue one tally (as sampling to a target does), on degenerate
/// five-component data (equal-energy twins, points on planes of others, a correlation group, some errors of zero).
/// </summary>
public sealed class SampleThreadsTests
{
    private static readonly string[] Symbols = ["Li", "Co", "Mn", "Ni", "O"];

    [Theory]
    [InlineData(true)]
    [InlineData(false)]
    public void Every_reading_is_bit_identical_on_one_two_and_three_threads(bool localPrograms)
    {
        (SystemHull plain, EnergyUncertainty[] uncertainties, CorrelationGroup[] groups) = Generated(305);
        SamplingSetup setup = SamplingSetup.Prepare(plain, uncertainties, groups, rebuildAll: false, localPrograms);
        Assert.Equal(localPrograms, setup.Local is not null);
        SampleTally[] tallies = [.. new[] { 1, 2, 3 }.Select(threads =>
        {
            var tally = new SampleTally(setup.EntryPoints.Length);
            tally.Run(setup, 91, 0, 37, threads, CancellationToken.None);
            tally.Run(setup, 91, 37, 29, threads, CancellationToken.None);
            return tally;
        })];

        SampleTally one = tallies[0];
        Assert.Equal(66, one.Count);
        foreach (SampleTally other in tallies[1..])
        {
            for (int s = 0; s < one.Count; s++)
            {
                Assert.Equal(one.StableSet(s), other.StableSet(s));
                for (int e = 0; e < setup.EntryPoints.Length; e++)
                {
                    var a = one.Reading(e, s);
                    var b = other.Reading(e, s);
                    Assert.True(a.IsVertex == b.IsVertex, $"sample {s}, entry {e}: vertex {a.IsVertex} against {b.IsVertex}");
                    Assert.True(BitConverter.DoubleToInt64Bits(a.AboveEvPerAtom) == BitConverter.DoubleToInt64Bits(b.AboveEvPerAtom),
                        $"sample {s}, entry {e}: above {a.AboveEvPerAtom:R} against {b.AboveEvPerAtom:R}");
                    Assert.Equal(a.Products, b.Products);
                }
            }
        }

        // The readings are not all alike, so the comparison above could have failed.
        Assert.Contains(Enumerable.Range(0, setup.EntryPoints.Length), e =>
            Enumerable.Range(0, one.Count).Select(s => one.Reading(e, s).IsVertex).Distinct().Count() == 2);
    }

    [Fact]
    public void The_summary_is_bit_identical_on_one_two_and_three_threads_for_fixed_and_target_plans()
    {
        (SystemHull plain, EnergyUncertainty[] uncertainties, CorrelationGroup[] groups) = Generated(306);
        foreach (SamplingPlan plan in new[] { SamplingPlan.Fixed(120, 5), SamplingPlan.ToTarget(0.05, 6) })
        {
            StabilitySamplingResult one = StabilitySampling.Run(plain, uncertainties, groups, plan, maxThreads: 1);
            foreach (int threads in new[] { 2, 3 })
            {
                AssertSame(one, StabilitySampling.Run(plain, uncertainties, groups, plan, maxThreads: threads));
            }
        }
    }

    private static void AssertSame(StabilitySamplingResult a, StabilitySamplingResult b)
    {
        Assert.Equal(a.SampleCount, b.SampleCount);
        Assert.Equal(a.StopReason, b.StopReason);
        Assert.Equal(a.ProbableStableSet, b.ProbableStableSet);
        Assert.Equal(a.MostFrequentStableSet, b.MostFrequentStableSet);
        Assert.Equal(Bits(a.MostFrequentStableSetProbability), Bits(b.MostFrequentStableSetProbability));
        Assert.Equal(Bits(a.LargestVertexStandardError), Bits(b.LargestVertexStandardError));
        Assert.Equal(Bits(a.MeanPointsRebuilt), Bits(b.MeanPointsRebuilt));
        Assert.Equal(a.Entries.Count, b.Entries.Count);
        for (int k = 0; k < a.Entries.Count; k++)
        {
            EntryStabilityOdds x = a.Entries[k], y = b.Entries[k];
            Assert.Equal(x.EntryId, y.EntryId);
            Assert.Equal(
                new[] { x.VertexProbability, x.VertexProbabilityStandardError, x.MeanEnergyAboveHullEvPerAtom, x.MeanEnergyAboveHullStandardErrorEvPerAtom, x.EnergyAboveHullP05EvPerAtom, x.EnergyAboveHullP95EvPerAtom, x.MostProbableProductsProbability }.Select(Bits),
                new[] { y.VertexProbability, y.VertexProbabilityStandardError, y.MeanEnergyAboveHullEvPerAtom, y.MeanEnergyAboveHullStandardErrorEvPerAtom, y.EnergyAboveHullP05EvPerAtom, y.EnergyAboveHullP95EvPerAtom, y.MostProbableProductsProbability }.Select(Bits));
            Assert.Equal(x.MostProbableProducts, y.MostProbableProducts);
        }
    }

    private static long Bits(double value) => BitConverter.DoubleToInt64Bits(value);

    private static (SystemHull, EnergyUncertainty[], CorrelationGroup[]) Generated(int seed)
    {
        PointSet set = DegenerateDataGenerator.Generate(Symbols.Length, 200, seed);
        PhaseEntry[] entries = set.AsFormationEntries(Symbols, i => $"p{i:000}");
        var uncertainties = entries.Select((e, k) => new EnergyUncertainty(
            e.Id, k % 5 == 0 ? 0.0 : 0.01 * (1 + k % 3), k % 4 == 0 ? "g" : null)).ToArray();
        return (SystemHull.OverElements(entries), uncertainties, [new CorrelationGroup("g", 0.01)]);
    }
}
