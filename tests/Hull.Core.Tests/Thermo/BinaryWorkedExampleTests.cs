using Hull.Core.Chemistry;
using Hull.Core.Thermo;
using static Hull.Core.Tests.Thermo.ThermoTestData;

namespace Hull.Core.Tests.Thermo;

/// <summary>
/// A binary worked by hand (invented energies). Al–Ni, x = atom fraction of Ni, formation energies in eV/atom:
///   Al (x = 0): 0            AlNi (x = 1/2): -0.60       Al3Ni (x = 1/4): -0.20       AlNi3 (x = 3/4): -0.35
///   Ni (x = 1): 0            Al-beta (x = 0): +0.10 (a metastable polymorph of Al)
/// Lower hull: Al, AlNi, AlNi3, Ni. Checks: AlNi lies below Al–AlNi3 (-0.2333 at x = 1/2); AlNi3 lies below
/// AlNi–Ni (-0.30 at x = 3/4); Al3Ni lies above Al–AlNi (-0.30 at x = 1/4) by 0.10.
/// As total energies with references Al = -3.0 and Ni = -5.0 eV/atom (total per atom = formation + sum x_el mu_el):
///   AlNi: 2 * (-0.60 - 1.5 - 2.5) = -9.2 eV per formula unit;  Al3Ni: 4 * (-0.20 - 2.25 - 1.25) = -14.8;
///   AlNi3: 4 * (-0.35 - 0.75 - 3.75) = -19.4;  Al: -3.0 eV/atom;  Al-beta: -2.9 eV/atom;  Ni: -5.0 eV/atom.
/// </summary>
public sealed class BinaryWorkedExampleTests
{
    private const double Tolerance = 1e-9; // hand values are exact decimals; arithmetic error is ~1e-15

    private static PhaseEntry[] FormationSet() =>
    [
        Formation("Al", "Al", 0.0),
        Formation("Al-beta", "Al", 0.10),
        Formation("Ni", "Ni", 0.0),
        Formation("AlNi", "AlNi", -0.60),
        Formation("Al3Ni", "Al3Ni", -0.20),
        Formation("AlNi3", "AlNi3", -0.35),
    ];

    private static PhaseEntry[] TotalSet() =>
    [
        Entry("Al", "Al", -3.0, EnergyBasis.TotalPerAtom),
        Entry("Al-beta", "Al", -2.9, EnergyBasis.TotalPerAtom),
        Entry("Ni", "Ni2", -10.0, EnergyBasis.TotalPerFormulaUnit),
        Entry("AlNi", "AlNi", -9.2, EnergyBasis.TotalPerFormulaUnit),
        Entry("Al3Ni", "Al3Ni", -14.8, EnergyBasis.TotalPerFormulaUnit),
        Entry("AlNi3", "AlNi3", -19.4 / 4, EnergyBasis.TotalPerAtom),
    ];

    [Fact]
    public void Stable_set_energies_above_hull_and_decompositions()
    {
        SystemHull hull = SystemHull.OverElements(FormationSet());
        Assert.Equal(["Al", "Ni"], hull.Components);
        Assert.Equal("Al-Ni", hull.SystemName);
        Assert.Equal(["Al", "AlNi", "AlNi3", "Ni"], hull.StablePhases.Select(p => p.Id));

        EntryStability al3ni = hull.GetEntry("Al3Ni");
        Assert.False(al3ni.IsOnHull);
        Assert.Equal(0.10, al3ni.EnergyAboveHullEvPerAtom, Tolerance);
        // Al3Ni -> 2 Al + AlNi: lever rule at x = 1/4 between 0 and 1/2 gives half the atoms to each.
        Assert.Equal("Al3Ni -> 2 Al + AlNi", al3ni.Decomposition.ToReactionString());
        Assert.Equal([0.5, 0.5], al3ni.Decomposition.Products.Select(p => p.AtomFraction));
        Assert.Equal(-0.30, al3ni.Decomposition.HullEnergyEvPerAtom, Tolerance);
        AssertBalancedExactly(al3ni.Decomposition);

        EntryStability beta = hull.GetEntry("Al-beta");
        Assert.Equal(0.10, beta.EnergyAboveHullEvPerAtom, Tolerance);
        Assert.Equal("Al", beta.Decomposition.Products.Single().Phase.Id);
        Assert.Null(beta.DecompositionEnergyEvPerAtom);

        EntryStability alni = hull.GetEntry("AlNi");
        Assert.True(alni.IsOnHull);
        Assert.True(alni.IsHullVertex);
        Assert.Equal("AlNi -> AlNi", alni.Decomposition.ToReactionString());
    }

