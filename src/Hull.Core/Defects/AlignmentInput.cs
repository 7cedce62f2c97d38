namespace Hull.Core.Defects;

/// <summary>How the potential alignment of one charge state is obtained: given outright, or from potentials.</summary>
public abstract record AlignmentInput
{
    private AlignmentInput() { }

    /// <summary>A potential offset ΔV (V, electrostatic sign) worked out elsewhere; the alignment term is −qΔV.</summary>
    public sealed record GivenShift(double ShiftVolts) : AlignmentInput;

    /// <summary>
    /// Planar averages along one or more axes (the scheme for a scalar dielectric constant).
    /// </summary>
    /// <param name="Profiles">One profile per axis, at most one per axis.</param>
    /// <param name="Sign">What the numbers are.</param>
    /// <param name="PlateauWidthFraction">Width of the far-field window, as a fraction of the axis, centred on the
    /// plane farthest from the defect; null for <see cref="PotentialAlignment.DefaultPlateauWidthFraction"/>.</param>
    public sealed record PlanarAverages(IReadOnlyList<PlanarProfile> Profiles, PotentialSign Sign = PotentialSign.Electrostatic, double? PlateauWidthFraction = null) : AlignmentInput;

    /// <summary>Potentials at atomic sites (the scheme for an anisotropic tensor).</summary>
    public sealed record AtomicSites(IReadOnlyList<SitePotential> Sites, PotentialSign Sign = PotentialSign.Electrostatic) : AlignmentInput;
}
