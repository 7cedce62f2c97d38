namespace Hull.Core.Thermo;

/// <summary>What quantity a hull is built over (its energy axis).</summary>
public enum HullAxisQuantity
{
    /// <summary>Formation energy from the elemental references.</summary>
    FormationEnergy,

    /// <summary>Grand potential with some elements open to a reservoir at fixed chemical potentials.</summary>
    GrandPotential,

    /// <summary>Formation free energy at a given temperature.</summary>
    FreeEnergy,

    /// <summary>One sample of an energy drawn from its uncertainty (one member of an ensemble).</summary>
    SampledEnergy,

    /// <summary>Formation energy of entries after a named correction set (fitted references, shifts, method rules).</summary>
    CorrectedFormationEnergy,
}
