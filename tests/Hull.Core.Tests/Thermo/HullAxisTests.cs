using Hull.Core.Chemistry;
using Hull.Core.Tests.Geometry;
using Hull.Core.Tests.References;
using Hull.Core.Thermo;

namespace Hull.Core.Tests.Thermo;

/// <summary>
/// The hull built over an energy axis other than the formation energy: the closed hull through the axis route is the
/// formation-energy hull bit for bit; energies shifted by a linear function of composition leave energy above hull and
/// the stable set unchanged (common practice: the lower hull is invariant under adding an affine function of the
/// coordinates); a grand-potential hull over the closed elements agrees with an independent LP (SciPy's linprog with
/// HiGHS, Debian python3-scipy) on energies worked out in the test.
/// </summary>
public sealed class HullAxisTests
{
    // HiGHS is asked for 1e-10 feasibility (References/hull_lp.py); energies here are of order 1 eV.
    private const double LinearProgramToleranceEvPerAtom = 1e-9;

    /// <summary>A linear shift of about 1 eV/atom moves the last bits of energies near 1 eV/atom.</summary>
    private const double ShiftRoundingEvPerAtom = 1e-12;

    [Fact]
    public void Closed_hull_through_the_axis_is_bit_identical()
    {
        PhaseEntry[] entries = DecompositionEnergyReferenceTests.RandomQuaternary(seed: 11, compounds: 160);
        SystemHull direct = SystemHull.OverElements(entries);
        FormationEnergySet formation = FormationEnergies.Compute(entries);
        SystemHull onAxis = SystemHull.OnAxis(
            HullAxis.FormationEnergy,
            entries.Select((e, i) => new HullAxisEntry(e, formation.FormationEnergiesEvPerAtom[i], formation.FormationEnergiesEvPerAtom[i])).ToArray());

        Assert.Same(HullAxis.FormationEnergy, direct.Axis);
        Assert.Same(HullAxis.FormationEnergy, onAxis.Axis);
        Assert.Equal(direct.Components, onAxis.Components);
        Assert.Equal(direct.StablePhases.Select(p => p.Id), onAxis.StablePhases.Select(p => p.Id));
        for (int i = 0; i < entries.Length; i++)
        {
            EntryStability a = direct.Entries[i], b = onAxis.Entries[i];
            Assert.Equal(Bits(a.EnergyAboveHullEvPerAtom), Bits(b.EnergyAboveHullEvPerAtom));
            Assert.Equal(Bits(a.AxisEnergyEvPerAtom), Bits(b.AxisEnergyEvPerAtom));
            Assert.Equal(a.FormationEnergyEvPerAtom, b.FormationEnergyEvPerAtom);
            Assert.Equal(a.DecompositionEnergyEvPerAtom.HasValue, b.DecompositionEnergyEvPerAtom.HasValue);
            Assert.Equal(Bits(a.DecompositionEnergyEvPerAtom ?? 0), Bits(b.DecompositionEnergyEvPerAtom ?? 0));
            Assert.Equal(a.IsHullVertex, b.IsHullVertex);
            Assert.Equal(Bits(a.Decomposition.HullEnergyEvPerAtom), Bits(b.Decomposition.HullEnergyEvPerAtom));
            Assert.Equal(a.Decomposition.ToReactionString(), b.Decomposition.ToReactionString());
            Assert.Equal(a.Decomposition.Products.Select(p => Bits(p.AtomFraction)), b.Decomposition.Products.Select(p => Bits(p.AtomFraction)));
        }

        Assert.Equal(
            direct.Facets.Select(f => string.Join(",", f.ChemicalPotentialsEvPerAtom.Select(Bits))),
            onAxis.Facets.Select(f => string.Join(",", f.ChemicalPotentialsEvPerAtom.Select(Bits))));
        Assert.All(onAxis.Facets, f => Assert.Same(HullAxis.FormationEnergy, f.Axis));
    }

