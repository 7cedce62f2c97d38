using Hull.Core.Chemistry;
using Hull.Core.Thermo;
using Hull.Core.Thermo.Corrections;
using static Hull.Core.Tests.Thermo.ThermoTestData;

namespace Hull.Core.Tests.Thermo.Corrections;

/// <summary>Energy corrections applied before hulling: fitted references, species shifts, method rules, refusals.</summary>
public sealed class CorrectionSetTests
{
    // 1 eV per particle = 96.4853 kJ/mol (CODATA 2018 e N_A / 1000).
    private const double KilojoulesPerMolPerEv = 96.4853;

    // The fitted scale of the copper case (eV/atom); any values would do, the check is relative to them.
    private const double FittedCu = -4.0;
    private const double FittedO = -4.9;

    private static CorrectionSet Set(
        IReadOnlyList<FittedElementReference>? fitted = null, IReadOnlyList<SpeciesShift>? shifts = null,
        IReadOnlyList<MethodRule>? rules = null, string baseMethod = "gga") =>
        new("test-set", 1, baseMethod, fitted ?? [], shifts ?? [], rules ?? []);

    private static string?[] Untagged(int count) => new string?[count];

    // NBS Tables of Chemical Thermodynamic Properties (1982), ΔfH°(298.15 K): Cu2O(s) −168.6 kJ/mol, CuO(s)
    // −157.3 kJ/mol (from memory; the same values as the Ellingham checks). The compounds' total energies are those
    // formation enthalpies on the fitted scale (E = ΔfH° + Σ n μ_fit), and the computed elements miss the fitted
    // values: Cu by −0.2 eV/atom, O2 by −0.3 eV/atom. Raw, Cu2O lies 0.028 eV/atom above the Cu–CuO tie-line; with
    // the fitted references the formation energies are the handbook's, where Cu2O is 0.039 eV/atom below it (hand-
    // worked: −168.6/96.4853/3 = −0.5825 against (2/3)(−157.3/96.4853/2) = −0.5434), so the stable set regains Cu2O.
    private static PhaseEntry[] CopperOxygen() =>
    [
        Entry("Cu", "Cu", FittedCu - 0.2, EnergyBasis.TotalPerAtom),
        Entry("O2", "O2", 2 * (FittedO - 0.3), EnergyBasis.TotalPerFormulaUnit),
        Entry("Cu2O", "Cu2O", -168.6 / KilojoulesPerMolPerEv + 2 * FittedCu + FittedO, EnergyBasis.TotalPerFormulaUnit),
        Entry("CuO", "CuO", -157.3 / KilojoulesPerMolPerEv + FittedCu + FittedO, EnergyBasis.TotalPerFormulaUnit),
    ];

    private static string[] StableIds(SystemHull hull) =>
        hull.StablePhases.Where(p => !p.IsSynthetic).Select(p => p.Id).Order(StringComparer.Ordinal).ToArray();

    [Fact]
    public void Fitted_references_restore_the_handbook_stable_set_of_copper_oxides()
    {
        PhaseEntry[] entries = CopperOxygen();
        SystemHull raw = SystemHull.OverElements(entries);
        Assert.Equal(["Cu", "CuO", "O2"], StableIds(raw));

        CorrectionOutcome outcome = EnergyCorrections.Apply(entries, Untagged(entries.Length),
            Set(fitted: [new FittedElementReference("Cu", FittedCu), new FittedElementReference("O", FittedO)]));
        SystemHull corrected = SystemHull.OnAxis(outcome.Axis, outcome.OnAxis());
        Assert.Equal(["Cu", "Cu2O", "CuO", "O2"], StableIds(corrected));
        Assert.Equal(HullAxisQuantity.CorrectedFormationEnergy, corrected.Axis.Quantity);
        Assert.Contains("test-set v1", corrected.Axis.DisplayName, StringComparison.Ordinal);

        // The formation energies are the handbook's, and Cu2O's decomposition energy its margin below the tie-line.
        Assert.Equal(-168.6 / KilojoulesPerMolPerEv / 3, corrected.GetEntry("Cu2O").AxisEnergyEvPerAtom, 12);
        Assert.Equal(-157.3 / KilojoulesPerMolPerEv / 2, corrected.GetEntry("CuO").AxisEnergyEvPerAtom, 12);
        double margin = 2.0 / 3 * (-157.3 / KilojoulesPerMolPerEv / 2) - (-168.6 / KilojoulesPerMolPerEv / 3);
        Assert.Equal(-margin, corrected.GetEntry("Cu2O").DecompositionEnergyEvPerAtom!.Value, 12);
        Assert.Equal(0.2, outcome.Entries.Single(e => e.Raw.Id == "Cu").ReferenceShiftEvPerAtom, 12);
        Assert.Equal(2, outcome.ChangedCount);
    }

