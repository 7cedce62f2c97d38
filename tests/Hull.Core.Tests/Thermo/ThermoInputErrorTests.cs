using Hull.Core.Chemistry;
using Hull.Core.Thermo;
using static Hull.Core.Tests.Thermo.ThermoTestData;

namespace Hull.Core.Tests.Thermo;

/// <summary>Every bad input gets a ThermoInputException that names the entry, its row and the element concerned.</summary>
public sealed class ThermoInputErrorTests
{
    [Theory]
    [InlineData("")]
    [InlineData("   ")]
    public void Entry_without_id(string id)
    {
        var e = Assert.Throws<ThermoInputException>(() => Entry(id, "Fe", -8.0, EnergyBasis.TotalPerAtom));
        Assert.Contains("non-empty id", e.Message);
    }

    [Theory]
    [InlineData(double.NaN)]
    [InlineData(double.PositiveInfinity)]
    [InlineData(double.NegativeInfinity)]
    public void Entry_with_non_finite_energy(double energy)
    {
        var e = Assert.Throws<ThermoInputException>(() => Entry("bad-1", "Fe2O3", energy, EnergyBasis.TotalPerFormulaUnit));
        Assert.Equal("bad-1", e.EntryId);
        Assert.Contains("'bad-1'", e.Message);
        Assert.Contains("non-finite energy", e.Message);
    }

    [Fact]
    public void Entry_without_composition_or_with_unknown_basis()
    {
        var missing = Assert.Throws<ThermoInputException>(() => new PhaseEntry("x1", null!, 0.0, EnergyBasis.FormationPerAtom));
        Assert.Contains("'x1' has no composition", missing.Message);
        var basis = Assert.Throws<ThermoInputException>(() => new PhaseEntry("x2", Composition.Parse("Fe"), 0.0, (EnergyBasis)7));
        Assert.Contains("'x2' has an unknown energy basis (7)", basis.Message);
    }

    [Fact]
    public void Null_row_and_repeated_id_name_their_rows()
    {
        PhaseEntry fe = Formation("Fe", "Fe", 0.0);
        var nullRow = Assert.Throws<ThermoInputException>(() => FormationEnergies.Compute([fe, null!]));
        Assert.Equal(1, nullRow.RowIndex);
        Assert.Contains("Row 1 has no entry", nullRow.Message);

        var repeated = Assert.Throws<ThermoInputException>(() => SystemHull.OverElements([fe, Formation("O", "O2", 0.0), Formation("Fe", "FeO", -1.0)]));
        Assert.Equal("Fe", repeated.EntryId);
        Assert.Equal(2, repeated.RowIndex);
        Assert.Contains("'Fe' appears twice (rows 0 and 2)", repeated.Message);
    }

    [Fact]
    public void Missing_reference_names_the_element_and_the_entries_needing_it()
    {
        PhaseEntry[] entries =
        [
            Entry("Fe", "Fe", -8.3, EnergyBasis.TotalPerAtom),
            Entry("hem", "Fe2O3", -38.0, EnergyBasis.TotalPerFormulaUnit),
            Entry("mag", "Fe3O4", -52.0, EnergyBasis.TotalPerFormulaUnit),
        ];
        var e = Assert.Throws<ThermoInputException>(() => SystemHull.OverElements(entries));
        Assert.Equal("O", e.Element);
        Assert.Equal("hem", e.EntryId);
        Assert.Equal(1, e.RowIndex);
        Assert.Contains("No reference energy for element O", e.Message);
        Assert.Contains("'hem' (row 1), 'mag' (row 2)", e.Message);
        Assert.DoesNotContain("mixes", e.Message);

        // An explicit reference cures it.
        SystemHull hull = SystemHull.OverElements(entries, new ElementalReferences([new("O", -4.9)]));
        Assert.True(hull.StablePhases.Single(p => p.Id == "O").IsSynthetic);
    }

    [Fact]
    public void Mixed_bases_are_allowed_only_where_every_total_energy_has_its_reference()
    {
        // Formation-energy rows need nothing; the total-energy row needs Li and O.
        PhaseEntry[] entries =
        [
            Formation("LiO-f", "Li2O", -2.07),
            Entry("Li", "Li", -1.9, EnergyBasis.TotalPerAtom),
            Entry("Li2O2-t", "Li2O2", -19.0, EnergyBasis.TotalPerFormulaUnit),
        ];
        var e = Assert.Throws<ThermoInputException>(() => FormationEnergies.Compute(entries));
        Assert.Equal("O", e.Element);
        Assert.Equal("Li2O2-t", e.EntryId);
        Assert.Contains("mixes formation and total energies", e.Message);

        // With an O reference, mixing works: Li2O2 formation = -19.0 / 4 - 0.5 * (-1.9) - 0.5 * (-4.9) = -1.35 eV/atom.
        FormationEnergySet set = FormationEnergies.Compute(entries, new ElementalReferences([new("O", -4.9)]));
        Assert.Equal([-2.07, 0.0, -1.35], set.FormationEnergiesEvPerAtom.Select(v => Math.Round(v, 12)));
    }

    [Fact]
    public void Bad_explicit_references()
    {
        var symbol = Assert.Throws<ThermoInputException>(() => new ElementalReferences([new("Xx", -1.0)]));
        Assert.Equal("Xx", symbol.Element);
        Assert.Contains("'Xx' is not an element symbol", symbol.Message);
        var value = Assert.Throws<ThermoInputException>(() => new ElementalReferences([new("O", double.NaN)]));
        Assert.Equal("O", value.Element);
        Assert.Contains("not finite", value.Message);
        var twice = Assert.Throws<ThermoInputException>(() => new ElementalReferences([new("O", -4.9), new("O", -5.0)]));
        Assert.Contains("given twice", twice.Message);
    }

