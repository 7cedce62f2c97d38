using System.Globalization;
using Hull.Core.Thermo;
using Hull.Core.Thermo.Gases;

namespace Hull.Core.Windows;

/// <summary>
/// A gas element of a window read through a computed molecule instead of the fitted default: the molecule's energy
/// at rest and zero-point energy (<see cref="GasReference.ComputedMolecule"/>) against the dataset's elemental
/// reference for that element, so that Δμ = ½(E + ZPE) − E_ref + ½{[H°(T) − H°(0)] − T S°(T) + k_B T ln(p/p°)}
/// for a diatomic gas. Immutable.
/// </summary>
public sealed record WindowGasMolecule
{
    private WindowGasMolecule(GasSpecies species, GasReference molecule, double datasetReferenceEvPerAtom)
    {
        Species = species;
        Molecule = molecule;
        DatasetReferenceEvPerAtom = datasetReferenceEvPerAtom;
    }

    public GasSpecies Species { get; }

    /// <summary>The molecule's reference, in the computed mode.</summary>
    public GasReference Molecule { get; }

    /// <summary>The dataset's total energy per atom of the gas's element, eV/atom: what Δμ is measured from.</summary>
    public double DatasetReferenceEvPerAtom { get; }

    /// <summary>The reservoir μ(T, p) is computed in.</summary>
    public GasReservoir Reservoir => new(Species, Molecule);

    /// <exception cref="ThermoInputException">A non-finite energy, a negative zero-point energy or a non-finite dataset reference.</exception>
    public static WindowGasMolecule Of(GasSpecies species, double moleculeEnergyEv, double zeroPointEnergyEv, double datasetReferenceEvPerAtom)
    {
        ArgumentNullException.ThrowIfNull(species);
        GasReference molecule = GasReference.ComputedMolecule(moleculeEnergyEv, zeroPointEnergyEv);
        if (!double.IsFinite(datasetReferenceEvPerAtom))
        {
            throw new ThermoInputException(string.Create(CultureInfo.InvariantCulture,
                $"The dataset's reference for {species.Element} is not finite ({datasetReferenceEvPerAtom} eV/atom)."), element: species.Element);
        }

        return new WindowGasMolecule(species, molecule, datasetReferenceEvPerAtom);
    }
}