    // Two methods in Li–Co, worked by hand (eV). Base method "gga": Li −1.90/atom, Co −7.10/atom, LiCo −4.80/atom
    // (formation −4.80 − (−1.90 − 7.10)/2 = −0.30). Method "hybrid": LiCo −5.50/atom, LiCo3 −26.40 per formula unit
    // (4 atoms). Aligning on LiCo gives the hybrid shift −4.80 − (−5.50) = +0.70 eV/atom, so LiCo3 becomes
    // −26.40 + 4 × 0.70 = −23.60 per formula unit, −5.90/atom, formation −5.90 − (0.25 × −1.90 + 0.75 × −7.10) = −0.10.
    // The LiCo–Co tie-line at x_Co = 0.75 is −0.30/2 = −0.15, so LiCo3 lies 0.05 eV/atom above it. Mixed raw, LiCo3's
    // formation energy would be −6.60 + 5.80 = −0.80, the lowest point of the binary.
    [Fact]
    public void A_reference_compound_aligns_two_methods_as_worked_by_hand()
    {
        PhaseEntry[] entries =
        [
            Entry("Li", "Li", -1.90, EnergyBasis.TotalPerAtom),
            Entry("Co", "Co", -7.10, EnergyBasis.TotalPerAtom),
            Entry("LiCo-gga", "LiCo", -4.80, EnergyBasis.TotalPerAtom),
            Entry("LiCo-hybrid", "LiCo", -5.50, EnergyBasis.TotalPerAtom),
            Entry("LiCo3-hybrid", "LiCo3", -26.40, EnergyBasis.TotalPerFormulaUnit),
        ];
        string?[] methods = ["gga", "gga", "gga", "hybrid", "hybrid"];

        Assert.Equal(-0.80, SystemHull.OverElements(entries).GetEntry("LiCo3-hybrid").AxisEnergyEvPerAtom, 12);

        CorrectionOutcome outcome = EnergyCorrections.Apply(entries, methods,
            Set(rules: [MethodRule.AlignOn("hybrid", Composition.Parse("LiCo"))]));
        CorrectedEntry licO3 = outcome.Entries.Single(e => e.Raw.Id == "LiCo3-hybrid");
        Assert.Equal(0.70, licO3.MethodShiftEvPerAtom, 12);
        Assert.Equal(-23.60, licO3.Corrected.EnergyEv, 12);

        SystemHull hull = SystemHull.OnAxis(outcome.Axis, outcome.OnAxis());
        EntryStability stability = hull.GetEntry("LiCo3-hybrid");
        Assert.Equal(-0.10, stability.AxisEnergyEvPerAtom, 12);
        Assert.Equal(0.05, stability.EnergyAboveHullEvPerAtom, 12);
        Assert.Equal(["Co", "LiCo"], stability.Decomposition.Products.Select(p => p.Phase.Composition.Formula).Order(StringComparer.Ordinal));
        Assert.Equal(-0.30, hull.GetEntry("LiCo-hybrid").AxisEnergyEvPerAtom, 12);
    }

    [Fact]
    public void A_stated_method_shift_and_an_oxide_species_shift_move_only_their_entries()
    {
        PhaseEntry[] entries =
        [
            Entry("Cu", "Cu", -4.0, EnergyBasis.TotalPerAtom),
            Entry("O2", "O2", -9.8, EnergyBasis.TotalPerFormulaUnit),
            Entry("Cu2O", "Cu2O", -15.0, EnergyBasis.TotalPerFormulaUnit),
            Entry("CO2", "CO2", -23.0, EnergyBasis.TotalPerFormulaUnit),
            Entry("C", "C", -9.2, EnergyBasis.TotalPerAtom),
        ];
        CorrectionOutcome outcome = EnergyCorrections.Apply(entries, ["gga", null, "gga+u", null, null],
            Set(shifts: [new SpeciesShift("O", SpeciesClass.WithMetal, -0.6)], rules: [MethodRule.Shift("gga+u", 0.12)]));
        CorrectedEntry cu2o = outcome.Entries.Single(e => e.Raw.Id == "Cu2O");
        // Cu2O: one O among three atoms takes −0.6 (−0.2 per atom); its method adds 0.12 per atom: 3 × (−0.08).
        Assert.Equal(-0.2, cu2o.SpeciesShiftEvPerAtom, 12);
        Assert.Equal(-15.0 + 3 * (0.12 - 0.2), cu2o.Corrected.EnergyEv, 12);
        // CO2 holds no metal and O2 is O's own element: neither moves, to the bit.
        Assert.Equal(BitConverter.DoubleToInt64Bits(-23.0), BitConverter.DoubleToInt64Bits(outcome.Entries.Single(e => e.Raw.Id == "CO2").Corrected.EnergyEv));
        Assert.False(outcome.Entries.Single(e => e.Raw.Id == "O2").IsChanged);
        Assert.Equal(1, outcome.ChangedCount);
    }

