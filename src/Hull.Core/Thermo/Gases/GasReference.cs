using System.Globalization;

namespace Hull.Core.Thermo.Gases;

/// <summary>
/// The reference energy of one gas's molecule and what it stands for (see <see cref="GasReferenceMode"/>).
/// Build it with <see cref="ComputedMolecule"/> or <see cref="FittedElementalReference"/>.
/// </summary>
public sealed record GasReference
{
    private GasReference(GasReferenceMode mode, double energyEvPerMolecule, double zeroPointEnergyEvPerMolecule)
    {
        Mode = mode;
        EnergyEvPerMolecule = energyEvPerMolecule;
        ZeroPointEnergyEvPerMolecule = zeroPointEnergyEvPerMolecule;
    }

    public GasReferenceMode Mode { get; }

    /// <summary>E_ref per molecule, eV (zero-point energy included in the computed mode).</summary>
    public double EnergyEvPerMolecule { get; }

    /// <summary>The zero-point energy included in <see cref="EnergyEvPerMolecule"/>, eV per molecule; 0 in the fitted mode.</summary>
    public double ZeroPointEnergyEvPerMolecule { get; }

    /// <summary>The temperature whose enthalpy E_ref stands for: 0 K or 298.15 K.</summary>
    public double AnchorTemperatureK =>
        Mode == GasReferenceMode.ComputedMoleculeEnergy ? 0.0 : PhysicalConstants.StandardTemperatureK;

    /// <summary>A computed molecule: its electronic energy at rest and its zero-point energy, both eV per molecule.</summary>
    /// <exception cref="ThermoInputException">A non-finite energy, or a negative zero-point energy.</exception>
    public static GasReference ComputedMolecule(double electronicEnergyEvPerMolecule, double zeroPointEnergyEvPerMolecule)
    {
        RequireFinite(electronicEnergyEvPerMolecule, "electronic energy");
        RequireFinite(zeroPointEnergyEvPerMolecule, "zero-point energy");
        if (zeroPointEnergyEvPerMolecule < 0)
        {
            throw new ThermoInputException(string.Create(CultureInfo.InvariantCulture,
                $"Zero-point energy must not be negative; got {zeroPointEnergyEvPerMolecule} eV per molecule."));
        }

        return new GasReference(GasReferenceMode.ComputedMoleculeEnergy,
            electronicEnergyEvPerMolecule + zeroPointEnergyEvPerMolecule, zeroPointEnergyEvPerMolecule);
    }

    /// <summary>A fitted elemental reference (eV per atom) standing for H°(298.15 K); E_ref = atoms per molecule × it.</summary>
    /// <exception cref="ThermoInputException">A non-finite energy.</exception>
    public static GasReference FittedElementalReference(double referenceEvPerAtom, GasSpecies species)
    {
        ArgumentNullException.ThrowIfNull(species);
        RequireFinite(referenceEvPerAtom, "fitted elemental reference");
        return new GasReference(GasReferenceMode.FittedElementalReference,
            species.AtomsPerMolecule * referenceEvPerAtom, 0.0);
    }

    private static void RequireFinite(double value, string what)
    {
        if (!double.IsFinite(value))
        {
            throw new ThermoInputException(string.Create(CultureInfo.InvariantCulture, $"The gas's {what} is not finite ({value} eV)."));
        }
    }
}