    [Fact]
    public void Decomposition_energies_by_hand()
    {
        SystemHull hull = SystemHull.OverElements(FormationSet());

        // Without AlNi the metastable Al3Ni joins the hull: Al (0, 0), Al3Ni (1/4, -0.20), AlNi3 (3/4, -0.35), Ni.
        // (Al–AlNi3 passes x = 1/4 at -0.1167, above Al3Ni.) At x = 1/2 the hull is -0.20 + (-0.15) * (1/4) / (1/2)
        // = -0.275, so AlNi's decomposition energy is -0.60 + 0.275 = -0.325 eV/atom.
        Assert.Equal(-0.325, hull.GetEntry("AlNi").DecompositionEnergyEvPerAtom!.Value, Tolerance);

        // Without AlNi3 the hull is AlNi–Ni at x = 3/4: -0.30; -0.35 + 0.30 = -0.05 eV/atom.
        Assert.Equal(-0.05, hull.GetEntry("AlNi3").DecompositionEnergyEvPerAtom!.Value, Tolerance);

        Assert.Null(hull.GetEntry("Al").DecompositionEnergyEvPerAtom);
        Assert.Null(hull.GetEntry("Ni").DecompositionEnergyEvPerAtom);
        Assert.Null(hull.GetEntry("Al3Ni").DecompositionEnergyEvPerAtom);

        foreach (string id in new[] { "AlNi", "AlNi3" })
        {
            Assert.Equal(hull.DecompositionEnergyByFullRebuild(id)!.Value, hull.GetEntry(id).DecompositionEnergyEvPerAtom!.Value, 1e-12);
        }
    }

    [Fact]
    public void Facets_carry_the_chemical_potentials_worked_by_hand()
    {
        SystemHull hull = SystemHull.OverElements(FormationSet());

        // Along a facet, e(x) = mu_Al (1 - x) + mu_Ni x.
        //   Al–AlNi:    mu_Al = 0;     0.5 mu_Ni = -0.60  -> mu_Ni = -1.2.
        //   AlNi–AlNi3: 0.5 (mu_Al + mu_Ni) = -0.60 and 0.25 mu_Al + 0.75 mu_Ni = -0.35 -> mu_Ni = -0.1, mu_Al = -1.1.
        //   AlNi3–Ni:   mu_Ni = 0;     0.25 mu_Al = -0.35 -> mu_Al = -1.4.
        var byCorners = hull.Facets.ToDictionary(f => string.Join("|", f.Phases.Select(p => p.Id)));
        Assert.Equal(3, byCorners.Count);
        Assert.Equal(0.0, byCorners["Al|AlNi"].ChemicalPotentialOf("Al"), Tolerance);
        Assert.Equal(-1.2, byCorners["Al|AlNi"].ChemicalPotentialOf("Ni"), Tolerance);
        Assert.Equal(-1.1, byCorners["AlNi|AlNi3"].ChemicalPotentialOf("Al"), Tolerance);
        Assert.Equal(-0.1, byCorners["AlNi|AlNi3"].ChemicalPotentialOf("Ni"), Tolerance);
        Assert.Equal(-1.4, byCorners["AlNi3|Ni"].ChemicalPotentialOf("Al"), Tolerance);
        Assert.Equal(0.0, byCorners["AlNi3|Ni"].ChemicalPotentialOf("Ni"), Tolerance);

        Assert.Equal(["Al|AlNi", "AlNi|AlNi3", "AlNi3|Ni"], hull.TieLines.Select(t => $"{t.First.Id}|{t.Second.Id}"));
    }

