using Hull.Core.Chemistry;
using Hull.Core.Thermo;
using static Hull.Core.Tests.Thermo.ThermoTestData;

namespace Hull.Core.Tests.Thermo;

/// <summary>
/// Outside check on handbook thermochemistry: standard enthalpies of formation at 298.15 K, fed as formation
/// energies per formula unit; the check is on ΔH at 298.15 K only (no entropy, so this is not a phase diagram at
/// temperature). Expected values are worked by hand below from the same table values.
/// </summary>
public sealed class HandbookFeOxideTests
{
    // 1 eV per particle = 96.485 kJ/mol (CODATA: e * N_A = 96 485.33 C/mol).
    private const double KilojoulesPerMolePerEv = 96.485;

    // Hand calculations are carried to about 1e-12 eV/atom; 1e-6 eV/atom is the agreed check tolerance.
    private const double ToleranceEvPerAtom = 1e-6;

    // NIST-JANAF Thermochemical Tables, 4th ed. (Chase, 1998), ΔfH°(298.15 K) in kJ/mol — from memory.
    private const double WustiteFe0947O = -266.27;  // Fe0.947O, the wüstite composition JANAF tabulates
    private const double FeOStoichiometric = -272.04; // FeO, the stoichiometric value (used as a second entry)
    private const double Magnetite = -1120.89;      // Fe3O4
    private const double Hematite = -824.25;        // Fe2O3

    private static PhaseEntry PerFormulaUnit(string id, string formula, double kilojoulesPerMole) =>
        Entry(id, formula, kilojoulesPerMole / KilojoulesPerMolePerEv, EnergyBasis.FormationPerFormulaUnit);

    private static PhaseEntry[] IronOxides(bool withElements)
    {
        var entries = new List<PhaseEntry>
        {
            PerFormulaUnit("wustite", "Fe0.947O", WustiteFe0947O),
            PerFormulaUnit("FeO", "FeO", FeOStoichiometric),
            PerFormulaUnit("magnetite", "Fe3O4", Magnetite),
            PerFormulaUnit("hematite", "Fe2O3", Hematite),
        };
        if (withElements)
        {
            // Elements in their standard states: ΔfH° = 0 by definition.
            entries.Add(PerFormulaUnit("alpha-Fe", "Fe", 0.0));
            entries.Add(PerFormulaUnit("O2(g)", "O2", 0.0));
        }

        return entries.ToArray();
    }

    [Fact]
    public void Hull_is_iron_magnetite_hematite_oxygen()
    {
        SystemHull hull = SystemHull.OverElements(IronOxides(withElements: true));
        Assert.Equal(["O2(g)", "alpha-Fe", "hematite", "magnetite"], hull.StablePhases.Select(p => p.Id).Order(StringComparer.Ordinal));
        Assert.All(hull.StablePhases, p => Assert.False(p.IsSynthetic));
        Assert.False(hull.GetEntry("wustite").IsOnHull);
        Assert.False(hull.GetEntry("FeO").IsOnHull);

        // Tie-lines along the Fe–O line: Fe–Fe3O4, Fe3O4–Fe2O3, Fe2O3–O2.
        Assert.Equal(
            ["O2(g)|hematite", "alpha-Fe|magnetite", "hematite|magnetite"],
            hull.TieLines.Select(t => $"{t.First.Id}|{t.Second.Id}"));
    }

    [Fact]
    public void Wustite_lies_above_the_hull_by_the_hand_calculated_amount_and_decomposes_to_iron_and_magnetite()
    {
        SystemHull hull = SystemHull.OverElements(IronOxides(withElements: true));

        // Fe0.947O -> 0.197 Fe + 1/4 Fe3O4 (O: 4 * 1/4 = 1; Fe: 0.197 + 3/4 = 0.947).
        // ΔH = 1/4 * (-1120.89) - (-266.27) = -280.2225 + 266.27 = -13.9525 kJ/mol per 1.947 atoms
        //    = -7.166153 kJ/mol per atom = -0.07427220 eV/atom, so wüstite lies 0.07427220 eV/atom above the hull.
        EntryStability wustite = hull.GetEntry("wustite");
        Assert.Equal(0.0742721983, wustite.EnergyAboveHullEvPerAtom, ToleranceEvPerAtom);
        Assert.Equal(["alpha-Fe", "magnetite"], wustite.Decomposition.Products.Select(p => p.Phase.Id));
        Assert.Equal(new Rational(197, 1000), wustite.Decomposition.Products[0].ExactFormulaUnits);
        Assert.Equal(new Rational(1, 4), wustite.Decomposition.Products[1].ExactFormulaUnits);
        AssertBalancedExactly(wustite.Decomposition);
        Assert.Null(wustite.DecompositionEnergyEvPerAtom);

        // 4 FeO -> Fe + Fe3O4: ΔH = -1120.89 - 4 * (-272.04) = -32.73 kJ/mol per 8 atoms
        //    = -4.09125 kJ/mol per atom = -0.04240296 eV/atom.
        EntryStability feo = hull.GetEntry("FeO");
        Assert.Equal(0.0424029642, feo.EnergyAboveHullEvPerAtom, ToleranceEvPerAtom);
        Assert.Equal("FeO -> 1/4 Fe + 1/4 Fe3O4", feo.Decomposition.ToReactionString());
        AssertBalancedExactly(feo.Decomposition);

        // Formation energy per atom straight from the table: -272.04 / 96.485 / 2 = -1.40975281 eV/atom.
        Assert.Equal(-1.4097528113, feo.FormationEnergyEvPerAtom!.Value, ToleranceEvPerAtom);
    }

