namespace Hull.Core.Thermo;

/// <summary>How a caller's chemical potential for an open element is measured.</summary>
public enum PotentialScale
{
    /// <summary>Δμ relative to the element's reference (0 = the element in its reference state), eV/atom.</summary>
    RelativeToReference,

    /// <summary>An absolute μ on the scale of the total energies (eV/atom); needs the element's total-energy reference.</summary>
    Absolute,
}
