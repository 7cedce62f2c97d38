using Hull.Core.Thermo;
using Hull.Core.Thermo.Gases;

namespace Hull.Core.Tests.Thermo.Gases;

/// <summary>
/// O2's μ(T, p) in both reference modes at 298.15, 1000 and 1500 K and 1, 0.21 and 1e-10 bar, per molecule and per
/// atom, worked by hand from NIST-JANAF Thermochemical Tables, 4th ed. (1998), O2 H°(T) − H°(298.15 K), S°(T) and
/// H°(298.15 K) − H°(0), with CODATA 2018 constants.
/// </summary>
public sealed class OxygenChemicalPotentialTests
{
    // The Shomate fit reproduces the table to about 1 J/mol in H and 1 mJ/(mol K) in S; at 1500 K that is under
    // 3e-5 eV per molecule. 1e-4 eV per molecule leaves room for the table's last digit.
    private const double ToleranceEvPerMolecule = 1e-4;

    // The code's k_B is the exact CODATA quotient; the test's is rounded to ten digits, a relative 2e-11.
    private const double PressureTermToleranceEv = 1e-10;

    // CODATA 2018: k_B = 8.617333262e-5 eV/K; e N_A = 96.48533212 kJ/mol per eV — from memory
    private const double BoltzmannEvPerK = 8.617333262e-5;
    private const double KilojoulesPerMolPerEv = 96.48533212;

    // NIST-JANAF Thermochemical Tables, 4th ed. (1998), O2: H°(298.15 K) − H°(0) = 8.683 kJ/mol — from memory
    private const double JanafEnthalpyStandardAboveZeroKjPerMol = 8.683;

    // Arbitrary but DFT-like reference energies (eV): a molecule at rest, its zero-point energy, a fitted per-atom value.
    private const double ElectronicEnergyEvPerMolecule = -9.86;
    private const double ZeroPointEnergyEvPerMolecule = 0.098;
    private const double FittedReferenceEvPerAtom = -4.95;

    public static TheoryData<double, double, double, double> Conditions()
    {
        // NIST-JANAF Thermochemical Tables, 4th ed. (1998), O2 (ideal gas): H°(T) − H°(298.15) kJ/mol, S° J/(mol K) — from memory
        (double t, double h, double s)[] rows = [(298.15, 0.0, 205.147), (1000, 22.703, 243.578), (1500, 40.599, 258.068)];
        var data = new TheoryData<double, double, double, double>();
        foreach ((double t, double h, double s) in rows)
        {
            foreach (double p in new[] { 1.0, 0.21, 1e-10 })
            {
                data.Add(t, p, h, s);
            }
        }

        return data;
    }

    private static double HandMuWithoutReference(double temperatureK, double pressureBar, double enthalpyKjPerMol, double entropyJPerMolK) =>
        enthalpyKjPerMol / KilojoulesPerMolPerEv
        - temperatureK * entropyJPerMolK / 1000.0 / KilojoulesPerMolPerEv
        + BoltzmannEvPerK * temperatureK * Math.Log(pressureBar / 1.0);

    [Theory]
    [MemberData(nameof(Conditions))]
    public void Fitted_reference_mode_anchors_at_298_15_K(double temperatureK, double pressureBar, double enthalpyKjPerMol, double entropyJPerMolK)
    {
        var reservoir = new GasReservoir(GasTables.Oxygen, GasReference.FittedElementalReference(FittedReferenceEvPerAtom, GasTables.Oxygen));
        GasChemicalPotential mu = reservoir.ChemicalPotential(temperatureK, pressureBar);

        double expectedPerMolecule = 2 * FittedReferenceEvPerAtom + HandMuWithoutReference(temperatureK, pressureBar, enthalpyKjPerMol, entropyJPerMolK);
        Assert.Equal(GasReferenceMode.FittedElementalReference, mu.Mode);
        Assert.Equal(expectedPerMolecule, mu.EvPerMolecule, ToleranceEvPerMolecule);
        Assert.Equal(expectedPerMolecule / 2, mu.EvPerAtom, ToleranceEvPerMolecule / 2);
        Assert.Equal(298.15, reservoir.Reference.AnchorTemperatureK);
    }

    [Theory]
    [MemberData(nameof(Conditions))]
    public void Computed_molecule_mode_anchors_at_0_K_and_includes_the_zero_point_energy(double temperatureK, double pressureBar, double enthalpyKjPerMol, double entropyJPerMolK)
    {
        var reservoir = new GasReservoir(GasTables.Oxygen, GasReference.ComputedMolecule(ElectronicEnergyEvPerMolecule, ZeroPointEnergyEvPerMolecule));
        GasChemicalPotential mu = reservoir.ChemicalPotential(temperatureK, pressureBar);

        double expectedPerMolecule = ElectronicEnergyEvPerMolecule + ZeroPointEnergyEvPerMolecule
            + JanafEnthalpyStandardAboveZeroKjPerMol / KilojoulesPerMolPerEv
            + HandMuWithoutReference(temperatureK, pressureBar, enthalpyKjPerMol, entropyJPerMolK);
        Assert.Equal(GasReferenceMode.ComputedMoleculeEnergy, mu.Mode);
        Assert.Equal(expectedPerMolecule, mu.EvPerMolecule, ToleranceEvPerMolecule);
        Assert.Equal(expectedPerMolecule / 2, mu.EvPerAtom, ToleranceEvPerMolecule / 2);
        Assert.Equal(0.0, reservoir.Reference.AnchorTemperatureK);
    }

