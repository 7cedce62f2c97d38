using Hull.Core.Chemistry;
using Hull.Core.Tests.References;
using Hull.Core.Thermo;
using Xunit;

namespace Hull.Core.Tests.Thermo;

public sealed class OpenElementHullTests
{
    // HiGHS solves to 1e-10 feasibility; the issue asks for agreement to 1e-9 eV per closed atom.
    private const double LinearProgramToleranceEvPerAtom = 1e-9;

    /// <summary>
    /// Hand-worked Li-Co-O with O open (formation energies per formula unit: Li2O -6.0, CoO -2.4, LiCoO2 -7.2,
    /// Co3O4 -9.1 eV; the elements at 0). φ = (E_f − n_O Δμ_O) / N_closed, on the Li-Co line (x = Co fraction):
    /// at Δμ_O = −1: Li2O (x 0) −2.5, LiCoO2 (x ½) −2.6, CoO (x 1) −1.4, Co3O4 (x 1) −1.7, Li and Co 0. The Li corner
    /// is Li2O, the Co corner Co3O4; the chord at ½ is −2.1, so LiCoO2 is stable; CoO lies 0.3 above, Li metal 2.5,
    /// Co metal 1.7. At Δμ_O = −3: Li2O −1.5, LiCoO2 −0.6, CoO 0.6, Co3O4 0.9667, Co 0: the Co corner is the metal,
    /// the chord at ½ is −0.75, so LiCoO2 lies 0.15 above and turns into ½ Li2O + Co (its O to the reservoir).
    /// </summary>
    [Fact]
    public void Hand_worked_ternary_at_two_oxygen_potentials()
    {
        PhaseEntry[] entries =
        [
            Formation("Li", "Li", 0), Formation("Co", "Co", 0), Formation("O", "O", 0),
            Formation("Li2O", "Li2O", -6.0), Formation("CoO", "CoO", -2.4),
            Formation("LiCoO2", "LiCoO2", -7.2), Formation("Co3O4", "Co3O4", -9.1),
        ];
        SystemHull closed = SystemHull.OverElements(entries);

        OpenElementHull rich = OpenElementHull.Open(closed, [new ReservoirPotential("O", -1.0)]);
        Assert.Equal(["O"], rich.ExcludedEntryIds);
        Assert.Equal(["Co", "Li"], rich.Hull.Components);
        Assert.Equal("eV per closed-element atom", rich.Hull.Axis.Unit);
        Assert.Equal(["Co3O4", "Li2O", "LiCoO2"], rich.Hull.StablePhases.Select(p => p.Id));
        Assert.Equal(0.3, rich.Hull.GetEntry("CoO").EnergyAboveHullEvPerAtom, 12);
        Assert.Equal(2.5, rich.Hull.GetEntry("Li").EnergyAboveHullEvPerAtom, 12);
        Assert.Equal(1.7, rich.Hull.GetEntry("Co").EnergyAboveHullEvPerAtom, 12);
        Assert.Equal(-2.6, rich.Hull.GetEntry("LiCoO2").AxisEnergyEvPerAtom, 12);

        OpenElementHull lean = OpenElementHull.Open(closed, [new ReservoirPotential("O", -3.0)]);
        Assert.Equal(["Co", "Li2O"], lean.Hull.StablePhases.Select(p => p.Id));
        EntryStability licoo2 = lean.Hull.GetEntry("LiCoO2");
        Assert.Equal(0.15, licoo2.EnergyAboveHullEvPerAtom, 12);
        Assert.Equal("LiCoO2 -> Co + 1/2 Li2O", licoo2.Decomposition.ToReactionString());
        Assert.Equal(0.6, lean.Hull.GetEntry("CoO").EnergyAboveHullEvPerAtom, 12);
        Assert.Equal(2.9 / 3.0, lean.Hull.GetEntry("Co3O4").EnergyAboveHullEvPerAtom, 12);
    }

