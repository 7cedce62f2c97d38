namespace Hull.Store;

/// <summary>What an entry's energy (eV) refers to. Stored as a stable text token, see <see cref="EnergyBasisTokens"/>.</summary>
public enum EnergyBasis
{
    /// <summary>Total energy of one formula unit as written, eV.</summary>
    TotalPerFormulaUnit,

    /// <summary>Total energy per atom, eV/atom.</summary>
    TotalPerAtom,

    /// <summary>Formation energy of one formula unit as written, eV.</summary>
    FormationPerFormulaUnit,

    /// <summary>Formation energy per atom, eV/atom.</summary>
    FormationPerAtom,
}