    [Fact]
    public void The_pressure_term_is_k_T_ln_p_per_molecule_and_half_that_per_atom()
    {
        var reservoir = new GasReservoir(GasTables.Oxygen, GasReference.FittedElementalReference(0.0, GasTables.Oxygen));
        GasChemicalPotential air = reservoir.ChemicalPotential(1000, 0.21);
        GasChemicalPotential standard = reservoir.ChemicalPotential(1000, 1.0);
        // ideal-gas law: μ(p) − μ(p°) = k_B T ln(p/p°) — common practice
        Assert.Equal(BoltzmannEvPerK * 1000 * Math.Log(0.21), air.EvPerMolecule - standard.EvPerMolecule, PressureTermToleranceEv);
        Assert.Equal(BoltzmannEvPerK * 1000 * Math.Log(0.21) / 2, air.EvPerAtom - standard.EvPerAtom, PressureTermToleranceEv);
        Assert.Equal(0.0, standard.PressureTermEvPerMolecule);
    }

    [Fact]
    public void Delta_mu_is_mu_per_atom_minus_the_dataset_reference_with_the_zero_point_offset_written_out()
    {
        const double datasetReferenceEvPerAtom = ElectronicEnergyEvPerMolecule / 2; // the O2 entry's energy at rest, per atom
        var computed = new GasReservoir(GasTables.Oxygen, GasReference.ComputedMolecule(ElectronicEnergyEvPerMolecule, ZeroPointEnergyEvPerMolecule));
        ChemicalPotentialShift shift = computed.Shift(1000, 0.21, new ElementReference("O", datasetReferenceEvPerAtom, "O2-entry"));

        Assert.Equal(ZeroPointEnergyEvPerMolecule / 2, shift.ZeroPointOffsetEvPerAtom, 1e-15);
        Assert.Equal(shift.MuEvPerAtom - datasetReferenceEvPerAtom, shift.DeltaMuEvPerAtom, 1e-15);
        Assert.Equal("O", shift.Element);
        // NIST-JANAF Thermochemical Tables, 4th ed. (1998), O2 at 1000 K — from memory; Δμ = ZPE/2 + [H(T) − H(0) − T S]/2 + kT ln p / 2
        double expected = ZeroPointEnergyEvPerMolecule / 2
            + (JanafEnthalpyStandardAboveZeroKjPerMol / KilojoulesPerMolPerEv + HandMuWithoutReference(1000, 0.21, 22.703, 243.578)) / 2;
        Assert.Equal(expected, shift.DeltaMuEvPerAtom, ToleranceEvPerMolecule / 2);

        var fitted = new GasReservoir(GasTables.Oxygen, GasReference.FittedElementalReference(FittedReferenceEvPerAtom, GasTables.Oxygen));
        ChemicalPotentialShift fittedShift = fitted.Shift(298.15, 1.0, FittedReferenceEvPerAtom);
        Assert.Equal(0.0, fittedShift.ZeroPointOffsetEvPerAtom);
        // NIST-JANAF, O2 S°(298.15 K) = 205.147 J/(mol K) — from memory; at the anchor Δμ is −T S°/2 alone
        Assert.Equal(-298.15 * 205.147 / 1000 / KilojoulesPerMolPerEv / 2, fittedShift.DeltaMuEvPerAtom, ToleranceEvPerMolecule / 2);
    }

    [Fact]
    public void A_reference_for_another_element_is_refused()
    {
        var reservoir = new GasReservoir(GasTables.Oxygen, GasReference.FittedElementalReference(FittedReferenceEvPerAtom, GasTables.Oxygen));
        var error = Assert.Throws<ThermoInputException>(() => reservoir.Shift(1000, 1.0, new ElementReference("N", -8.3, null)));
        Assert.Equal("N", error.Element);
        Assert.Contains("reference for O", error.Message);
    }

    [Theory]
    [InlineData(0.0)]
    [InlineData(-0.21)]
    [InlineData(double.NaN)]
    [InlineData(double.PositiveInfinity)]
    public void Zero_negative_or_non_finite_pressure_is_a_clear_error(double pressureBar)
    {
        var reservoir = new GasReservoir(GasTables.Oxygen, GasReference.FittedElementalReference(FittedReferenceEvPerAtom, GasTables.Oxygen));
        var error = Assert.Throws<ThermoInputException>(() => reservoir.ChemicalPotential(1000, pressureBar));
        Assert.Contains("Pressure of O2 must be positive and finite", error.Message);
        Assert.Throws<ThermoInputException>(() => reservoir.TemperatureAt(-1.0, pressureBar, FittedReferenceEvPerAtom));
    }

    [Fact]
    public void Bad_reference_energies_are_clear_errors()
    {
        Assert.Throws<ThermoInputException>(() => GasReference.ComputedMolecule(double.NaN, 0.1));
        Assert.Contains("must not be negative", Assert.Throws<ThermoInputException>(() => GasReference.ComputedMolecule(-9.8, -0.1)).Message);
        Assert.Throws<ThermoInputException>(() => GasReference.FittedElementalReference(double.PositiveInfinity, GasTables.Oxygen));
        var reservoir = new GasReservoir(GasTables.Oxygen, GasReference.FittedElementalReference(FittedReferenceEvPerAtom, GasTables.Oxygen));
        Assert.Throws<ThermoInputException>(() => reservoir.Shift(1000, 1.0, double.NaN));
    }

    [Fact]
    public void The_constants_are_CODATA_2018()
    {
        // CODATA 2018: k_B = 8.617333262e-5 eV/K, R = 8.314462618 J/(mol K), e N_A = 96.48533212 kJ/mol — from memory
        Assert.Equal(8.617333262e-5, PhysicalConstants.BoltzmannEvPerK, 1e-14);
        Assert.Equal(8.314462618, PhysicalConstants.GasConstantJPerMolK, 1e-9);
        Assert.Equal(96.48533212, PhysicalConstants.KilojoulesPerMolPerEv, 1e-8);
    }
}