    [Fact]
    public void An_empty_set_reproduces_the_raw_hull_bit_for_bit()
    {
        PhaseEntry[] entries = CopperOxygen();
        SystemHull raw = SystemHull.OverElements(entries);
        CorrectionOutcome outcome = EnergyCorrections.Apply(entries, Untagged(entries.Length), Set());
        Assert.True(outcome.Set.IsEmpty);
        SystemHull corrected = SystemHull.OnAxis(outcome.Axis, outcome.OnAxis());
        foreach (PhaseEntry entry in entries)
        {
            Assert.Same(entry, outcome.Entries.Single(e => e.Raw.Id == entry.Id).Corrected);
            EntryStability a = raw.GetEntry(entry.Id), b = corrected.GetEntry(entry.Id);
            Assert.Equal(BitConverter.DoubleToInt64Bits(a.AxisEnergyEvPerAtom), BitConverter.DoubleToInt64Bits(b.AxisEnergyEvPerAtom));
            Assert.Equal(BitConverter.DoubleToInt64Bits(a.EnergyAboveHullEvPerAtom), BitConverter.DoubleToInt64Bits(b.EnergyAboveHullEvPerAtom));
            Assert.Equal(a.IsHullVertex, b.IsHullVertex);
        }
    }

    [Fact]
    public void A_set_that_does_not_fit_the_entries_is_refused_naming_what()
    {
        PhaseEntry[] entries = CopperOxygen();
        var absent = Assert.Throws<ThermoInputException>(() => EnergyCorrections.Apply(entries, Untagged(entries.Length),
            Set(shifts: [new SpeciesShift("F", SpeciesClass.WithMetal, -0.4)])));
        Assert.Equal("F", absent.Element);
        Assert.Contains("no entry of the dataset holds", absent.Message, StringComparison.Ordinal);

        var unknownMethod = Assert.Throws<ThermoInputException>(() => EnergyCorrections.Apply(entries, Untagged(entries.Length),
            Set(rules: [MethodRule.Shift("r2scan", 0.1)])));
        Assert.Contains("method 'r2scan'", unknownMethod.Message, StringComparison.Ordinal);

        var noRule = Assert.Throws<ThermoInputException>(() => EnergyCorrections.Apply(entries, [null, null, "hybrid", null], Set()));
        Assert.Equal("Cu2O", noRule.EntryId);
        Assert.Contains("'hybrid'", noRule.Message, StringComparison.Ordinal);

        var noElemental = Assert.Throws<ThermoInputException>(() => EnergyCorrections.Apply(entries[2..], Untagged(2),
            Set(fitted: [new FittedElementReference("Cu", FittedCu)])));
        Assert.Equal("Cu", noElemental.Element);
    }

    [Fact]
    public void Non_finite_values_are_refused_naming_the_element_or_method()
    {
        Assert.Equal("O", Assert.Throws<ThermoInputException>(() => new FittedElementReference("O", double.NaN)).Element);
        Assert.Equal("O", Assert.Throws<ThermoInputException>(() => new SpeciesShift("O", SpeciesClass.InCompound, double.PositiveInfinity)).Element);
        Assert.Contains("'hybrid'", Assert.Throws<ThermoInputException>(() => MethodRule.Shift("hybrid", double.NegativeInfinity)).Message, StringComparison.Ordinal);
        Assert.Throws<ThermoInputException>(() => new FittedElementReference("Qq", -1.0));
        Assert.Throws<ThermoInputException>(() => Set(fitted: [new FittedElementReference("O", -4.9), new FittedElementReference("O", -5.0)]));
        Assert.Throws<ThermoInputException>(() => Set(rules: [MethodRule.Shift("gga", 0.1)]));
    }
}
