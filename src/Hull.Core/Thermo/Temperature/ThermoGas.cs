using System.Globalization;
using Hull.Core.Thermo.Gases;

namespace Hull.Core.Thermo.Temperature;

/// <summary>
/// The gas a calculation at (T, p) opens its element to: which gas, its partial pressure (bar), what the dataset's
/// reference for its element stands for, and, for the Ellingham approximation, the S°(298.15 K) to use when it
/// should come from the same handbook as the solids' entropies (default: the gas table's).
/// </summary>
public sealed record ThermoGas
{
    /// <exception cref="ThermoInputException">A pressure that is not positive and finite; a bad molecule energy or entropy.</exception>
    public ThermoGas(GasSpecies species, double pressureBar, GasReferenceMode mode = GasReferenceMode.FittedElementalReference,
        double moleculeEnergyEv = 0, double zeroPointEnergyEv = 0, double? standardEntropyJPerMolK = null)
    {
        ArgumentNullException.ThrowIfNull(species);
        if (!double.IsFinite(pressureBar) || pressureBar <= 0)
        {
            throw new ThermoInputException(string.Create(CultureInfo.InvariantCulture,
                $"Pressure of {species.Formula} must be positive and finite; got {pressureBar} bar."), element: species.Element);
        }

        if (standardEntropyJPerMolK is { } s && (!double.IsFinite(s) || s <= 0))
        {
            throw new ThermoInputException(string.Create(CultureInfo.InvariantCulture,
                $"The standard entropy of {species.Formula} must be positive and finite; got {s} J/(mol K)."), element: species.Element);
        }

        if (mode == GasReferenceMode.ComputedMoleculeEnergy)
        {
            _ = GasReference.ComputedMolecule(moleculeEnergyEv, zeroPointEnergyEv);
        }

        Species = species;
        PressureBar = pressureBar;
        Mode = mode;
        MoleculeEnergyEv = moleculeEnergyEv;
        ZeroPointEnergyEv = zeroPointEnergyEv;
        StandardEntropyJPerMolK = standardEntropyJPerMolK;
    }

    public GasSpecies Species { get; }

    public double PressureBar { get; }

    public GasReferenceMode Mode { get; }

    /// <summary>The computed molecule's energy at rest, eV per molecule (computed mode only).</summary>
    public double MoleculeEnergyEv { get; }

    /// <summary>The computed molecule's zero-point energy, eV per molecule (computed mode only).</summary>
    public double ZeroPointEnergyEv { get; }

    /// <summary>S°(298.15 K) for the Ellingham approximation, J/(mol K); null: the gas table's.</summary>
    public double? StandardEntropyJPerMolK { get; }

    /// <summary>This gas at another pressure.</summary>
    public ThermoGas AtPressure(double pressureBar) =>
        new(Species, pressureBar, Mode, MoleculeEnergyEv, ZeroPointEnergyEv, StandardEntropyJPerMolK);

    /// <summary>The reservoir against a dataset whose reference for the gas's element is <paramref name="datasetReferenceEvPerAtom"/>.</summary>
    public GasReservoir Reservoir(double datasetReferenceEvPerAtom) => new(Species, Mode == GasReferenceMode.ComputedMoleculeEnergy
        ? GasReference.ComputedMolecule(MoleculeEnergyEv, ZeroPointEnergyEv)
        : GasReference.FittedElementalReference(datasetReferenceEvPerAtom, Species));
}