    [Fact]
    public void Linear_shift_of_energies_keeps_stability_and_agrees_with_scipy_lp()
    {
        PhaseEntry[] entries = DecompositionEnergyReferenceTests.RandomQuaternary(seed: 12, compounds: 160);
        SystemHull closed = SystemHull.OverElements(entries);
        string[] components = closed.Components.ToArray();
        // Per-atom shift Σ_k a_k x_k: what moving the elemental references does to every energy (eV/atom).
        double[] slope = [0.37, -1.25, 0.8, -0.05];
        HullAxis axis = HullAxis.FreeEnergy(900);
        double[] shifted = entries
            .Select(e => e.EnergyEvPerAtom + components.Select((c, k) => slope[k] * e.Composition.AtomicFraction(c)).Sum())
            .ToArray();
        SystemHull hull = SystemHull.OnAxis(axis, entries.Select((e, i) => new HullAxisEntry(e, shifted[i])).ToArray());

        Assert.Same(axis, hull.Axis);
        Assert.Equal(closed.StablePhases.Select(p => p.Id), hull.StablePhases.Select(p => p.Id));
        for (int i = 0; i < entries.Length; i++)
        {
            EntryStability shiftedEntry = hull.Entries[i];
            Assert.Same(axis, shiftedEntry.Axis);
            Assert.Null(shiftedEntry.FormationEnergyEvPerAtom);
            Assert.Equal(closed.Entries[i].EnergyAboveHullEvPerAtom, shiftedEntry.EnergyAboveHullEvPerAtom, ShiftRoundingEvPerAtom);
            Assert.Equal(closed.Entries[i].IsHullVertex, shiftedEntry.IsHullVertex);
        }

        // The LP reference on the shifted energies, at every entry's composition (energy above hull) and, for every
        // entry on the hull, without the points of its reduced composition (decomposition energy).
        long[][] amounts = entries.Select(e => components.Select(c => checked((long)e.Composition.AmountOf(c).Numerator)).ToArray()).ToArray();
        double[][] fractions = entries.Select(e => components.Select(c => e.Composition.AtomicFraction(c)).ToArray()).ToArray();
        EntryStability[] onHull = hull.Entries.Where(e => e.DecompositionEnergyEvPerAtom is not null).ToArray();
        Assert.True(onHull.Length >= 8, $"only {onHull.Length} compounds on the hull; the check needs a richer hull");
        var queries = fractions.ToList();
        var excluded = entries.Select(_ => Array.Empty<int>()).ToList();
        foreach (EntryStability entry in onHull)
        {
            queries.Add(fractions[entry.RowIndex]);
            excluded.Add(Enumerable.Range(0, entries.Length).Where(j => entries[j].Composition.Reduced == entry.Composition.Reduced).ToArray());
        }

        IReadOnlyList<HullLpAnswer> lp = ScipyLpRunner.Solve(new HullLpProblem(amounts, shifted, queries, excluded));
        for (int i = 0; i < entries.Length; i++)
        {
            Assert.Equal(Math.Max(0, shifted[i] - lp[i].HullEnergyEvPerAtom), hull.Entries[i].EnergyAboveHullEvPerAtom, LinearProgramToleranceEvPerAtom);
            Assert.Equal(lp[i].HullEnergyEvPerAtom, hull.Entries[i].Decomposition.HullEnergyEvPerAtom, LinearProgramToleranceEvPerAtom);
        }

        for (int k = 0; k < onHull.Length; k++)
        {
            double expected = Math.Min(0, shifted[onHull[k].RowIndex] - lp[entries.Length + k].HullEnergyEvPerAtom);
            Assert.Equal(expected, onHull[k].DecompositionEnergyEvPerAtom!.Value, LinearProgramToleranceEvPerAtom);
        }
    }

