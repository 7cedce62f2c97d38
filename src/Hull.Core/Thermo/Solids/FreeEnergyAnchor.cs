using Hull.Core.Thermo.Gases;

namespace Hull.Core.Thermo.Solids;

/// <summary>
/// What an entry's energy stands for when its <see cref="TabulatedFreeEnergyModel"/> adds G(T) − H(anchor) to it:
/// the same two anchors as the gas reference modes (<see cref="GasReferenceMode"/>), so that a solid's G(T) and a
/// gas's μ(T, p) are counted from the same zero. A table on one anchor must be used with the gas mode of the same
/// anchor; mixing them shifts every reaction by H°(298.15 K) − H°(0) of the species involved. A stored table says
/// which it is on (<see cref="AnchoredSolidModel"/>).
/// </summary>
public enum FreeEnergyAnchor
{
    /// <summary>
    /// The entry's energy is a computed energy at rest (0 K, no zero-point energy); the table's values are
    /// G(T) − E_rest and so include the zero-point energy. Pairs with <see cref="GasReferenceMode.ComputedMoleculeEnergy"/>.
    /// </summary>
    Computed0K,

    /// <summary>
    /// The entry's energy stands for H°(298.15 K) (fitted elemental references); the table's values are
    /// G(T) − H°(298.15 K) = [H°(T) − H°(298.15 K)] − T S°(T). Pairs with <see cref="GasReferenceMode.FittedElementalReference"/>.
    /// </summary>
    Fitted298K,
}

/// <summary>The facts of each <see cref="FreeEnergyAnchor"/>.</summary>
public static class FreeEnergyAnchorFacts
{
    /// <summary>The temperature whose enthalpy the entry's energy stands for: 0 K or 298.15 K.</summary>
    public static double AnchorTemperatureK(this FreeEnergyAnchor anchor) => anchor switch
    {
        FreeEnergyAnchor.Computed0K => 0.0,
        FreeEnergyAnchor.Fitted298K => PhysicalConstants.StandardTemperatureK,
        _ => throw new ArgumentOutOfRangeException(nameof(anchor), anchor, "not a defined free-energy anchor"),
    };

    /// <summary>The gas reference mode counted from the same zero.</summary>
    public static GasReferenceMode PairedGasMode(this FreeEnergyAnchor anchor) => anchor switch
    {
        FreeEnergyAnchor.Computed0K => GasReferenceMode.ComputedMoleculeEnergy,
        FreeEnergyAnchor.Fitted298K => GasReferenceMode.FittedElementalReference,
        _ => throw new ArgumentOutOfRangeException(nameof(anchor), anchor, "not a defined free-energy anchor"),
    };
}