    [Fact]
    public void Total_energies_give_the_same_answer_as_formation_energies()
    {
        SystemHull fromFormation = SystemHull.OverElements(FormationSet());
        SystemHull fromTotal = SystemHull.OverElements(TotalSet());

        Assert.Equal(
            [new ElementReference("Al", -3.0, "Al"), new ElementReference("Ni", -5.0, "Ni")],
            fromTotal.References);
        foreach (EntryStability expected in fromFormation.Entries)
        {
            EntryStability actual = fromTotal.GetEntry(expected.Id);
            Assert.Equal(expected.FormationEnergyEvPerAtom, actual.FormationEnergyEvPerAtom, Tolerance);
            Assert.Equal(expected.EnergyAboveHullEvPerAtom, actual.EnergyAboveHullEvPerAtom, Tolerance);
            Assert.Equal(expected.IsHullVertex, actual.IsHullVertex);
            Assert.Equal(expected.DecompositionEnergyEvPerAtom ?? double.NaN, actual.DecompositionEnergyEvPerAtom ?? double.NaN, Tolerance);
            Assert.Equal(
                expected.Decomposition.Products.Select(p => p.Phase.Id),
                actual.Decomposition.Products.Select(p => p.Phase.Id));
        }

        // The entry that sets a reference sits at exactly 0.
        Assert.Equal(0.0, fromTotal.GetEntry("Al").FormationEnergyEvPerAtom);
        Assert.Equal(0.0, fromTotal.GetEntry("Ni").FormationEnergyEvPerAtom);
    }

    [Fact]
    public void Explicit_references_override_the_element_entries()
    {
        // Al = -3.1 eV/atom instead of the entry's -3.0: every Al-containing formation energy rises by 0.1 x_Al.
        // AlNi: -9.2 / 2 - 0.5 * (-3.1) - 0.5 * (-5.0) = -4.6 + 1.55 + 2.5 = -0.55 eV/atom; pure Al: +0.10.
        var references = new ElementalReferences([new("Al", -3.1)]);
        SystemHull hull = SystemHull.OverElements(TotalSet(), references);

        Assert.Equal(new ElementReference("Al", -3.1, null), hull.References[0]);
        Assert.True(hull.References[0].IsExplicit);
        Assert.Equal(-0.55, hull.GetEntry("AlNi").FormationEnergyEvPerAtom, Tolerance);
        Assert.Equal(0.10, hull.GetEntry("Al").FormationEnergyEvPerAtom, Tolerance);

        // Adding a linear function of the composition moves no point relative to the hull: Al is still the Al corner,
        // and Al3Ni is still 0.10 eV/atom above the hull.
        Assert.True(hull.GetEntry("Al").IsHullVertex);
        Assert.Equal(0.10, hull.GetEntry("Al3Ni").EnergyAboveHullEvPerAtom, Tolerance);
        Assert.Equal(-0.325, hull.GetEntry("AlNi").DecompositionEnergyEvPerAtom!.Value, Tolerance);
    }

    [Fact]
    public void Explicit_references_stand_in_for_missing_elements()
    {
        // Only compounds; the references make their formation energies and add synthetic corners at 0.
        var references = new ElementalReferences([new("Al", -3.0), new("Ni", -5.0)]);
        PhaseEntry[] compounds = TotalSet().Where(e => e.Composition.Elements.Count == 2).ToArray();
        SystemHull hull = SystemHull.OverElements(compounds, references);

        Assert.Equal(["Al", "AlNi", "AlNi3", "Ni"], hull.StablePhases.Select(p => p.Id));
        Assert.True(hull.StablePhases[0].IsSynthetic);
        Assert.False(hull.StablePhases[1].IsSynthetic);
        Assert.Equal(0.10, hull.GetEntry("Al3Ni").EnergyAboveHullEvPerAtom, Tolerance);
        Assert.Equal("Al3Ni -> 2 Al + AlNi", hull.GetEntry("Al3Ni").Decomposition.ToReactionString());
        Assert.True(hull.GetEntry("Al3Ni").Decomposition.Products[0].Phase.IsSynthetic);
    }

