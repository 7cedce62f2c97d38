using Hull.Core.Thermo;
using Hull.Core.Thermo.Gases;
using Hull.Core.Windows;
using static Hull.Core.Tests.Windows.HandbookSpinelWindowTests;

namespace Hull.Core.Tests.Windows;

/// <summary>
/// Gas elements in windows: Δμ_O from (T, p) worked by hand from the NIST-JANAF O2 table, vertices read back as
/// pressures and temperatures through the gas module, and a slice given as (T, p) equal to the slice at that Δμ.
/// </summary>
public sealed class WindowGasConditionTests
{
    // NIST-JANAF Thermochemical Tables, 4th ed. (1998), O2 (ideal gas) at 1000 K: H° − H°(298.15 K) = 22.703 kJ/mol,
    // S° = 243.578 J/(mol K) — from memory (the values GasTableTests checks the Shomate fit against).
    private const double JanafEnthalpyKjPerMol = 22.703, JanafEntropyJPerMolK = 243.578;

    // CODATA 2018: k_B = 8.617333262e-5 eV/K, e N_A = 96.4853321233 kJ/mol per eV.
    private const double Boltzmann = 8.617333262e-5, KjPerMolPerEv = 96.4853321233;

    // The Shomate fit reproduces the table to a few J/mol: a few 1e-5 eV per atom.
    private const double FitToleranceEv = 1e-4;

    private static double HandDeltaMuO(double pressureBar) =>
        ((JanafEnthalpyKjPerMol - (1000 * JanafEntropyJPerMolK / 1000)) / KjPerMolPerEv / 2) + (Boltzmann * 1000 * Math.Log(pressureBar) / 2);

    [Fact]
    public void Oxygen_in_air_at_1000_K_matches_the_hand_worked_janaf_value()
    {
        // (22.703 − 243.578) / 96.4853321233 / 2 = −1.144608 eV; k_B·1000·ln(0.21)/2 = −0.067241 eV; sum −1.211849 eV.
        double expected = HandDeltaMuO(0.21);
        Assert.Equal(-1.211849, expected, 5);
        Assert.True(WindowGasConditions.TryGetGas("O", out GasSpecies oxygen));
        Assert.Equal(expected, WindowGasConditions.DeltaMu(oxygen, 1000, 0.21), FitToleranceEv);
        Assert.False(WindowGasConditions.TryGetGas("Mg", out _));
    }

    [Fact]
    public void Vertices_read_as_pressures_and_temperatures_agree_with_the_gas_module_and_the_hand_formula()
    {
        StabilityWindow window = StabilityWindows.Of(SystemHull.OverElements(Oxides()), "spinel");
        var reservoir = new GasReservoir(GasTables.Oxygen, GasReference.FittedElementalReference(0, GasTables.Oxygen));
        foreach (WindowVertex v in window.Vertices)
        {
            double mu = v.ChemicalPotentialsEv[2];
            GasCondition c = Assert.Single(WindowGasConditions.At(window.Elements, v.ChemicalPotentialsEv, 1000, 1.0));
            Assert.Equal(("O", "O2", mu), (c.Element, c.Gas, c.DeltaMuEvPerAtom));

            // ln p = 2 (Δμ − Δμ(1000 K, 1 bar)) / (k_B T), with Δμ(1000 K, 1 bar) worked by hand from the JANAF row.
            double handLog10 = 2 * (mu - HandDeltaMuO(1.0)) / (Boltzmann * 1000) / Math.Log(10);
            Assert.Equal(handLog10, c.Pressure!.Log10PressureBar, 2 * FitToleranceEv / (Boltzmann * 1000) / Math.Log(10) * 1.01);
            Assert.Equal(reservoir.PressureAt(mu, 1000, 0).Log10PressureBar, c.Pressure.Log10PressureBar, 12);

            // At 1 bar the window's Δμ_O (−5.9 eV, or 0) needs a temperature outside the O2 table: said, not thrown.
            Assert.NotNull(c.Temperature);
            Assert.Equal(reservoir.TemperatureAt(mu, 1.0, 0).Status, c.Temperature!.Status);
        }

        // A Δμ_O a table temperature gives at 1 bar: solved, and the gas module's Δμ there is the one asked for.
        GasCondition mid = Assert.Single(WindowGasConditions.At(["Al", "O"], [-1.0, -1.0], null, 1.0));
        Assert.Null(mid.Pressure);
        Assert.Equal(TemperatureSolveStatus.Converged, mid.Temperature!.Status);
        Assert.Equal(-1.0, WindowGasConditions.DeltaMu(GasTables.Oxygen, mid.Temperature.TemperatureK, 1.0), 1e-9);
        Assert.Empty(WindowGasConditions.At(["Al", "O"], [-1.0, -1.0], null, null));
    }