    [Fact]
    public void Very_lean_open_element_leaves_the_closed_hull_of_the_other_elements()
    {
        PhaseEntry[] entries = DecompositionEnergyReferenceTests.RandomQuaternary(seed: 31, compounds: 160);
        SystemHull closed = SystemHull.OverElements(entries);
        // Below min_j ΔH_f,j / n_O,j (per formula unit) every O-bearing phase has φ > 0, above the O-free hull
        // (which is ≤ 0): common practice, from the definition of φ.
        double bound = closed.Entries
            .Where(e => e.Composition.Contains("O") && !e.Composition.IsSingleElement)
            .Min(e => e.FormationEnergyEvPerAtom!.Value * e.Composition.AtomsPerFormulaUnit.ToDouble() / e.Composition.AmountOf("O").ToDouble());
        OpenElementHull open = OpenElementHull.Open(closed, [new ReservoirPotential("O", bound - 0.01)]);
        SystemHull oxygenFree = SystemHull.OverElements(entries.Where(e => !e.Composition.Contains("O")).ToArray());

        Assert.Equal(oxygenFree.StablePhases.Select(p => p.Id), open.Hull.StablePhases.Select(p => p.Id));
        foreach (EntryStability entry in oxygenFree.Entries)
        {
            Assert.Equal(entry.EnergyAboveHullEvPerAtom, open.Hull.GetEntry(entry.Id).EnergyAboveHullEvPerAtom, 12);
        }

        Assert.Equal(
            oxygenFree.Facets.Select(f => string.Join(",", f.Phases.Select(p => p.Id))).Order(StringComparer.Ordinal),
            open.Hull.Facets.Select(f => string.Join(",", f.Phases.Select(p => p.Id))).Order(StringComparer.Ordinal));
    }

    [Theory]
    [InlineData(41)]
    [InlineData(42)]
    [InlineData(43)]
    public void Open_hull_agrees_with_scipy_computing_phi_from_raw_energies(int seed)
    {
        var random = new Random(seed);
        // Total energies per formula unit on an arbitrary scale with explicit references (random test data).
        var references = new Dictionary<string, double> { ["Fe"] = -8.3, ["Li"] = -1.9, ["Mn"] = -9.0, ["O"] = -4.9 };
        PhaseEntry[] formation = DecompositionEnergyReferenceTests.RandomQuaternary(seed, compounds: 120);
        PhaseEntry[] totals = formation.Select(e =>
        {
            double perUnit = (e.EnergyEv * e.Composition.AtomsPerFormulaUnit.ToDouble())
                + e.Composition.Elements.Sum(s => e.Composition.AmountOf(s).ToDouble() * references[s]);
            return new PhaseEntry(e.Id, e.Composition, perUnit, EnergyBasis.TotalPerFormulaUnit);
        }).ToArray();
        SystemHull closed = SystemHull.OverElements(totals, new ElementalReferences(references));

        string open = random.Next(2) == 0 ? "O" : "Li";
        double delta = -3.0 * random.NextDouble();
        // Half the time the caller gives the absolute μ, on the scale of the total energies.
        ReservoirPotential potential = random.Next(2) == 0
            ? new ReservoirPotential(open, delta)
            : new ReservoirPotential(open, references[open] + delta, PotentialScale.Absolute);
        OpenElementHull hull = OpenElementHull.Open(closed, [potential]);

        EntryStability[] placed = [.. hull.Hull.Entries];
        OpenHullLpRunner.Answer lp = OpenHullLpRunner.Solve(
            ["Fe", "Li", "Mn", "O"], new Dictionary<string, double> { [open] = delta }, references, totals,
            placed.Select(e => e.Composition).ToArray());
        double?[] phiById = totals.Select((e, i) => lp.PhiEvPerClosedAtom[i]).ToArray();
        Assert.Equal(totals.Where((e, i) => phiById[i] is null).Select(e => e.Id), hull.ExcludedEntryIds);
        for (int i = 0; i < placed.Length; i++)
        {
            int row = Array.FindIndex(totals, e => e.Id == placed[i].Id);
            double phi = phiById[row]!.Value;
            Assert.Equal(phi, placed[i].AxisEnergyEvPerAtom, 1e-9);
            Assert.Equal(Math.Max(0, phi - lp.HullEnergyEvPerClosedAtom[i]), placed[i].EnergyAboveHullEvPerAtom, LinearProgramToleranceEvPerAtom);
            Assert.Equal(lp.HullEnergyEvPerClosedAtom[i], placed[i].Decomposition.HullEnergyEvPerAtom, LinearProgramToleranceEvPerAtom);
        }

        Assert.True(hull.Hull.StablePhases.Count >= 4, "the check needs a richer open hull");
    }