    [Fact]
    public void Polymorphs_that_tie_are_both_on_the_hull_and_one_is_the_vertex()
    {
        PhaseEntry[] entries = [.. FormationSet(), Formation("AlNi-b2", "Al2Ni2", -0.60)];
        SystemHull hull = SystemHull.OverElements(entries);

        EntryStability first = hull.GetEntry("AlNi");
        EntryStability second = hull.GetEntry("AlNi-b2");
        Assert.True(first.IsOnHull);
        Assert.True(second.IsOnHull);
        Assert.True(first.IsHullVertex);
        Assert.False(second.IsHullVertex); // the smaller id is the vertex, whatever the input order
        Assert.Equal(0.0, second.EnergyAboveHullEvPerAtom);
        // Al2Ni2 -> 2 AlNi: the tie decomposes into the vertex polymorph, per formula unit as written.
        Assert.Equal("Al2Ni2 -> 2 AlNi", second.Decomposition.ToReactionString());

        // Removing the whole reduced composition AlNi removes both polymorphs: both get -0.325.
        Assert.Equal(-0.325, first.DecompositionEnergyEvPerAtom!.Value, Tolerance);
        Assert.Equal(-0.325, second.DecompositionEnergyEvPerAtom!.Value, Tolerance);
        Assert.Equal(hull.DecompositionEnergyByFullRebuild("AlNi-b2")!.Value, second.DecompositionEnergyEvPerAtom!.Value, 1e-12);

        SystemHull reversed = SystemHull.OverElements(entries.Reverse().ToArray());
        Assert.True(reversed.GetEntry("AlNi").IsHullVertex);
        Assert.False(reversed.GetEntry("AlNi-b2").IsHullVertex);
    }

    [Fact]
    public void An_entry_lying_exactly_on_a_tie_line_touches_the_hull_with_decomposition_energy_zero()
    {
        // Al2Ni (x = 1/3) on the Al–AlNi line: -0.60 * (1/3) / (1/2) = -0.40 eV/atom. Removing it leaves the hull
        // unchanged, so its decomposition energy is 0 (not negative).
        PhaseEntry[] entries = [.. FormationSet().Where(e => e.Id != "Al3Ni"), Formation("Al2Ni", "Al2Ni", -0.40)];
        SystemHull hull = SystemHull.OverElements(entries);
        EntryStability touching = hull.GetEntry("Al2Ni");
        Assert.True(touching.IsOnHull);
        Assert.Equal(0.0, touching.DecompositionEnergyEvPerAtom);
        Assert.Equal(0.0, hull.DecompositionEnergyByFullRebuild("Al2Ni"));
    }

    [Fact]
    public void Hull_energy_at_hypothetical_compositions_and_ad_hoc_candidates()
    {
        SystemHull hull = SystemHull.OverElements(FormationSet());

        // AlNi2 (x = 2/3) lies between AlNi (1/2, -0.60) and AlNi3 (3/4, -0.35); that line rises by 1.0 eV/atom per
        // unit x, so the hull there is -0.60 + (2/3 - 1/2) = -0.43333 eV/atom. Balance per formula unit of AlNi2:
        // a AlNi + b AlNi3 with Al: a + b = 1 and Ni: a + 3b = 2, so a = b = 1/2.
        Decomposition alni2 = hull.DecompositionAt(Composition.Parse("AlNi2"));
        Assert.Equal(-0.60 + (2.0 / 3.0 - 0.5), alni2.HullEnergyEvPerAtom, Tolerance);
        Assert.Equal("AlNi2 -> 1/2 AlNi + 1/2 AlNi3", alni2.ToReactionString());
        AssertBalancedExactly(alni2);
        Assert.Equal(-0.60 + (2.0 / 3.0 - 0.5), hull.HullEnergyEvPerAtomAt(Composition.Parse("Al2Ni4")), Tolerance);

        CandidateStability below = hull.Assess(Composition.Parse("AlNi2"), -0.50);
        Assert.True(below.IsOnOrBelowHull);
        Assert.True(below.IsBelowHull);
        Assert.Equal(-0.50 - alni2.HullEnergyEvPerAtom, below.EnergyRelativeToHullEvPerAtom, Tolerance);
        Assert.Equal(0.0, below.EnergyAboveHullEvPerAtom);

        CandidateStability above = hull.Assess(Composition.Parse("Al3Ni"), -0.25);
        Assert.False(above.IsOnOrBelowHull);
        Assert.Equal(0.05, above.EnergyAboveHullEvPerAtom, Tolerance);

        CandidateStability onHull = hull.Assess(Composition.Parse("AlNi"), -0.60);
        Assert.True(onHull.IsOnOrBelowHull);
        Assert.False(onHull.IsBelowHull);

        // The hull itself did not change.
        Assert.Equal(["Al", "AlNi", "AlNi3", "Ni"], hull.StablePhases.Select(p => p.Id));
    }

