namespace Hull.Bench.Data;

/// <summary>How entry energies scatter around the convex background.</summary>
public enum EnergyDistribution
{
    /// <summary>
    /// Background plus Gaussian noise of <see cref="InteractionBackground.DenseNoiseEvPerAtom"/>: models a set of
    /// well-converged, mostly stable phases (every composition is near-stable); most distinct compositions end up on
    /// the hull, the hard case for the hull's size.
    /// </summary>
    Dense,

    /// <summary>
    /// Background plus a positive exponential offset of mean <see cref="InteractionBackground.SparseOffsetMeanEvPerAtom"/>
    /// per entry: models a database of many hypothetical/metastable structures, where most entries lie above the
    /// hull and a minority is stable.
    /// </summary>
    Sparse,
}
