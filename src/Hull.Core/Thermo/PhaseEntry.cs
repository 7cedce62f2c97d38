using System.Globalization;
using Hull.Core.Chemistry;

namespace Hull.Core.Thermo;

/// <summary>
/// One computed or measured phase: an id, its composition as written (Fe3O4 is one formula unit of 7 atoms) and an
/// energy in eV whose meaning <see cref="Basis"/> gives. Immutable; validated on construction.
/// </summary>
public sealed class PhaseEntry
{
    /// <exception cref="ThermoInputException">Empty id, missing composition, non-finite energy or unknown basis.</exception>
    public PhaseEntry(string id, Composition composition, double energyEv, EnergyBasis basis)
    {
        if (string.IsNullOrWhiteSpace(id))
        {
            throw new ThermoInputException("A phase entry needs a non-empty id.", entryId: id);
        }

        if (composition is null)
        {
            throw new ThermoInputException($"Entry '{id}' has no composition.", entryId: id);
        }

        if (!double.IsFinite(energyEv))
        {
            throw new ThermoInputException(
                string.Create(CultureInfo.InvariantCulture, $"Entry '{id}' has a non-finite energy ({energyEv} eV)."),
                entryId: id);
        }

        if (!Enum.IsDefined(basis))
        {
            throw new ThermoInputException($"Entry '{id}' has an unknown energy basis ({(int)basis}).", entryId: id);
        }

        Id = id;
        Composition = composition;
        EnergyEv = energyEv;
        Basis = basis;
    }

    /// <summary>The entry's id, unique within a set of entries.</summary>
    public string Id { get; }

    /// <summary>The composition as written: the formula unit the energy refers to.</summary>
    public Composition Composition { get; }

    /// <summary>The energy in eV, per formula unit or per atom as <see cref="Basis"/> says.</summary>
    public double EnergyEv { get; }

    /// <summary>What <see cref="EnergyEv"/> means.</summary>
    public EnergyBasis Basis { get; }

    /// <summary>True for total energies, which need elemental references to become formation energies.</summary>
    public bool IsTotalEnergy => Basis is EnergyBasis.TotalPerFormulaUnit or EnergyBasis.TotalPerAtom;

    /// <summary>The energy divided by the atoms of one formula unit where it was given per formula unit (eV/atom).</summary>
    public double EnergyEvPerAtom =>
        Basis is EnergyBasis.TotalPerFormulaUnit or EnergyBasis.FormationPerFormulaUnit
            ? EnergyEv / Composition.AtomsPerFormulaUnit.ToDouble()
            : EnergyEv;

    public override string ToString() =>
        string.Create(CultureInfo.InvariantCulture, $"{Id}: {Composition.Formula} {EnergyEv} eV ({Basis})");
}