    [Fact]
    public void Results_do_not_depend_on_input_order()
    {
        PhaseEntry[] entries = [.. TotalSet(), Entry("AlNi-b2", "Al2Ni2", -18.4, EnergyBasis.TotalPerFormulaUnit)];
        SystemHull reference = SystemHull.OverElements(entries);
        for (int seed = 1; seed <= 5; seed++)
        {
            SystemHull shuffled = SystemHull.OverElements(Shuffled(entries, seed));
            Assert.Equal(reference.StablePhases.Select(p => p.Id), shuffled.StablePhases.Select(p => p.Id));
            Assert.Equal(reference.TieLines.Select(t => t.ToString()), shuffled.TieLines.Select(t => t.ToString()));
            foreach (EntryStability expected in reference.Entries)
            {
                EntryStability actual = shuffled.GetEntry(expected.Id);
                Assert.Equal(expected.EnergyAboveHullEvPerAtom, actual.EnergyAboveHullEvPerAtom);
                Assert.Equal(expected.IsHullVertex, actual.IsHullVertex);
                Assert.Equal(expected.DecompositionEnergyEvPerAtom, actual.DecompositionEnergyEvPerAtom);
                Assert.Equal(expected.Decomposition.ToReactionString(), actual.Decomposition.ToReactionString());
            }
        }
    }

    /// <summary>
    /// Chemical potentials (eV/atom, relative to the pure elements) solved by hand from the facet planes:
    /// Al–AlNi: mu_Al = 0, (mu_Al + mu_Ni)/2 = −0.60, so mu_Ni = −1.2; AlNi–AlNi3: (mu_Al + mu_Ni)/2 = −0.60 and
    /// (mu_Al + 3 mu_Ni)/4 = −0.35 give mu_Al = −1.1, mu_Ni = −0.1; AlNi3–Ni: mu_Ni = 0, mu_Al/4 = −0.35, mu_Al = −1.4.
    /// </summary>
    [Theory]
    [InlineData("Al3Ni", 0.0, -1.2)]
    [InlineData("Al2Ni3", -1.1, -0.1)]
    [InlineData("AlNi7", -1.4, 0.0)]
    public void Chemical_potentials_are_those_of_the_facet_holding_the_composition(string formula, double muAl, double muNi)
    {
        SystemHull hull = SystemHull.OverElements(FormationSet());
        IReadOnlyList<double> mu = hull.ChemicalPotentialsEvPerAtomAt(Composition.Parse(formula));
        Assert.Equal(2, mu.Count);
        Assert.Equal(muAl, mu[0], Tolerance);
        Assert.Equal(muNi, mu[1], Tolerance);
    }

    [Fact]
    public void Chemical_potentials_outside_the_system_are_refused()
    {
        SystemHull hull = SystemHull.OverElements(FormationSet());
        var e = Assert.Throws<ThermoInputException>(() => hull.ChemicalPotentialsEvPerAtomAt(Composition.Parse("AlO")));
        Assert.Contains("AlO", e.Message);
    }
}
