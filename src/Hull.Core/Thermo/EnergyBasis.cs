namespace Hull.Core.Thermo;

/// <summary>What a phase entry's energy (eV) means.</summary>
public enum EnergyBasis
{
    /// <summary>Total energy of one formula unit as written (eV per formula unit).</summary>
    TotalPerFormulaUnit,

    /// <summary>Total energy per atom (eV/atom).</summary>
    TotalPerAtom,

    /// <summary>Formation energy from the elements of one formula unit as written (eV per formula unit).</summary>
    FormationPerFormulaUnit,

    /// <summary>Formation energy from the elements per atom (eV/atom).</summary>
    FormationPerAtom,
}