    [Fact]
    public void Grand_potential_hull_over_closed_elements_agrees_with_scipy_lp()
    {
        PhaseEntry[] entries = DecompositionEnergyReferenceTests.RandomQuaternary(seed: 13, compounds: 160);
        const double oxygenEvPerAtom = -1.1;
        HullAxis axis = HullAxis.GrandPotential([KeyValuePair.Create("O", oxygenEvPerAtom)]);
        Assert.Equal(AtomNormalisation.PerClosedElementAtom, axis.Normalisation);
        Assert.Equal("eV per closed-element atom", axis.Unit);
        SystemHull hull = SystemHull.OnAxis(axis, GrandPotentialEntries.Of(entries, axis));
        Assert.Equal(["Fe", "Li", "Mn"], hull.Components);

        // Φ per closed atom, worked out here from the definition (common practice): (N·e_f − n_O·μ_O) / N_closed.
        string[] closed = ["Fe", "Li", "Mn"];
        PhaseEntry[] placed = entries.Where(e => closed.Any(c => e.Composition.Elements.Contains(c))).ToArray();
        double[] phi = placed.Select(e =>
        {
            double atoms = e.Composition.AtomsPerFormulaUnit.ToDouble();
            double oxygen = e.Composition.AmountOf("O").ToDouble();
            return (e.EnergyEvPerAtom * atoms - oxygen * oxygenEvPerAtom) / (atoms - oxygen);
        }).ToArray();
        Assert.Equal(placed.Select(e => e.Id), hull.Entries.Select(e => e.Id));

        long[][] amounts = placed.Select(e => ClosedAmounts(e.Composition, closed)).ToArray();
        double[][] queries = amounts.Select(a => a.Select(v => (double)v / a.Sum()).ToArray()).ToArray();
        IReadOnlyList<HullLpAnswer> lp = ScipyLpRunner.Solve(new HullLpProblem(amounts, phi, queries));
        int onHull = 0;
        for (int i = 0; i < placed.Length; i++)
        {
            EntryStability entry = hull.Entries[i];
            Assert.Same(axis, entry.Axis);
            Assert.Equal(phi[i], entry.AxisEnergyEvPerAtom, ShiftRoundingEvPerAtom);
            Assert.Equal(Math.Max(0, phi[i] - lp[i].HullEnergyEvPerAtom), entry.EnergyAboveHullEvPerAtom, LinearProgramToleranceEvPerAtom);
            Assert.Equal(queries[i], entry.ComponentAtomFractions.ToArray(), (x, y) => Math.Abs(x - y) <= HullAgreement.FractionTolerance);
            onHull += entry.IsOnHull ? 1 : 0;
        }

        Assert.True(onHull >= 5, $"only {onHull} entries on the grand-potential hull; the check needs a richer hull");
        // Exchange with the reservoir: the reaction balances the closed elements only.
        Decomposition at = hull.DecompositionAt(Composition.Parse("LiMnO2"));
        Assert.Same(axis, at.Axis);
        Assert.Equal(1.0, at.Products.Sum(p => p.AtomFraction), 12);
    }

    [Fact]
    public void Axis_input_is_checked_and_named()
    {
        PhaseEntry[] entries = DecompositionEnergyReferenceTests.RandomQuaternary(seed: 14, compounds: 20);
        HullAxis axis = HullAxis.GrandPotential([KeyValuePair.Create("O", -2.0)]);
        var onlyOxygen = new HullAxisEntry(entries.Single(e => e.Id == "O"), 0.0);
        var error = Assert.Throws<ThermoInputException>(() => SystemHull.OnAxis(axis, [onlyOxygen, new HullAxisEntry(entries[0], 0.0)]));
        Assert.Contains("open elements only", error.Message);
        Assert.Equal("O", error.EntryId);

        error = Assert.Throws<ThermoInputException>(() => SystemHull.OnAxis(axis, [new HullAxisEntry(entries[0], 0.0)], elements: ["Fe", "O"]));
        Assert.Contains("Element O is open", error.Message);

        error = Assert.Throws<ThermoInputException>(() => HullAxis.GrandPotential([KeyValuePair.Create("O", double.NaN)]));
        Assert.Equal("O", error.Element);
        Assert.Throws<ThermoInputException>(() => HullAxis.GrandPotential([KeyValuePair.Create("Xx", 0.0)]));
        Assert.Throws<ThermoInputException>(() => HullAxis.GrandPotential([]));
        Assert.Throws<ThermoInputException>(() => HullAxis.FreeEnergy(-1));
        Assert.Throws<ThermoInputException>(() => HullAxis.SampledEnergy(-1));
        error = Assert.Throws<ThermoInputException>(() => new HullAxisEntry(entries[1], double.PositiveInfinity));
        Assert.Equal(entries[1].Id, error.EntryId);
        error = Assert.Throws<ThermoInputException>(() => GrandPotentialEntries.Of(entries, HullAxis.SampledEnergy(3)));
        Assert.Contains("sampled formation energy #3", error.Message);

        Assert.Equal("formation energy [eV/atom]", HullAxis.FormationEnergy.ToString());
        Assert.Equal("grand potential (O open at -2 eV) [eV per closed-element atom]", axis.ToString());
        Assert.Equal(900, HullAxis.FreeEnergy(900).TemperatureK);
        Assert.Equal(7, HullAxis.SampledEnergy(7).SampleIndex);
    }

    private static long[] ClosedAmounts(Composition composition, string[] closed)
    {
        Rational[] amounts = closed.Select(composition.AmountOf).ToArray();
        Assert.All(amounts, a => Assert.True(a.IsInteger, $"{composition.Formula}: the test data has integer amounts"));
        return amounts.Select(a => a.Numerator).ToArray();
    }

    private static long Bits(double value) => BitConverter.DoubleToInt64Bits(value);
}
