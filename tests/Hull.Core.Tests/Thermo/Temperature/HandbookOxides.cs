using Hull.Core.Chemistry;
using Hull.Core.Thermo;
using Hull.Core.Thermo.Gases;
using Hull.Core.Thermo.Solids;
using Hull.Core.Thermo.Temperature;

namespace Hull.Core.Tests.Thermo.Temperature;

/// <summary>
/// Handbook oxides as datasets of formation energies with standard-entropy models: ΔfH°(298.15 K) per formula unit
/// as the entry's energy (it stands for H at the fitted anchor) and S°(298.15 K) as its model. All values: NBS Tables
/// of Chemical Thermodynamic Properties (Wagman et al., J. Phys. Chem. Ref. Data 11, Suppl. 2, 1982) — from memory.
/// </summary>
internal static class HandbookOxides
{
    // NBS Tables (1982), O2(g) S°(298.15 K) = 205.138 J/(mol K) — from memory
    public const double OxygenEntropyJPerMolK = 205.138;

    public static double Ev(double kilojoulesPerMol) => kilojoulesPerMol / PhysicalConstants.KilojoulesPerMolPerEv;

    public static PhaseEntry Formation(string id, string formula, double kilojoulesPerMol) =>
        new(id, Composition.Parse(formula), Ev(kilojoulesPerMol), EnergyBasis.FormationPerFormulaUnit);

    public static KeyValuePair<string, SolidTemperatureModel> Entropy(string id, string formula, double entropyJPerMolK) =>
        KeyValuePair.Create(id, (SolidTemperatureModel)new StandardEntropyModel(Composition.Parse(formula), entropyJPerMolK, "NBS Tables (1982)"));

    // NBS Tables (1982): Ag2O(s) ΔfH° = −31.05 kJ/mol, S° = 121.3 J/(mol K); Ag(s) S° = 42.55 J/(mol K) — from memory
    public static (SystemHull Hull, TemperatureModelSet Models) Silver() => (
        SystemHull.OverElements([Formation("Ag", "Ag", 0.0), Formation("Ag2O", "Ag2O", -31.05)]),
        new TemperatureModelSet([Entropy("Ag", "Ag", 42.55), Entropy("Ag2O", "Ag2O", 121.3)], []));

    // NBS Tables (1982): CuO(s) ΔfH° = −157.3 kJ/mol, S° = 42.63; Cu2O(s) ΔfH° = −168.6 kJ/mol, S° = 93.14;
    // Cu(s) S° = 33.15 J/(mol K) — from memory
    public static (SystemHull Hull, TemperatureModelSet Models) Copper() => (
        SystemHull.OverElements([Formation("Cu", "Cu", 0.0), Formation("CuO", "CuO", -157.3), Formation("Cu2O", "Cu2O", -168.6)]),
        new TemperatureModelSet([Entropy("Cu", "Cu", 33.15), Entropy("CuO", "CuO", 42.63), Entropy("Cu2O", "Cu2O", 93.14)], []));

    public static ThermoGas Oxygen(double pressureBar) =>
        new(GasTables.Oxygen, pressureBar, GasReferenceMode.FittedElementalReference, standardEntropyJPerMolK: OxygenEntropyJPerMolK);

    public static ThermoSystem Ellingham((SystemHull Hull, TemperatureModelSet Models) data, double pressureBar) =>
        ThermoSystem.Prepare(data.Hull, data.Models, FreeEnergyTreatment.Ellingham, Oxygen(pressureBar));
}
