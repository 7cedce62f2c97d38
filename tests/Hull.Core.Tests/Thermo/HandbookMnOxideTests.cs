using Hull.Core.Thermo;
using static Hull.Core.Tests.Thermo.ThermoTestData;

namespace Hull.Core.Tests.Thermo;

/// <summary>
/// Second outside check on handbook thermochemistry, Mn–O, where every oxide is stable at 298.15 K so the check falls
/// on decomposition energies. ΔH at 298.15 K only.
/// </summary>
public sealed class HandbookMnOxideTests
{
    private const double KilojoulesPerMolePerEv = 96.485; // CODATA: e * N_A = 96 485.33 C/mol

    private const double ToleranceEvPerAtom = 1e-6; // hand calculations carry ~1e-10 eV/atom

    // NBS Tables of Chemical Thermodynamic Properties (Wagman et al., 1982), ΔfH°(298.15 K) in kJ/mol — from memory.
    private const double MnO = -385.22;
    private const double Mn3O4 = -1387.8;
    private const double Mn2O3 = -959.0;
    private const double MnO2 = -520.03;

    private static SystemHull Build() =>
        SystemHull.OverElements(
        [
            Entry("MnO", "MnO", MnO / KilojoulesPerMolePerEv, EnergyBasis.FormationPerFormulaUnit),
            Entry("Mn3O4", "Mn3O4", Mn3O4 / KilojoulesPerMolePerEv, EnergyBasis.FormationPerFormulaUnit),
            Entry("Mn2O3", "Mn2O3", Mn2O3 / KilojoulesPerMolePerEv, EnergyBasis.FormationPerFormulaUnit),
            Entry("MnO2", "MnO2", MnO2 / KilojoulesPerMolePerEv, EnergyBasis.FormationPerFormulaUnit),
        ]);

    [Fact]
    public void Every_manganese_oxide_is_on_the_hull()
    {
        SystemHull hull = Build();
        Assert.All(hull.Entries, e => Assert.True(e.IsHullVertex, e.Id));
        Assert.Equal(["Mn", "Mn2O3", "Mn3O4", "MnO", "MnO2", "O"], hull.StablePhases.Select(p => p.Id));
    }

    [Fact]
    public void Decomposition_energies_match_the_balanced_reactions()
    {
        SystemHull hull = Build();

        // MnO -> 1/4 Mn + 1/4 Mn3O4: ΔH = 1/4 * (-1387.8) + 385.22 = +38.27 kJ/mol per 2 atoms
        //   -> -38.27 / 2 / 96.485 = -0.19832098 eV/atom.
        Assert.Equal(-0.1983209825, hull.GetEntry("MnO").DecompositionEnergyEvPerAtom!.Value, ToleranceEvPerAtom);

        // Mn3O4 -> MnO + Mn2O3: ΔH = -385.22 - 959.0 + 1387.8 = +43.58 kJ/mol per 7 atoms -> -0.06452520 eV/atom.
        Assert.Equal(-0.0645252038, hull.GetEntry("Mn3O4").DecompositionEnergyEvPerAtom!.Value, ToleranceEvPerAtom);

        // Mn2O3 -> 1/2 Mn3O4 + 1/2 MnO2: ΔH = -693.9 - 260.015 + 959.0 = +5.085 kJ/mol per 5 atoms -> -0.01054050 eV/atom.
        Assert.Equal(-0.0105404985, hull.GetEntry("Mn2O3").DecompositionEnergyEvPerAtom!.Value, ToleranceEvPerAtom);

        // MnO2 -> 1/2 Mn2O3 + 1/4 O2 (here 1/2 O, the synthetic one-atom reference): ΔH = -479.5 + 520.03 = +40.53 kJ/mol
        // per 3 atoms -> -0.14002177 eV/atom.
        Assert.Equal(-0.1400217650, hull.GetEntry("MnO2").DecompositionEnergyEvPerAtom!.Value, ToleranceEvPerAtom);

        foreach (EntryStability entry in hull.Entries)
        {
            Assert.Equal(hull.DecompositionEnergyByFullRebuild(entry.Id)!.Value, entry.DecompositionEnergyEvPerAtom!.Value, 1e-12);
        }
    }
}
