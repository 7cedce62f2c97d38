using Hull.Core.Thermo;
using static Hull.Core.Tests.Thermo.ThermoTestData;

namespace Hull.Core.Tests.Thermo;

/// <summary>
/// What an answer says about its chemical system's coverage, and how a dataset with entries whose formation energy
/// cannot be used (a total energy without elemental reference, a formation energy out of range) is answered: the
/// affected systems are reported, everything else is answered exactly as without those entries.
/// </summary>
public sealed class CoverageAndUnusableEntryTests
{
    [Fact]
    public void A_system_without_entries_of_an_element_says_so()
    {
        // The case that misled: ZrO2 judged against O2 and a Zr corner that no entry sets.
        SystemHull hull = SystemHull.OverElements([Formation("O2", "O2", 0.0), Formation("ZrO2", "ZrO2", -3.0)]);
        SystemCoverage coverage = hull.Coverage;
        Assert.Equal("O-Zr", coverage.HullSystem);
        Assert.Equal(["Zr"], coverage.ComponentsAtZeroByDefinition);
        Assert.Equal(1, coverage.Components.Single(c => c.Name == "O").PureEntryCount);
        Assert.Equal(2, coverage.EntryCount);
        Assert.Equal(1, coverage.CompoundEntryCount);
        Assert.All(coverage.Components, c => Assert.Null(c.Reference));
    }

    [Fact]
    public void Coverage_records_the_reference_of_each_element_and_whether_it_was_given()
    {
        PhaseEntry[] entries =
        [
            Entry("O2", "O2", -9.86, EnergyBasis.TotalPerFormulaUnit),
            Entry("ZrO2", "ZrO2", -28.5, EnergyBasis.TotalPerFormulaUnit),
        ];
        SystemHull hull = SystemHull.OverElements(entries, new ElementalReferences([new("Zr", -8.5)]));
        ComponentCoverage zr = hull.Coverage.Components.Single(c => c.Name == "Zr");
        Assert.True(zr.IsZeroByDefinition);
        Assert.True(zr.Reference!.IsExplicit);
        Assert.Equal(-8.5, zr.Reference.TotalEnergyEvPerAtom);
        Assert.Equal("O2", hull.Coverage.Components.Single(c => c.Name == "O").Reference!.SourceEntryId);
    }

    private static PhaseEntry[] LithiumZirconiumOxides() =>
    [
        Entry("O2", "O2", -9.86, EnergyBasis.TotalPerFormulaUnit),
        Entry("Li", "Li", -1.90, EnergyBasis.TotalPerAtom),
        Entry("Li2O", "Li2O", -14.31, EnergyBasis.TotalPerFormulaUnit),
        Entry("Li2O2", "Li2O2", -19.0, EnergyBasis.TotalPerFormulaUnit),
        // No pure Zr entry: these two cannot become formation energies.
        Entry("ZrO2", "ZrO2", -28.5, EnergyBasis.TotalPerFormulaUnit),
        Entry("Li2ZrO3", "Li2ZrO3", -45.0, EnergyBasis.TotalPerFormulaUnit),
        Formation("Cu2O", "Cu2O", -0.6),
    ];

    [Fact]
    public void Missing_reference_is_reported_per_system_and_the_rest_is_answered()
    {
        PhaseEntry[] entries = LithiumZirconiumOxides();
        DatasetStabilityResult result = DatasetStability.Analyze(entries);

        SystemProblem problem = Assert.Single(result.Problems);
        Assert.Equal("O-Zr", problem.ChemicalSystem);
        Assert.Equal(["Zr"], problem.ElementsWithoutReference);
        // Li2ZrO3 lacks the Zr reference too; it is reported with the smaller system that already rules out its own.
        Assert.Equal(["ZrO2", "Li2ZrO3"], problem.Causes.Select(c => c.EntryId));
        Assert.Equal(["ZrO2", "Li2ZrO3"], problem.UnansweredEntryIds);
        Assert.Contains("no elemental reference for Zr", problem.Message);
        Assert.Contains("'ZrO2'", problem.Message);

        // Every other entry is answered, exactly as in the dataset without the Zr entries.
        PhaseEntry[] without = entries.Where(e => !e.Composition.Elements.Contains("Zr")).ToArray();
        DatasetStabilityResult reference = DatasetStability.Analyze(without);
        Assert.Equal(without.Select(e => e.Id), result.Entries.Select(e => e.Id));
        for (int i = 0; i < without.Length; i++)
        {
            Assert.Equal(reference.Entries[i].EnergyAboveHullEvPerAtom, result.Entries[i].EnergyAboveHullEvPerAtom);
            Assert.Equal(reference.Entries[i].HullSystem, result.Entries[i].HullSystem);
        }

        Assert.Equal(["Cu-O", "Li-O"], result.Coverage.Select(c => c.HullSystem));
        Assert.Equal(result.HullSystems, result.Coverage.Select(c => c.HullSystem));

        // With an explicit reference the same dataset is answered whole.
        DatasetStabilityResult cured = DatasetStability.Analyze(entries, new ElementalReferences([new("Zr", -8.5)]));
        Assert.Empty(cured.Problems);
        Assert.Equal(entries.Length, cured.Entries.Count);
    }

