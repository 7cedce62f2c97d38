namespace Hull.Core.Defects;

/// <summary>Where a charge state's potential alignment came from.</summary>
public enum AlignmentMethod
{
    /// <summary>No alignment input: only the image-charge term is applied.</summary>
    None = 0,

    /// <summary>ΔV given outright.</summary>
    Given = 1,

    /// <summary>Far-field plateau of planar averages.</summary>
    PlanarAverage = 2,

    /// <summary>Atomic sites outside the sphere inscribed in the defect-centred Wigner–Seitz cell.</summary>
    AtomicSites = 3,
}
