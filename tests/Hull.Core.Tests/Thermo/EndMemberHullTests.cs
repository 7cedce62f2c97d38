using Hull.Core.Chemistry;
using Hull.Core.Thermo;
using static Hull.Core.Tests.Thermo.ThermoTestData;

namespace Hull.Core.Tests.Thermo;

/// <summary>Hulls over compound end-members, worked by hand (invented energies).</summary>
public sealed class EndMemberHullTests
{
    private const double Tolerance = 1e-9; // hand values are short decimals; arithmetic error is ~1e-15

    /// <summary>
    /// Pseudo-binary Li2O–Al2O3; y = fraction of the atoms that come from Al2O3 (Li2O: 3 atoms, Al2O3: 5 atoms):
    ///   Li5AlO4 = 5/2 Li2O + 1/2 Al2O3: 7.5 + 2.5 atoms -> y = 1/4
    ///   LiAlO2  = 1/2 Li2O + 1/2 Al2O3: 1.5 + 2.5 atoms -> y = 5/8
    ///   LiAl5O8 = 1/2 Li2O + 5/2 Al2O3: 1.5 + 12.5 atoms -> y = 25/28
    /// End-members (formation from elements, eV/atom): Li2O -2.07, Al2O3 -3.47. Energies relative to the end-members
    /// (eV/atom): Li5AlO4 -0.05, LiAlO2 -0.10, LiAl5O8 -0.02, so from the elements:
    ///   Li5AlO4: 0.75 * -2.07 + 0.25 * -3.47 - 0.05 = -2.47;  LiAlO2: 0.375 * -2.07 + 0.625 * -3.47 - 0.10 = -3.045;
    ///   LiAl5O8: 3/28 * -2.07 + 25/28 * -3.47 - 0.02 = -3.34.
    /// </summary>
    private static PhaseEntry[] Aluminates() =>
    [
        Formation("Li2O", "Li2O", -2.07),
        Formation("Al2O3", "Al2O3", -3.47),
        Formation("Li5AlO4", "Li5AlO4", -2.47),
        Formation("LiAlO2", "LiAlO2", -3.045),
        Formation("LiAl5O8", "LiAl5O8", -3.34),
    ];

    private static EndMemberBasis AluminateBasis() =>
        new([Composition.Parse("Li2O"), Composition.Parse("Al2O3")], ["Li2O", "Al2O3"]);

    [Fact]
    public void Compositions_are_written_exactly_on_the_end_members()
    {
        EndMemberBasis basis = AluminateBasis();
        Assert.Equal([new Rational(1, 2), new Rational(1, 2)], basis.FormulaUnitsOf(Composition.Parse("LiAlO2")));
        Assert.Equal([new Rational(5, 2), new Rational(1, 2)], basis.FormulaUnitsOf(Composition.Parse("Li5AlO4")));
        Assert.Equal([0.375, 0.625], basis.AtomFractionsOf(Composition.Parse("LiAlO2")));
        Assert.Equal(3.0 / 28.0, basis.AtomFractionsOf(Composition.Parse("LiAl5O8"))[0], 1e-15);
        Assert.Equal(["Al", "Li", "O"], basis.Elements);
    }