    [Fact]
    public void A_computed_oxygen_molecule_reads_a_vertex_as_the_hand_worked_pressure_against_the_dataset_reference()
    {
        // An invented computed O2 (energy at rest −9.86 eV, zero-point energy 0.098 eV per molecule) against an invented
        // dataset reference for O of −4.95 eV/atom. The standard-state term per molecule at 1000 K uses the gas tables'
        // NIST-JANAF 4th ed. (1998) O2 rows: H°(1000 K) − H°(298.15 K) = 22.703 kJ/mol, S°(1000 K) = 243.578 J/(mol K),
        // H°(298.15 K) − H°(0) = 8.683 kJ/mol — from memory:
        //   Δμ(1000 K, p°) = (22.703 + 8.683 − 1000 × 0.243578) / 96.4853321233 = −2.199215 eV per molecule.
        // Δμ_O = ½(E_O2 + ZPE) − E_ref + ½ Δμ(T, p°) + ½ k_B T ln(p/p°)
        //      = ½(−9.86 + 0.098) + 4.95 − 1.099608 + ½ k_B T ln(p/p°) = −1.030608 eV + ½ k_B T ln(p/p°).
        // A vertex at Δμ_O = −1.5 eV: ln(p/p°) = 2 (−1.5 + 1.030608) / (8.617333262e-5 × 1000) = −10.894146,
        // log10 p = −4.731268, p = 1.8567e-5 bar.
        const double moleculeEv = -9.86, zeroPointEv = 0.098, referenceEvPerAtom = -4.95;
        WindowGasMolecule o2 = WindowGasMolecule.Of(GasTables.Oxygen, moleculeEv, zeroPointEv, referenceEvPerAtom);
        var molecules = new Dictionary<string, WindowGasMolecule> { ["O"] = o2 };

        GasCondition c = Assert.Single(WindowGasConditions.At(["Al", "O"], [-2.0, -1.5], 1000, null, molecules));
        Assert.True(c.ComputedMolecule);
        Assert.Equal(-4.731268, c.Pressure!.Log10PressureBar, 2 * FitToleranceEv / (Boltzmann * 1000) / Math.Log(10));
        Assert.Equal(1.8567e-5, c.Pressure.PressureBar, 0.01 * 1.8567e-5);
        Assert.Equal(-1.030608, WindowGasConditions.DeltaMu(GasTables.Oxygen, 1000, 1.0, o2), FitToleranceEv);

        // The fitted default reads the same Δμ as another pressure (it does not see the molecule or the reference).
        GasCondition fitted = Assert.Single(WindowGasConditions.At(["Al", "O"], [-2.0, -1.5], 1000, null));
        Assert.False(fitted.ComputedMolecule);
        Assert.Equal(2 * (-1.5 - HandDeltaMuO(1.0)) / (Boltzmann * 1000) / Math.Log(10), fitted.Pressure!.Log10PressureBar, 0.01);

        // Bad input names what is wrong.
        Assert.Contains("not finite", Assert.Throws<ThermoInputException>(() => WindowGasMolecule.Of(GasTables.Oxygen, double.NaN, zeroPointEv, referenceEvPerAtom)).Message);
        Assert.Contains("reference for O", Assert.Throws<ThermoInputException>(() => WindowGasMolecule.Of(GasTables.Oxygen, moleculeEv, zeroPointEv, double.PositiveInfinity)).Message);
        Assert.Contains("N2 molecule", Assert.Throws<ThermoInputException>(() =>
            WindowGasConditions.DeltaMu(GasTables.Oxygen, 1000, 1.0, WindowGasMolecule.Of(GasTables.Nitrogen, -16.6, 0.15, -8.3))).Message);
    }

    [Fact]
    public void A_slice_given_as_the_gas_at_T_and_p_is_the_slice_at_its_delta_mu()
    {
        // MgO's window (Mg-O) sliced by O2 at 1000 K in air: Δμ_O = −1.2118 eV (hand value above), Δμ_Mg = h_M − Δμ_O.
        SystemHull hull = SystemHull.OverElements([Fu("periclase", "MgO", Periclase), Fu("Mg", "Mg", 0), Fu("O2", "O2", 0)]);
        double mu = WindowGasConditions.DeltaMu(GasTables.Oxygen, 1000, 0.21);
        WindowSlice slice = StabilityWindows.Slice(hull, "periclase", new Dictionary<string, double> { ["O"] = mu });
        WindowVertex v = Assert.Single(slice.Slice.Vertices);
        Assert.Equal((Periclase / 96.485) - HandDeltaMuO(0.21), v.ChemicalPotentialsEv[0], FitToleranceEv);
    }
}
