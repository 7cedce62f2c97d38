using Hull.Core.Chemistry;
using Hull.Core.Thermo;
using static Hull.Core.Tests.Thermo.ThermoTestData;

namespace Hull.Core.Tests.Thermo;

/// <summary>
/// Datasets over several chemical systems: each entry analysed within the hull of a larger system must get exactly
/// what the hull of its own system alone gives (the restriction of a hull to a face of its simplex is that face's
/// hull), in input order and whatever the input order.
/// </summary>
public sealed class DatasetStabilityTests
{
    private const double Tolerance = 1e-9; // two hulls of the same points agree to rounding (~1e-15)

    private static PhaseEntry[] SeveralSystems() =>
    [
        // Fe–O (no element entries: synthetic references), Li–O, Li–Fe–O, Al–Ni, and Cu alone. Invented energies.
        Formation("FeO", "FeO", -1.41),
        Formation("Fe3O4", "Fe3O4", -1.66),
        Formation("Fe2O3", "Fe2O3", -1.71),
        Formation("Li2O", "Li2O", -2.07),
        Formation("Li2O2", "Li2O2", -1.64),
        Formation("LiO2", "LiO2", -0.90),
        Formation("LiFeO2", "LiFeO2", -1.95),
        Formation("Li5FeO4", "Li5FeO4", -2.02),
        Formation("LiFe5O8", "LiFe5O8", -1.70),
        Formation("Li-metal", "Li", 0.0),
        Formation("Al", "Al", 0.0),
        Formation("Ni", "Ni", 0.0),
        Formation("AlNi", "AlNi", -0.60),
        Formation("Al3Ni", "Al3Ni", -0.20),
        Formation("AlNi3", "AlNi3", -0.35),
        Entry("Cu-fcc", "Cu", -3.72, EnergyBasis.TotalPerAtom),
        Entry("Cu-bcc", "Cu", -3.68, EnergyBasis.TotalPerAtom),
    ];

    [Fact]
    public void Hulls_are_built_only_for_maximal_systems_and_results_come_in_input_order()
    {
        PhaseEntry[] entries = SeveralSystems();
        DatasetStabilityResult result = DatasetStability.Analyze(entries);

        Assert.Equal(["Al-Ni", "Cu", "Fe-Li-O"], result.HullSystems);
        Assert.Equal(entries.Select(e => e.Id), result.Entries.Select(e => e.Id));
        Assert.Equal(Enumerable.Range(0, entries.Length), result.Entries.Select(e => e.RowIndex));
        Assert.Equal("Fe-Li-O", result.Entries[0].HullSystem);   // FeO, answered by the Fe–Li–O hull
        Assert.Equal("Al-Ni", result.Entries[12].HullSystem);
        Assert.Equal(new ElementReference("Cu", -3.72, "Cu-fcc"), result.References.Single());
        Assert.Equal(0.04, result.Entries[16].EnergyAboveHullEvPerAtom, Tolerance); // Cu-bcc above Cu-fcc
    }

    [Fact]
    public void Entries_of_a_subsystem_get_what_their_own_hull_gives()
    {
        PhaseEntry[] entries = SeveralSystems();
        AssertMatchesOwnSystemHulls(entries, DatasetStability.Analyze(entries));
    }

    [Fact]
    public void Random_dataset_over_five_elements_matches_own_system_hulls_and_is_order_independent()
    {
        PhaseEntry[] entries = RandomDataset(seed: 11, count: 400);
        DatasetStabilityResult result = DatasetStability.Analyze(entries);
        Assert.Contains(result.Entries, e => e.IsHullVertex && e.Composition.Elements.Count >= 3);
        Assert.Contains(result.Entries, e => e.DecompositionEnergyEvPerAtom is < 0);
        AssertMatchesOwnSystemHulls(entries, result);

        DatasetStabilityResult shuffled = DatasetStability.Analyze(Shuffled(entries, seed: 3));
        var byId = shuffled.Entries.ToDictionary(e => e.Id);
        foreach (EntryStability expected in result.Entries)
        {
            EntryStability actual = byId[expected.Id];
            Assert.Equal(expected.EnergyAboveHullEvPerAtom, actual.EnergyAboveHullEvPerAtom);
            Assert.Equal(expected.IsHullVertex, actual.IsHullVertex);
            Assert.Equal(expected.DecompositionEnergyEvPerAtom, actual.DecompositionEnergyEvPerAtom);
            Assert.Equal(expected.Decomposition.ToReactionString(), actual.Decomposition.ToReactionString());
            Assert.Equal(expected.HullSystem, actual.HullSystem);
        }
    }