    [Fact]
    public void Pseudo_binary_lever_rule_by_hand()
    {
        SystemHull hull = SystemHull.OverEndMembers(Aluminates(), AluminateBasis());
        Assert.Equal(["Li2O", "Al2O3"], hull.Components);
        Assert.Equal("Li2O-Al2O3", hull.SystemName);
        Assert.Equal(["Al2O3", "Li2O", "Li5AlO4", "LiAlO2"], hull.StablePhases.Select(p => p.Id));

        Assert.Equal(-0.05, hull.GetEntry("Li5AlO4").FormationEnergyFromEndMembersEvPerAtom!.Value, Tolerance);
        Assert.Equal(-0.10, hull.GetEntry("LiAlO2").FormationEnergyFromEndMembersEvPerAtom!.Value, Tolerance);
        Assert.Equal(-0.02, hull.GetEntry("LiAl5O8").FormationEnergyFromEndMembersEvPerAtom!.Value, Tolerance);
        Assert.Equal(0.0, hull.GetEntry("Li2O").FormationEnergyFromEndMembersEvPerAtom!.Value, Tolerance);
        Assert.Equal([0.25, 0.75], hull.GetEntry("Li5AlO4").ComponentAtomFractions.Reverse());

        // LiAl5O8 (y = 25/28) against LiAlO2 (5/8, -0.10) – Al2O3 (1, 0): hull = -0.10 * (3/28) / (3/8) = -0.0285714,
        // so it lies 0.0085714 (= 0.06 / 7) eV/atom above. Lever rule: Al2O3 carries (25/28 - 5/8) / (3/8) = 5/7 of the
        // atoms. Reaction: LiAl5O8 -> LiAlO2 + 2 Al2O3 (Li 1; Al 1 + 4; O 2 + 6).
        EntryStability spinel = hull.GetEntry("LiAl5O8");
        Assert.Equal(0.06 / 7.0, spinel.EnergyAboveHullEvPerAtom, Tolerance);
        Assert.Equal("LiAl5O8 -> 2 Al2O3 + LiAlO2", spinel.Decomposition.ToReactionString()); // formulas as written
        Assert.Equal(5.0 / 7.0, spinel.Decomposition.Products.Single(p => p.Phase.Id == "Al2O3").AtomFraction, Tolerance);
        Assert.Equal(2.0 / 7.0, spinel.Decomposition.Products.Single(p => p.Phase.Id == "LiAlO2").AtomFraction, Tolerance);
        AssertBalancedExactly(spinel.Decomposition);

        // Without LiAlO2 the hull runs Li5AlO4 (1/4, -0.05) – LiAl5O8 (25/28, -0.02) (the spinel joins it: the line
        // Li5AlO4–Al2O3 passes y = 25/28 at -0.0071, above -0.02). At y = 5/8: -0.05 + 0.03 * (3/8) / (9/14) = -0.0325,
        // so LiAlO2's decomposition energy is -0.10 + 0.0325 = -0.0675 eV/atom.
        Assert.Equal(-0.0675, hull.GetEntry("LiAlO2").DecompositionEnergyEvPerAtom!.Value, Tolerance);
        // Without Li5AlO4 the hull runs Li2O–LiAlO2, at y = 1/4: -0.04; -0.05 + 0.04 = -0.01 eV/atom.
        Assert.Equal(-0.01, hull.GetEntry("Li5AlO4").DecompositionEnergyEvPerAtom!.Value, Tolerance);
        Assert.Null(hull.GetEntry("Li2O").DecompositionEnergyEvPerAtom); // an end-member cannot leave its own hull
        foreach (string id in new[] { "LiAlO2", "Li5AlO4" })
        {
            Assert.Equal(hull.DecompositionEnergyByFullRebuild(id)!.Value, hull.GetEntry(id).DecompositionEnergyEvPerAtom!.Value, 1e-12);
        }

        // Chemical potentials per atom of each end-member on the facet Li2O–Li5AlO4: mu_Li2O = -2.07 (its corner), and
        // -2.47 = 0.75 * -2.07 + 0.25 * mu_Al2O3, so mu_Al2O3 = -3.67 eV/atom.
        PhaseFacet facet = hull.Facets.Single(f => f.Phases.Select(p => p.Id).SequenceEqual(["Li2O", "Li5AlO4"]));
        Assert.Equal(-2.07, facet.ChemicalPotentialOf("Li2O"), Tolerance);
        Assert.Equal(-3.67, facet.ChemicalPotentialOf("Al2O3"), Tolerance);
    }