    [Fact]
    public void Out_of_range_formation_energy_is_refused_by_a_hull_and_reported_by_a_dataset()
    {
        PhaseEntry[] entries =
        [
            Formation("O2", "O2", 0.0),
            Formation("MgO", "MgO", -3.1),
            Formation("MgO-bad", "MgO", -1e300),
            Formation("TiO2", "TiO2", -3.4),
        ];
        var refused = Assert.Throws<ThermoInputException>(() => SystemHull.OverElements(entries[..3]));
        Assert.Equal("MgO-bad", refused.EntryId);
        Assert.Contains("formation energy -1E+300 eV/atom is outside the accepted ±100 eV/atom", refused.Message);

        DatasetStabilityResult result = DatasetStability.Analyze(entries);
        SystemProblem problem = Assert.Single(result.Problems);
        Assert.Equal("Mg-O", problem.ChemicalSystem);
        Assert.Equal(EntryEnergyProblemKind.OutOfRange, problem.Causes.Single().Kind);
        Assert.Equal(["MgO", "MgO-bad"], problem.UnansweredEntryIds);
        Assert.Equal(["O2", "TiO2"], result.Entries.Select(e => e.Id));
    }

    [Fact]
    public void Total_energy_implying_an_out_of_range_formation_energy_is_refused()
    {
        // -1e4 eV/atom is a plausible total-energy scale, but against an O reference of -4.93 eV/atom it implies a
        // formation energy of about -5e3 eV/atom.
        PhaseEntry[] entries =
        [
            Entry("O2", "O2", -9.86, EnergyBasis.TotalPerFormulaUnit),
            Entry("Mg", "Mg", -1.54, EnergyBasis.TotalPerAtom),
            Entry("MgO", "MgO", -2e4, EnergyBasis.TotalPerFormulaUnit),
        ];
        var e = Assert.Throws<ThermoInputException>(() => FormationEnergies.Compute(entries));
        Assert.Equal("MgO", e.EntryId);
        Assert.Contains("implied by its total energy and the elemental references", e.Message);

        // Large total energies themselves are fine when the references are on the same scale.
        FormationEnergySet large = FormationEnergies.Compute(
        [
            Entry("O2", "O2", -2e4, EnergyBasis.TotalPerAtom),
            Entry("Mg", "Mg", -1e4, EnergyBasis.TotalPerAtom),
            Entry("MgO", "MgO", -3.0e4 - 6.0, EnergyBasis.TotalPerFormulaUnit),
        ]);
        Assert.Equal(-3.0, large.FormationEnergiesEvPerAtom[2], 1e-9);
    }

    [Fact]
    public void Extreme_energies_never_fail_a_dataset_analysis()
    {
        // Fuzz: every finite magnitude from 1e-300 to 1e300, both signs, formation and total energies, over a few
        // elements; the analysis must answer every entry or report it, and every answer must be finite.
        var random = new Random(7);
        string[] elements = ["Li", "Mg", "O", "Ti"];
        for (int round = 0; round < 30; round++)
        {
            var entries = new List<PhaseEntry>();
            foreach (string element in elements.Where(_ => random.Next(3) > 0))
            {
                entries.Add(Entry($"{element}-{round}", element, Extreme(random), EnergyBasis.TotalPerAtom));
            }

            for (int k = 0; k < 25; k++)
            {
                string formula = string.Concat(elements.Where(_ => random.Next(2) == 0).Select(e => e + random.Next(1, 4)));
                if (formula.Length == 0) continue;
                var basis = (EnergyBasis)random.Next(4);
                entries.Add(Entry($"e{k}", formula, Extreme(random), basis));
            }

            DatasetStabilityResult result = DatasetStability.Analyze(entries);
            var unanswered = result.Problems.SelectMany(p => p.UnansweredEntryIds).ToHashSet();
            Assert.Equal(entries.Count, result.Entries.Count + unanswered.Count);
            Assert.All(result.Entries, e =>
            {
                Assert.True(FormationEnergyRange.Contains(e.AxisEnergyEvPerAtom), e.Id);
                Assert.True(double.IsFinite(e.EnergyAboveHullEvPerAtom) && e.EnergyAboveHullEvPerAtom >= 0, e.Id);
            });
        }
    }

    private static double Extreme(Random random)
    {
        if (random.Next(6) == 0) return 0.0;
        double magnitude = Math.Pow(10, -300 + random.NextDouble() * 600);
        return random.Next(2) == 0 ? -magnitude : magnitude;
    }
}