    [Fact]
    public void Dataset_errors_name_the_row()
    {
        PhaseEntry[] entries = [.. SeveralSystems(), Entry("LiCuO", "LiCuO", -12.0, EnergyBasis.TotalPerFormulaUnit)];
        var e = Assert.Throws<ThermoInputException>(() => DatasetStability.Analyze(entries));
        Assert.Equal("Li", e.Element); // Li-metal is a formation-energy entry and sets no total-energy reference
        Assert.Equal("LiCuO", e.EntryId);
        Assert.Equal(entries.Length - 1, e.RowIndex);
    }

    /// <summary>Random compositions with small integer amounts over Li-Mn-Fe-P-O subsystems; a few lie below their hulls.</summary>
    internal static PhaseEntry[] RandomDataset(int seed, int count)
    {
        string[] elements = ["Fe", "Li", "Mn", "O", "P"];
        var random = new Random(seed);
        var entries = new List<PhaseEntry>();
        foreach (string element in elements)
        {
            entries.Add(Formation(element, element, 0.0));
            entries.Add(Formation(element + "-alt", element, 0.02 + 0.1 * random.NextDouble()));
        }

        while (entries.Count < count)
        {
            int size = random.Next(2, 5);
            string[] chosen = elements.OrderBy(_ => random.Next()).Take(size).Order(StringComparer.Ordinal).ToArray();
            var amounts = chosen.Select(e => (e, new Rational(random.Next(1, 5), 1))).ToArray();
            Composition composition = Composition.FromAmounts(amounts);
            // Deeper for more elements, plus noise, so that some ternaries and quaternaries are stable.
            double energy = -0.3 * size - 0.6 * random.NextDouble();
            entries.Add(new PhaseEntry($"r{entries.Count}", composition, energy, EnergyBasis.FormationPerAtom));
        }

        return entries.ToArray();
    }

    private static void AssertMatchesOwnSystemHulls(PhaseEntry[] entries, DatasetStabilityResult result)
    {
        var hulls = new Dictionary<string, SystemHull>(StringComparer.Ordinal);
        foreach (EntryStability actual in result.Entries)
        {
            string system = actual.Composition.ChemicalSystem;
            if (!hulls.TryGetValue(system, out SystemHull? own))
            {
                var elements = actual.Composition.Elements.ToHashSet(StringComparer.Ordinal);
                PhaseEntry[] inside = entries.Where(e => e.Composition.Elements.All(elements.Contains)).ToArray();
                hulls[system] = own = SystemHull.OverElements(inside, elements: actual.Composition.Elements);
            }

            EntryStability expected = own.GetEntry(actual.Id);
            Assert.Equal(expected.FormationEnergyEvPerAtom, actual.FormationEnergyEvPerAtom);
            Assert.Equal(expected.EnergyAboveHullEvPerAtom, actual.EnergyAboveHullEvPerAtom, Tolerance);
            Assert.Equal(expected.IsOnHull, actual.IsOnHull);
            Assert.Equal(expected.IsHullVertex, actual.IsHullVertex);
            Assert.Equal(expected.DecompositionEnergyEvPerAtom is null, actual.DecompositionEnergyEvPerAtom is null);
            Assert.Equal(expected.DecompositionEnergyEvPerAtom ?? 0, actual.DecompositionEnergyEvPerAtom ?? 0, Tolerance);
            Assert.Equal(
                expected.Decomposition.Products.Select(p => (p.Phase.Id, p.Phase.IsSynthetic)),
                actual.Decomposition.Products.Select(p => (p.Phase.Id, p.Phase.IsSynthetic)));
            Assert.Equal(
                expected.Decomposition.Products.Select(p => p.ExactFormulaUnits),
                actual.Decomposition.Products.Select(p => p.ExactFormulaUnits));
            AssertBalancedExactly(actual.Decomposition);
        }
    }
}