    [Fact]
    public void Decomposition_energies_of_the_stable_oxides_match_balanced_reactions()
    {
        SystemHull hull = SystemHull.OverElements(IronOxides(withElements: true));

        // Without Fe3O4 the hull runs Fe–Fe2O3: that line lies at -1.4238 eV/atom at x_O = 1/2 and at -1.4625 at
        // x_O = 1/1.947, below FeO (-1.4098) and Fe0.947O (-1.4174), so neither joins it. Fe3O4 -> 1/3 Fe + 4/3 Fe2O3:
        // ΔH = 4/3 * (-824.25) - (-1120.89) = -1099.00 + 1120.89 = +21.89 kJ/mol per 7 atoms,
        // so the decomposition energy is -21.89 / 7 / 96.485 = -0.03241066 eV/atom.
        Assert.Equal(-0.0324106634, hull.GetEntry("magnetite").DecompositionEnergyEvPerAtom!.Value, ToleranceEvPerAtom);

        // Without Fe2O3 the hull runs Fe3O4–O2. Fe2O3 -> 2/3 Fe3O4 + 1/6 O2:
        // ΔH = 2/3 * (-1120.89) - (-824.25) = -747.26 + 824.25 = +76.99 kJ/mol per 5 atoms,
        // so the decomposition energy is -76.99 / 5 / 96.485 = -0.15958957 eV/atom.
        Assert.Equal(-0.1595895735, hull.GetEntry("hematite").DecompositionEnergyEvPerAtom!.Value, ToleranceEvPerAtom);

        // Elements: not applicable.
        Assert.Null(hull.GetEntry("alpha-Fe").DecompositionEnergyEvPerAtom);
        Assert.Null(hull.GetEntry("O2(g)").DecompositionEnergyEvPerAtom);

        // Fast path against a full rebuild of the hull.
        foreach (string id in new[] { "magnetite", "hematite" })
        {
            Assert.Equal(hull.DecompositionEnergyByFullRebuild(id)!.Value, hull.GetEntry(id).DecompositionEnergyEvPerAtom!.Value, 1e-12);
        }
    }

    [Fact]
    public void Without_element_entries_synthetic_references_take_their_place()
    {
        SystemHull withElements = SystemHull.OverElements(IronOxides(withElements: true));
        SystemHull without = SystemHull.OverElements(IronOxides(withElements: false));

        HullPhase[] synthetic = without.StablePhases.Where(p => p.IsSynthetic).ToArray();
        Assert.Equal(["Fe", "O"], synthetic.Select(p => p.Id));
        Assert.All(synthetic, p => Assert.Equal(0.0, p.FormationEnergyEvPerAtom));

        EntryStability wustite = without.GetEntry("wustite");
        Assert.Equal(withElements.GetEntry("wustite").EnergyAboveHullEvPerAtom, wustite.EnergyAboveHullEvPerAtom, 1e-12);
        DecompositionProduct iron = wustite.Decomposition.Products.Single(p => p.Phase.IsSynthetic);
        Assert.Equal("Fe", iron.Phase.Id);
        Assert.Equal(new Rational(197, 1000), iron.ExactFormulaUnits);

        // A hypothetical FeO3 (x_O = 3/4) falls between Fe2O3 and the synthetic O reference (one atom per formula unit):
        // FeO3 -> 1/2 Fe2O3 + 3/2 O; lever rule: Fe2O3 carries (1 - 3/4) / (1 - 3/5) = 5/8 of the atoms.
        Decomposition feo3 = without.DecompositionAt(Composition.Parse("FeO3"));
        Assert.Equal("FeO3 -> 3/2 O + 1/2 Fe2O3", feo3.ToReactionString()); // products in id order
        Assert.Equal(0.625, feo3.Products.Single(p => p.Phase.Id == "hematite").AtomFraction, 1e-12);
        AssertBalancedExactly(feo3);
    }
}