    [Fact]
    public void Pseudo_binary_queries_and_reference_invariance()
    {
        SystemHull hull = SystemHull.OverEndMembers(Aluminates(), AluminateBasis());

        // Li3AlO3 = 3/2 Li2O + 1/2 Al2O3 (y = 2.5 / 7) lies between Li5AlO4 and LiAlO2:
        // Li3AlO3 -> a Li5AlO4 + b LiAlO2 with Li 5a + b = 3 and Al a + b = 1: a = b = 1/2.
        Decomposition hypothetical = hull.DecompositionAt(Composition.Parse("Li3AlO3"));
        Assert.Equal(["Li5AlO4", "LiAlO2"], hypothetical.Products.Select(p => p.Phase.Id));
        Assert.All(hypothetical.Products, p => Assert.Equal(new Rational(1, 2), p.ExactFormulaUnits));
        AssertBalancedExactly(hypothetical);

        // A compound outside the pseudo-binary cannot be asked about.
        Assert.Throws<ThermoInputException>(() => hull.DecompositionAt(Composition.Parse("LiO")));

        // The same phases as total energies with explicit element references: formation energies from the elements
        // shift by a linear function of composition, and nothing relative to the hull moves.
        var references = new ElementalReferences([new("Li", -1.9), new("Al", -3.7), new("O", -4.9)]);
        PhaseEntry[] totals = Aluminates()
            .Select(e =>
            {
                double shift = e.Composition.Elements.Sum(el => e.Composition.AtomicFraction(el) * references.Symbols.Zip([-3.7, -1.9, -4.9]).Single(p => p.First == el).Second);
                return Entry(e.Id, e.Composition.Formula, e.EnergyEv + shift, EnergyBasis.TotalPerAtom);
            })
            .ToArray();
        SystemHull fromTotals = SystemHull.OverEndMembers(totals, AluminateBasis(), references);
        foreach (EntryStability expected in hull.Entries)
        {
            EntryStability actual = fromTotals.GetEntry(expected.Id);
            Assert.Equal(expected.FormationEnergyEvPerAtom!.Value, actual.FormationEnergyEvPerAtom!.Value, Tolerance);
            Assert.Equal(expected.EnergyAboveHullEvPerAtom, actual.EnergyAboveHullEvPerAtom, Tolerance);
        }
    }

