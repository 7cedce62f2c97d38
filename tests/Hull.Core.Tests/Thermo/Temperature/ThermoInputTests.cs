using Hull.Core.Chemistry;
using Hull.Core.Thermo;
using Hull.Core.Thermo.Gases;
using Hull.Core.Thermo.Solids;
using Hull.Core.Thermo.Temperature;
using static Hull.Core.Tests.Thermo.Temperature.HandbookOxides;

namespace Hull.Core.Tests.Thermo.Temperature;

/// <summary>Bad input to the temperature work: each a clear error that says what and where.</summary>
public sealed class ThermoInputTests
{
    [Fact]
    public void An_entropy_on_an_entry_of_another_formula_is_refused_naming_both()
    {
        (SystemHull hull, _) = Silver();
        var models = new TemperatureModelSet([Entropy("Ag", "Ag", 42.55), Entropy("Ag2O", "AgO", 57.8)], []);
        var error = Assert.Throws<ThermoInputException>(() => ThermoSystem.Prepare(hull, models, FreeEnergyTreatment.Ellingham, Oxygen(1)));
        Assert.Equal("Ag2O", error.EntryId);
        Assert.Contains("Entry 'Ag2O' is Ag2O", error.Message);
        Assert.Contains("is for AgO", error.Message);

        // Any multiple of the entry's formula is its composition.
        var doubled = new TemperatureModelSet([Entropy("Ag", "Ag", 42.55), Entropy("Ag2O", "Ag4O2", 242.6)], []);
        ThermoSystem system = ThermoSystem.Prepare(hull, doubled, FreeEnergyTreatment.Ellingham, Oxygen(1));
        Assert.Equal(467.84, Assert.Single(DecompositionTemperatures.Find(system, "Ag2O", 300, 900).Crossings).TemperatureK, 0.01);
    }

    [Theory]
    [InlineData(0.0)]
    [InlineData(-0.21)]
    [InlineData(double.NaN)]
    public void A_zero_or_negative_pressure_is_refused(double pressureBar)
    {
        var error = Assert.Throws<ThermoInputException>(() => Oxygen(pressureBar));
        Assert.Contains("Pressure of O2 must be positive and finite", error.Message);
        Assert.Throws<ThermoInputException>(() => Ellingham(Silver(), 1.0).AtPressure(pressureBar));
    }

    [Fact]
    public void A_gas_the_tables_lack_is_refused()
    {
        var error = Assert.Throws<ThermoInputException>(() => GasTables.Get("CO2"));
        Assert.Contains("No gas table for 'CO2'", error.Message);
    }

    [Fact]
    public void A_gas_whose_element_is_not_in_the_system_is_refused()
    {
        (SystemHull hull, TemperatureModelSet models) = Silver();
        var error = Assert.Throws<ThermoInputException>(() => ThermoSystem.Prepare(hull, models, FreeEnergyTreatment.Ellingham,
            new ThermoGas(GasTables.Nitrogen, 1.0)));
        Assert.Contains("N2 exchanges N, which is not an element of Ag-O", error.Message);
    }

    [Fact]
    public void An_element_without_a_modelled_pure_entry_is_refused_naming_it()
    {
        (SystemHull hull, _) = Silver();
        var error = Assert.Throws<ThermoInputException>(() => ThermoSystem.Prepare(hull,
            new TemperatureModelSet([Entropy("Ag2O", "Ag2O", 121.3)], []), FreeEnergyTreatment.Ellingham, Oxygen(1)));
        Assert.Equal("Ag", error.Element);
        Assert.Contains("Element Ag of Ag-O has no pure entry with a temperature model", error.Message);
    }

    [Fact]
    public void Unmodelled_entries_are_left_out_and_listed_and_cannot_be_followed()
    {
        SystemHull hull = SystemHull.OverElements([Formation("Ag", "Ag", 0.0), Formation("Ag2O", "Ag2O", -31.05), Formation("AgO", "AgO", -12.1)]);
        ThermoSystem system = ThermoSystem.Prepare(hull, Silver().Models, FreeEnergyTreatment.Ellingham, Oxygen(1));
        Assert.Equal(["AgO"], system.UnmodelledEntryIds);
        Assert.Equal(["AgO"], system.HullAt(400).UnmodelledEntryIds);
        var error = Assert.Throws<ThermoInputException>(() => DecompositionTemperatures.Find(system, "AgO", 300, 900));
        Assert.Contains("it has no temperature model", error.Message);
        Assert.Contains("pure element", Assert.Throws<ThermoInputException>(() => DecompositionTemperatures.Find(system, "Ag", 300, 900)).Message);
        Assert.Contains("no entry of Ag-O has that id", Assert.Throws<ThermoInputException>(() => DecompositionTemperatures.Find(system, "Ag3O", 300, 900)).Message);
    }