    /// <summary>
    /// The cell 2 Li + ½ O2 → Li2O. NIST-JANAF Thermochemical Tables, 4th ed. (1998), Li2O(cr): ΔfG°(298.15 K) =
    /// −561.2 kJ/mol (from memory), so E = −ΔfG°/(2F) ≈ 2.91 V. With O open at Δμ_O = 0, Li is the only closed
    /// element: the one-component hull's Li potential is φ(Li2O) = ΔfG°/2 per Li, and V = −μ_Li/1.
    /// </summary>
    [Fact]
    public void Lithium_oxide_cell_voltage_from_the_oxygen_open_hull()
    {
        const double janafGibbsKilojoulesPerMol = -561.2;
        double perFormulaUnitEv = janafGibbsKilojoulesPerMol / Core.Thermo.Gases.PhysicalConstants.KilojoulesPerMolPerEv;
        PhaseEntry[] entries = [Formation("Li", "Li", 0), Formation("O", "O", 0), Formation("Li2O", "Li2O", perFormulaUnitEv)];
        OpenElementHull open = OpenElementHull.Open(SystemHull.OverElements(entries), [new ReservoirPotential("O", 0.0)]);
        Assert.Equal(["Li"], open.Hull.Components);
        Assert.Equal(["Li2O"], open.Hull.StablePhases.Select(p => p.Id));
        double muLi = open.Hull.ChemicalPotentialsEvPerAtomAt(Composition.Parse("Li"))[0];
        double volts = Core.Windows.IonVoltage.VoltsAgainstMetal(muLi, 1);
        Assert.Equal(2.91, volts, 0.005); // the cell's textbook value
    }

    [Fact]
    public void Bad_open_elements_are_refused_naming_the_element()
    {
        PhaseEntry[] entries = [Formation("Li", "Li", 0), Formation("O", "O", 0), Formation("Li2O", "Li2O", -6.0)];
        SystemHull closed = SystemHull.OverElements(entries);
        var error = Assert.Throws<ThermoInputException>(() => OpenElementHull.Open(closed, [new ReservoirPotential("F", -1)]));
        Assert.Equal("F", error.Element);
        Assert.Contains("not an element of the chemical system Li-O", error.Message);

        error = Assert.Throws<ThermoInputException>(() => OpenElementHull.Open(closed, [new ReservoirPotential("O", 0.2)]));
        Assert.Contains("above its reference", error.Message);
        Assert.Equal(0.2, OpenElementHull.Open(closed, [new ReservoirPotential("O", 0.2)], allowAboveReference: true).Hull.Axis.OpenElements[0].ChemicalPotentialEvPerAtom);

        error = Assert.Throws<ThermoInputException>(() => OpenElementHull.Open(closed, [new ReservoirPotential("O", -5, PotentialScale.Absolute)]));
        Assert.Contains("total-energy reference", error.Message);

        error = Assert.Throws<ThermoInputException>(() => OpenElementHull.Open(closed, [new ReservoirPotential("O", -1), new ReservoirPotential("Li", -1)]));
        Assert.Contains("Every element of Li-O is open", error.Message);
        Assert.Throws<ThermoInputException>(() => OpenElementHull.Open(closed, [new ReservoirPotential("O", -1), new ReservoirPotential("O", -2)]));
        Assert.Throws<ThermoInputException>(() => OpenElementHull.Open(closed, [new ReservoirPotential("O", double.NaN)]));
        Assert.Throws<ThermoInputException>(() => OpenElementHull.Open(closed, []));
    }

    internal static PhaseEntry Formation(string id, string formula, double evPerFormulaUnit) =>
        new(id, Composition.Parse(formula), evPerFormulaUnit, EnergyBasis.FormationPerFormulaUnit);
}