    /// <summary>
    /// Pseudo-ternary LiCoO2–LiNiO2–LiMnO2 (all 4 atoms per formula unit, so atom fractions equal formula-unit
    /// fractions). End-members from the elements: LiCoO2 -1.80, LiNiO2 -1.50, LiMnO2 -1.90 eV/atom. Relative to the
    /// end-members: NMC (1/3 each) -0.03; NC (Co 1/2, Ni 1/2) -0.01; NCM-rich-Mn (Co 1/4, Ni 1/4, Mn 1/2) -0.01.
    /// NMC lies on the segment Mn–NC (NMC = 1/3 LiMnO2 + 2/3 NC) and below it, so the facets are (Mn, Co, NMC),
    /// (Mn, Ni, NMC), (Co, NC, NMC), (NC, Ni, NMC).
    /// </summary>
    [Fact]
    public void Pseudo_ternary_by_hand()
    {
        Composition Mix(Rational co, Rational ni, Rational mn) =>
            Composition.FromAmounts(
                new[] { ("Li", Rational.One), ("Co", co), ("Ni", ni), ("Mn", mn), ("O", new Rational(2, 1)) }
                    .Where(a => !a.Item2.IsZero)
                    .ToArray());
        double FromElements(double co, double ni, double mn, double relative) => co * -1.80 + ni * -1.50 + mn * -1.90 + relative;

        Rational third = new(1, 3), half = new(1, 2), quarter = new(1, 4);
        PhaseEntry[] entries =
        [
            new("LCO", Composition.Parse("LiCoO2"), -1.80, EnergyBasis.FormationPerAtom),
            new("LNO", Composition.Parse("LiNiO2"), -1.50, EnergyBasis.FormationPerAtom),
            new("LMO", Composition.Parse("LiMnO2"), -1.90, EnergyBasis.FormationPerAtom),
            new("NMC", Mix(third, third, third), FromElements(1 / 3.0, 1 / 3.0, 1 / 3.0, -0.03), EnergyBasis.FormationPerAtom),
            new("NC", Mix(half, half, Rational.Zero), FromElements(0.5, 0.5, 0, -0.01), EnergyBasis.FormationPerAtom),
            new("NCM-Mn", Mix(quarter, quarter, half), FromElements(0.25, 0.25, 0.5, -0.01), EnergyBasis.FormationPerAtom),
        ];
        var basis = new EndMemberBasis(
            [Composition.Parse("LiCoO2"), Composition.Parse("LiNiO2"), Composition.Parse("LiMnO2")], ["LiCoO2", "LiNiO2", "LiMnO2"]);
        SystemHull hull = SystemHull.OverEndMembers(entries, basis);

        Assert.Equal(["LCO", "LMO", "LNO", "NC", "NMC"], hull.StablePhases.Select(p => p.Id));
        Assert.Equal(-0.03, hull.GetEntry("NMC").FormationEnergyFromEndMembersEvPerAtom!.Value, Tolerance);

        // NCM-Mn = 1/4 LiMnO2 + 3/4 NMC (it lies on the edge Mn–NMC): hull -0.75 * 0.03 = -0.0225 relative, so it lies
        // -0.01 + 0.0225 = 0.0125 eV/atom above; the reaction is 1/4 LMO + 3/4 NMC per formula unit.
        EntryStability mnRich = hull.GetEntry("NCM-Mn");
        Assert.Equal(0.0125, mnRich.EnergyAboveHullEvPerAtom, Tolerance);
        Assert.Equal(["LMO", "NMC"], mnRich.Decomposition.Products.Select(p => p.Phase.Id));
        Assert.Equal([quarter, new Rational(3, 4)], mnRich.Decomposition.Products.Select(p => p.ExactFormulaUnits!.Value));
        AssertBalancedExactly(mnRich.Decomposition);

        // Without NMC, the metastable NCM-Mn joins the hull: it is the midpoint of Mn–NC and lies below that segment
        // (-0.01 < -0.005). The centre lies on the same line, 2/3 of the way from Mn to NC, i.e. between NCM-Mn (1/2)
        // and NC (1), both at -0.01 relative: hull -0.01, and NMC's decomposition energy is -0.03 + 0.01 = -0.02.
        // (Using only the stable neighbours would give -0.03 + 2/3 * 0.01 = -0.0233: NCM-Mn must be taken along.)
        Assert.Equal(-0.02, hull.GetEntry("NMC").DecompositionEnergyEvPerAtom!.Value, Tolerance);
        // Without NC the Co–Ni edge is bare (0 relative): -0.01.
        Assert.Equal(-0.01, hull.GetEntry("NC").DecompositionEnergyEvPerAtom!.Value, Tolerance);
        foreach (string id in new[] { "NMC", "NC" })
        {
            Assert.Equal(hull.DecompositionEnergyByFullRebuild(id)!.Value, hull.GetEntry(id).DecompositionEnergyEvPerAtom!.Value, 1e-12);
        }

        Assert.Equal(
            ["LCO|LMO", "LCO|NC", "LCO|NMC", "LMO|LNO", "LMO|NMC", "LNO|NC", "LNO|NMC", "NC|NMC"],
            hull.TieLines.Select(t => $"{t.First.Id}|{t.Second.Id}"));

        // Input order does not matter.
        SystemHull shuffled = SystemHull.OverEndMembers(Shuffled(entries, seed: 9), basis);
        Assert.Equal(hull.TieLines.Select(t => t.ToString()), shuffled.TieLines.Select(t => t.ToString()));
        foreach (EntryStability expected in hull.Entries)
        {
            EntryStability actual = shuffled.GetEntry(expected.Id);
            Assert.Equal(expected.EnergyAboveHullEvPerAtom, actual.EnergyAboveHullEvPerAtom);
            Assert.Equal(expected.DecompositionEnergyEvPerAtom, actual.DecompositionEnergyEvPerAtom);
            Assert.Equal(expected.Decomposition.ToReactionString(), actual.Decomposition.ToReactionString());
        }

        // A candidate on the bare Ni–Mn edge at -0.005 relative would lower the hull.
        CandidateStability candidate = hull.Assess(Mix(Rational.Zero, half, half), FromElements(0, 0.5, 0.5, -0.005));
        Assert.True(candidate.IsBelowHull);
        Assert.Equal(-0.005, candidate.EnergyRelativeToHullEvPerAtom, Tolerance);
        Assert.Equal(["LMO", "LNO"], candidate.Decomposition.Products.Select(p => p.Phase.Id));
    }
}
