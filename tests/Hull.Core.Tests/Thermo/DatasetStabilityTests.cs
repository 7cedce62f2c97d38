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
    public void Dataset_problems_name_the_entry_and_element_and_leave_the_rest_answered()
    {
        PhaseEntry[] entries = [.. SeveralSystems(), Entry("LiCuO", "LiCuO", -12.0, EnergyBasis.TotalPerFormulaUnit)];
        DatasetStabilityResult result = DatasetStability.Analyze(entries);
        SystemProblem problem = Assert.Single(result.Problems);
        EntryEnergyProblem cause = Assert.Single(problem.Causes);
        Assert.Equal("Li", cause.Element); // Li-metal is a formation-energy entry and sets no total-energy reference
        Assert.Equal("LiCuO", cause.EntryId);
        Assert.Equal(entries.Length - 1, cause.RowIndex);
        Assert.Equal("Cu-Li-O", problem.ChemicalSystem);
        Assert.Equal(entries.Length - 1, result.Entries.Count);
    }

    [Fact]
    public void Fractional_amounts_and_a_subsystem_shared_by_several_hulls_match_own_system_hulls()
    {
        // Li–O sits in three ternary hulls, twice in the same columns (Li first, O last); compositions are written
        // with fractional site amounts. Invented energies.
        PhaseEntry[] entries =
        [
            Formation("Li", "Li", 0.0),
            Formation("Co", "Co", 0.0),
            Formation("Ni", "Ni", 0.0),
            Formation("Mn", "Mn", 0.0),
            Formation("O", "O", 0.0),
            Formation("Li2O", "Li2O", -2.07),
            Formation("Li2O2", "Li2O2", -1.64),
            Formation("Li0.5O", "Li0.5O", -0.90),
            Formation("CoO", "CoO", -1.24),
            Formation("Co3O4", "Co3O4", -1.30),
            Formation("LiCoO2", "LiCoO2", -1.80),
            Formation("Li0.5CoO2", "Li0.5CoO2", -1.60),
            Formation("NiO", "NiO", -1.20),
            Formation("LiNiO2", "LiNiO2", -1.60),
            Formation("Li0.75NiO2", "Li0.75NiO2", -1.55),
            Formation("MnO", "MnO", -2.00),
            Formation("Mn3O4", "Mn3O4", -2.10),
            Formation("LiMn2O4", "LiMn2O4", -2.05),
            Formation("Li0.5Mn2O4", "Li0.5Mn2O4", -1.90),
        ];

        DatasetStabilityResult result = DatasetStability.Analyze(entries);

        Assert.Equal(["Co-Li-O", "Li-Mn-O", "Li-Ni-O"], result.HullSystems);
        Assert.Equal("Co-Li-O", result.Entries[5].HullSystem); // Li2O: the first of the smallest hulls by name
        AssertMatchesOwnSystemHulls(entries, result);
    }

    [Fact]
    public void Polymorphs_and_exact_ties_of_a_shared_subsystem_match_own_system_hulls_and_coverage_counts_them_all()
    {
        // Li–O sits in two ternary hulls and is reported by Co–Li–O only; the Li–Mn–O hull needs, of its many
        // Li2O polymorphs, the lowest (an exact tie of three, the first by id wins) and decomposes into it.
        // Li4O2 is Li2O written twice over. Li2O2's lowest entry comes after Li2O's by id, its first before: the
        // hull numbers the compositions by their first entries, as a hull of every entry does. Invented energies.
        PhaseEntry[] entries =
        [
            Formation("Li", "Li", 0.0),
            Formation("Li-b", "Li", 0.0),
            Formation("O", "O", 0.0),
            Formation("Co", "Co", 0.0),
            Formation("Mn", "Mn", 0.0),
            Formation("Mn-b", "Mn", 0.05),
            Formation("a-Li2O", "Li2O", -1.90),
            Formation("z-Li2O", "Li2O", -2.07),
            Formation("m-Li4O2", "Li4O2", -2.07),
            Formation("q-Li2O", "Li2O", -2.07),
            Formation("b-Li2O", "Li2O", -2.00),
            Formation("Li2O2", "Li2O2", -1.64),
            Formation("Li2O2-b", "Li2O2", -1.64),
            Formation("n-Li2O2", "Li2O2", -1.70),
            Formation("CoO", "CoO", -1.24),
            Formation("LiCoO2", "LiCoO2", -1.80),
            Formation("MnO", "MnO", -2.00),
            Formation("Li2MnO3", "Li2MnO3", -2.02),
            Formation("Li4MnO4", "Li4MnO4", -1.99),
            Formation("LiMnO2", "LiMnO2", -2.01),
        ];

        DatasetStabilityResult result = DatasetStability.Analyze(entries);

        Assert.Equal(["Co-Li-O", "Li-Mn-O"], result.HullSystems);
        Assert.Equal("Co-Li-O", result.Entries[7].HullSystem);
        AssertMatchesOwnSystemHulls(entries, result);
        // Li4MnO4 lies above Li2O + Li2MnO3 (checked against the own-system hull above); the Li2O there is the
        // first by id among the three at -2.07 eV/atom.
        Assert.Contains(result.Entries[18].Decomposition.Products, p => p.Phase.Id == "m-Li4O2");
        foreach (SystemCoverage coverage in result.Coverage)
        {
            var elements = coverage.HullSystem.Split('-').ToHashSet(StringComparer.Ordinal);
            SystemCoverage own = SystemHull.OverElements(entries.Where(e => e.Composition.Elements.All(elements.Contains)).ToArray()).Coverage;
            Assert.Equal(own.EntryCount, coverage.EntryCount);
            Assert.Equal(own.CompoundEntryCount, coverage.CompoundEntryCount);
            Assert.Equal(own.Components, coverage.Components);
        }

        Assert.Equal(17, result.Coverage.Single(c => c.HullSystem == "Li-Mn-O").EntryCount);
    }

    [Fact]
    public void Dataset_entries_needing_amounts_beyond_64_bits_name_the_earliest_row()
    {
        // Arithmetic: with p = 2^35 + 1 and q = 2^35 + 3 (odd, two apart, so coprime), Co_{1/p} Fe_{(p-1)/p}
        // Li_{1/q} O_{(q-1)/q} has two atoms per formula unit, but its whole-number form needs the amounts
        // q, (p-1)q, p and (q-1)p, beyond 2^63.
        long p = (1L << 35) + 1, q = (1L << 35) + 3;
        Composition huge = Composition.FromAmounts(
            ("Co", new Rational(1, p)), ("Fe", new Rational(p - 1, p)), ("Li", new Rational(1, q)), ("O", new Rational(q - 1, q)));
        PhaseEntry[] entries =
        [
            .. SeveralSystems(),
            new PhaseEntry("huge-1", huge, -0.5, EnergyBasis.FormationPerAtom),
            new PhaseEntry("huge-2", huge, -0.6, EnergyBasis.FormationPerAtom),
        ];

        var e = Assert.Throws<ThermoInputException>(() => DatasetStability.Analyze(entries));
        Assert.Equal("huge-1", e.EntryId);
        Assert.Equal(entries.Length - 2, e.RowIndex);
        Assert.Contains("beyond 64 bits", e.Message);
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
