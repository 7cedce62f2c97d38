namespace Hull.Core.Thermo.Gases;

/// <summary>What the reference energy E_ref of a gas stands for, which fixes the anchor temperature of its enthalpy.</summary>
public enum GasReferenceMode
{
    /// <summary>
    /// E_ref is a computed molecule energy per molecule at 0 K, zero-point energy included (the caller gives both).
    /// Anchor 0 K: μ adds H°(T) − H°(0) = [H°(T) − H°(298.15 K)] + [H°(298.15 K) − H°(0)], the latter tabulated.
    /// </summary>
    ComputedMoleculeEnergy,

    /// <summary>
    /// E_ref stands for H°(298.15 K) per molecule: twice a per-atom elemental reference energy fitted so that
    /// formation energies match measured ones at 298.15 K. Anchor 298.15 K: μ adds H°(T) − H°(298.15 K).
    /// </summary>
    FittedElementalReference,
}