    [Fact]
    public void Entry_outside_the_system_names_the_entry_and_the_element()
    {
        PhaseEntry[] entries = [Formation("Fe", "Fe", 0.0), Formation("O", "O2", 0.0), Formation("FeS", "FeS", -0.5)];
        var e = Assert.Throws<ThermoInputException>(() => SystemHull.OverElements(entries, elements: ["Fe", "O"]));
        Assert.Equal("FeS", e.EntryId);
        Assert.Equal(2, e.RowIndex);
        Assert.Contains("Entry 'FeS' (row 2): FeS contains S, which is not in the chemical system Fe-O", e.Message);

        var unknown = Assert.Throws<ThermoInputException>(() => SystemHull.OverElements([], elements: ["Fe", "Qq"]));
        Assert.Equal("Qq", unknown.Element);
        Assert.Throws<ThermoInputException>(() => SystemHull.OverElements([]));
    }

    [Fact]
    public void Queries_outside_the_system_or_with_bad_energies()
    {
        SystemHull hull = SystemHull.OverElements([Formation("FeO", "FeO", -1.4)]);
        var outside = Assert.Throws<ThermoInputException>(() => hull.DecompositionAt(Composition.Parse("FeS")));
        Assert.Contains("contains S", outside.Message);
        var energy = Assert.Throws<ThermoInputException>(() => hull.Assess(Composition.Parse("Fe2O3"), double.NaN));
        Assert.Contains("not finite", energy.Message);
        Assert.Throws<KeyNotFoundException>(() => hull.GetEntry("nope"));
    }

    [Fact]
    public void Amounts_beyond_64_bits_are_refused_with_the_entry_named()
    {
        // Two coprime denominators near 2^40 make the common integer scale near 2^80.
        Rational a = new(1, (1L << 40) + 15);
        Rational b = new(1, (1L << 40) + 21);
        Rational c = new((1L << 40) + 1, (1L << 40) + 27);
        var e = Assert.Throws<ThermoInputException>(() => HullPoint.ScaleToIntegers([a, b, c], "huge", 4));
        Assert.Equal("huge", e.EntryId);
        Assert.Equal(4, e.RowIndex);
        Assert.Contains("beyond 64 bits", e.Message);

        // Small fractions scale to coprime integers: 1/2, 1/3 -> 3, 2.
        Assert.Equal([3L, 2L], HullPoint.ScaleToIntegers([new(1, 2), new(1, 3)], "ok", 0));
    }

    [Fact]
    public void End_member_errors()
    {
        Composition licoo2 = Composition.Parse("LiCoO2");
        Composition coo = Composition.Parse("CoO");

        Assert.Throws<ThermoInputException>(() => new EndMemberBasis([]));

        // LiO = LiCoO2 - CoO: a dependent third end-member is named.
        var dependent = Assert.Throws<ThermoInputException>(() => new EndMemberBasis([licoo2, coo, Composition.Parse("LiO")], ["LiCoO2", "CoO", "LiO"]));
        Assert.Contains("LiO (end-member 2) is a combination of LiCoO2, CoO", dependent.Message);

        // Unnamed end-members go by their formulas, as written.
        var unnamed = Assert.Throws<ThermoInputException>(() => new EndMemberBasis([licoo2, Composition.Parse("Li2Co2O4")]));
        Assert.Contains("Li2Co2O4 (end-member 1) is a combination of LiCoO2", unnamed.Message);
        var names = Assert.Throws<ThermoInputException>(() => new EndMemberBasis([licoo2, coo], ["cathode", "cathode"]));
        Assert.Contains("'cathode' is used twice", names.Message);

        var basis = new EndMemberBasis([licoo2, coo], ["LiCoO2", "CoO"]);
        PhaseEntry[] ok = [Formation("lco", "LiCoO2", -1.8), Formation("coo", "CoO", -1.2)];

        // Negative amount: LiO would need -1 CoO.
        var negative = Assert.Throws<ThermoInputException>(() => SystemHull.OverEndMembers([.. ok, Formation("lio", "LiO", -1.0)], basis));
        Assert.Equal("lio", negative.EntryId);
        Assert.Equal(2, negative.RowIndex);
        Assert.Contains("Entry 'lio' (row 2): LiO needs a negative amount (-1) of end-member CoO", negative.Message);

        // Not in the span: Li2O has the wrong Li:O ratio for any a LiCoO2 + b CoO.
        var span = Assert.Throws<ThermoInputException>(() => SystemHull.OverEndMembers([.. ok, Formation("li2o", "Li2O", -2.0)], basis));
        Assert.Contains("Li2O is not a combination of the end-members LiCoO2, CoO", span.Message);

        // An element no end-member has.
        var foreign = Assert.Throws<ThermoInputException>(() => SystemHull.OverEndMembers([.. ok, Formation("lno", "LiNiO2", -1.5)], basis));
        Assert.Contains("contains Ni, which no end-member", foreign.Message);

        // An end-member without any entry.
        var noEntry = Assert.Throws<ThermoInputException>(() => SystemHull.OverEndMembers([ok[0]], basis));
        Assert.Contains("End-member CoO has no entry", noEntry.Message);
    }
}
