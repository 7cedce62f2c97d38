namespace Hull.Core.Defects;

/// <summary>
/// What the supplied potentials are. The correction works with the electrostatic potential in volts (the energy
/// of a unit positive charge, so it rises near a positive defect); many codes print the potential energy of an
/// electron in eV instead, which is its negative.
/// </summary>
public enum PotentialSign
{
    /// <summary>Electrostatic potential φ (V): higher near positive charge.</summary>
    Electrostatic = 0,

    /// <summary>Potential energy of an electron −eφ (eV): lower near positive charge; negated on input.</summary>
    ElectronPotentialEnergy = 1,
}

internal static class PotentialSignExtensions
{
    public static double ToElectrostatic(this PotentialSign sign, double value) =>
        sign == PotentialSign.ElectronPotentialEnergy ? -value : value;
}