    [Fact]
    public void A_tabulated_model_under_the_Ellingham_treatment_is_refused()
    {
        (SystemHull hull, _) = Silver();
        var table = new TabulatedFreeEnergyModel(Composition.Parse("Ag2O"), [new(300, -0.4), new(900, -1.2)]);
        var models = new TemperatureModelSet([Entropy("Ag", "Ag", 42.55), KeyValuePair.Create("Ag2O", (SolidTemperatureModel)table)], []);
        var error = Assert.Throws<ThermoInputException>(() => ThermoSystem.Prepare(hull, models, FreeEnergyTreatment.Ellingham, Oxygen(1)));
        Assert.Equal("Ag2O", error.EntryId);
        Assert.Contains("Ellingham approximation needs a standard entropy", error.Message);
    }

    [Fact]
    public void Bad_models_and_ranges_are_refused()
    {
        Assert.Contains("not negative", Assert.Throws<ThermoInputException>(() => new StandardEntropyModel(Composition.Parse("Ag2O"), -1)).Message);
        Assert.Contains("temperatures must rise", Assert.Throws<ThermoInputException>(() =>
            new TabulatedFreeEnergyModel(Composition.Parse("Ag2O"), [new(500, -0.4), new(400, -1.2)])).Message);
        Assert.Contains("at least two rows", Assert.Throws<ThermoInputException>(() =>
            new TabulatedFreeEnergyModel(Composition.Parse("Ag2O"), [new(500, -0.4)])).Message);
        Assert.Contains("given two temperature models", Assert.Throws<ThermoInputException>(() =>
            new TemperatureModelSet([Entropy("Ag", "Ag", 42.55), Entropy("Ag", "Ag", 42.0)], [])).Message);
        ThermoSystem system = Ellingham(Silver(), 1.0);
        Assert.Contains("0 K < from < to", Assert.Throws<ThermoInputException>(() => DecompositionTemperatures.Find(system, "Ag2O", 900, 300)).Message);
        Assert.Contains("0 K < from < to", Assert.Throws<ThermoInputException>(() => DecompositionTemperatures.Find(system, "Ag2O", 0, 300)).Message);
        Assert.Contains("Scan intervals", Assert.Throws<ThermoInputException>(() => DecompositionTemperatures.Find(system, "Ag2O", 300, 900, 0)).Message);
        Assert.Contains("positive and finite", Assert.Throws<ThermoInputException>(() => system.HullAt(-5)).Message);
    }

    [Fact]
    public void The_Ellingham_gas_potential_holds_the_standard_entropy()
    {
        // NIST-JANAF Thermochemical Tables, 4th ed. (1998), O2 S°(298.15 K) = 205.147 J/(mol K), H°(298.15) − H°(0) = 8.683 kJ/mol — from memory
        var fitted = new GasReservoir(GasTables.Oxygen, GasReference.FittedElementalReference(-4.95, GasTables.Oxygen));
        GasChemicalPotential mu = fitted.StandardStateChemicalPotential(1000, 0.21);
        double expected = (2 * -4.95) + ((-1000 * 205.147 / 1000) / PhysicalConstants.KilojoulesPerMolPerEv)
            + (8.617333262e-5 * 1000 * Math.Log(0.21));
        Assert.Equal(expected, mu.EvPerMolecule, 1e-5);
        Assert.Equal(expected / 2, mu.EvPerAtom, 1e-5);
        var computed = new GasReservoir(GasTables.Oxygen, GasReference.ComputedMolecule(-9.86, 0.098));
        Assert.Equal(-9.86 + 0.098 + (8.683 / PhysicalConstants.KilojoulesPerMolPerEv) + (expected - (2 * -4.95)),
            computed.StandardStateChemicalPotential(1000, 0.21).EvPerMolecule, 1e-5);
        Assert.Throws<ThermoInputException>(() => fitted.StandardStateChemicalPotential(0, 1));
    }
}
