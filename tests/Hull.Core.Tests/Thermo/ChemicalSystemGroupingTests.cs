using Hull.Core.Chemistry;
using Hull.Core.Thermo;
using static Hull.Core.Tests.Thermo.ThermoTestData;

namespace Hull.Core.Tests.Thermo;

/// <summary>
/// The grouping of a dataset into chemical systems, its maximal systems and the stable phases merged across them,
/// checked against the definitions written out directly in the test (every pair of systems compared; every entry's
/// own-system hull), and the rule that places a candidate's total energy on its hull's energy scale.
/// </summary>
public sealed class ChemicalSystemGroupingTests
{
    [Fact]
    public void Maximal_systems_and_subsets_follow_the_definition()
    {
        var random = new Random(21);
        string[] pool = ["Al", "Co", "Fe", "Li", "Mn", "Ni", "O", "P", "S", "Ti"];
        var compositions = new List<Composition>();
        while (compositions.Count < 400)
        {
            string[] elements = pool.Where(_ => random.NextDouble() < 0.25).Take(4).ToArray();
            if (elements.Length == 0) continue;
            compositions.Add(Composition.FromAmounts(elements.Select(e => (e, new Rational(random.Next(1, 4), 1))).ToArray()));
        }

        var grouping = new ChemicalSystemGrouping(compositions);
        string Key(IEnumerable<string> elements) => string.Join("-", elements.Order(StringComparer.Ordinal));
        HashSet<string>[] systems = compositions.Select(c => c.Elements.ToHashSet(StringComparer.Ordinal)).DistinctBy(s => Key(s)).ToArray();

        // Maximal: no other present system strictly contains it (every pair compared).
        string[] expectedMaximal = systems.Where(s => !systems.Any(t => t.Count > s.Count && s.IsSubsetOf(t))).Select(s => Key(s)).Order(StringComparer.Ordinal).ToArray();
        string[] maximal = Enumerable.Range(0, grouping.MaximalCount).Select(grouping.MaximalName).ToArray();
        Assert.Equal(expectedMaximal, maximal.Order(StringComparer.Ordinal));
        Assert.Equal(systems.Length, grouping.SystemCount);

        for (int row = 0; row < compositions.Count; row++)
        {
            int system = grouping.SystemOfRow(row);
            Assert.Equal(Key(compositions[row].Elements), Key(grouping.ElementsOf(system)));
            Assert.Contains(row, grouping.RowsOf(system));

            // Reported from the smallest maximal system that contains it, then the first by name.
            var own = compositions[row].Elements.ToHashSet(StringComparer.Ordinal);
            string expectedReporter = expectedMaximal
                .Select(m => m.Split('-'))
                .Where(m => own.IsSubsetOf(m))
                .OrderBy(m => m.Length)
                .ThenBy(m => string.Join("-", m), StringComparer.Ordinal)
                .Select(m => string.Join("-", m))
                .First();
            Assert.Equal(expectedReporter, grouping.MaximalName(grouping.ReportingHullOf(system)));
        }

        // Systems within a set of elements, absent elements allowed.
        string[] query = ["Fe", "Li", "O", "Xe"];
        int[] expectedRows = Enumerable.Range(0, compositions.Count).Where(r => compositions[r].Elements.All(query.Contains)).ToArray();
        int[] rows = grouping.SystemsWithin(query).SelectMany(grouping.RowsOf).Order().ToArray();
        Assert.Equal(expectedRows, rows);
        Assert.Empty(grouping.SystemsWithin(["Xe"]));
    }

    [Fact]
    public void Stable_phases_merged_across_maximal_hulls_are_the_datasets_vertices()
    {
        PhaseEntry[] entries =
        [
            Formation("FeO", "FeO", -1.41), Formation("Fe3O4", "Fe3O4", -1.66), Formation("Fe2O3", "Fe2O3", -1.71),
            Formation("Li2O", "Li2O", -2.07), Formation("LiFeO2", "LiFeO2", -1.95), Formation("Li", "Li", 0.0),
            Formation("LiO2", "LiO2", -0.50), Formation("AlNi", "AlNi", -0.60), Formation("Al3Ni", "Al3Ni", -0.10),
            // An entry named like an element that is no pure element: both it and the synthetic Fe reference count.
            Formation("Fe", "FeS", -0.5), Formation("S", "S", 0.0),
        ];
        var grouping = new ChemicalSystemGrouping(entries.Select(e => e.Composition).ToArray());
        SystemHull[] hulls = Enumerable.Range(0, grouping.MaximalCount)
            .Select(h => SystemHull.OverElements(
                entries.Where(e => e.Composition.Elements.All(grouping.MaximalElements(h).Contains)).ToArray(),
                elements: grouping.MaximalElements(h)))
            .ToArray();
        IReadOnlyList<HullPhase> merged = StablePhaseUnion.Of(hulls);

        DatasetStabilityResult analysis = DatasetStability.Analyze(entries);
        string[] vertexEntries = analysis.Entries.Where(e => e.IsHullVertex).Select(e => e.Id).Order(StringComparer.Ordinal).ToArray();
        Assert.Equal(vertexEntries, merged.Where(p => !p.IsSynthetic).Select(p => p.Id));
        // The same union read off the analysis, as the whole-dataset stable-phase call does.
        Assert.Equal(merged.Select(p => (p.Id, p.IsSynthetic)), StablePhaseUnion.Of(analysis).Select(p => (p.Id, p.IsSynthetic)));
        Assert.Equal(["Al", "Fe", "Ni", "O"], merged.Where(p => p.IsSynthetic).Select(p => p.Id));
        Assert.Equal(merged.Select(p => (p.Id, p.IsSynthetic)).Distinct().Count(), merged.Count);
        int fe = merged.ToList().FindIndex(p => p.Id == "Fe");
        Assert.False(merged[fe].IsSynthetic);
        Assert.True(merged[fe + 1].IsSynthetic);
    }

    [Fact]
    public void A_candidates_total_energy_takes_the_hulls_references()
    {
        PhaseEntry[] entries =
        [
            Entry("Li-bcc", "Li", -1.9, EnergyBasis.TotalPerAtom),
            Entry("O2", "O2", -9.9, EnergyBasis.TotalPerFormulaUnit),
            Entry("Li2O", "Li2O", -14.3, EnergyBasis.TotalPerFormulaUnit),
        ];
        SystemHull hull = SystemHull.OverElements(entries);
        FormationEnergySet formation = FormationEnergies.Compute(entries);

        // The same composition and energy as an entry: the same formation energy, to the bit.
        var twin = Entry("candidate", "Li2O", -14.3, EnergyBasis.TotalPerFormulaUnit);
        Assert.Equal(formation.FormationEnergiesEvPerAtom[2], FormationEnergies.OfCandidate(twin, hull.References));
        // (E − 2 μ_Li − μ_O) / 3 with μ_O = −9.9 / 2 (common practice: formation energy from elemental references).
        Assert.Equal((-14.3 + 2 * 1.9 + 4.95) / 3, FormationEnergies.OfCandidate(twin, hull.References), 12);
        // A formation energy passes through.
        Assert.Equal(-0.7, FormationEnergies.OfCandidate(Formation("f", "Li2O2", -0.7), hull.References));

        var missing = Assert.Throws<ThermoInputException>(() =>
            FormationEnergies.OfCandidate(Entry("c1", "LiCoO2", -22.0, EnergyBasis.TotalPerFormulaUnit), hull.References));
        Assert.Equal("Co", missing.Element);
        Assert.Equal("c1", missing.EntryId);
        Assert.Contains("missing elemental reference", missing.Message);
    }
}
